#include "critic_panel.h"

#include <QComboBox>
#include <QDoubleSpinBox>
#include <QGridLayout>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QProgressBar>
#include <QPushButton>
#include <QSpinBox>
#include <QScrollArea>
#include <QSplitter>
#include <QVBoxLayout>
#include <qcustomplot.h>

#include "critic_runner.h"
#include "base/number_text.h"
#include "palette.h"
#include "plot_theme.h"
#include "session_document.h"
#include "viridis.h"

namespace barrow::ui {

namespace {

// White at ‖∇f‖ = 1, blue below, vermillion above (the data range is fixed to [0, 2]).
QCPColorGradient slopeGradient() {
  QCPColorGradient g;
  g.clearColorStops();
  g.setColorStopAt(0.0, QColor(0, 90, 160));
  g.setColorStopAt(0.5, QColor(255, 255, 255));
  g.setColorStopAt(1.0, QColor(200, 80, 0));
  g.setColorInterpolation(QCPColorGradient::ciRGB);
  return g;
}

QString num(double v) { return QString::fromStdString(sixDigits(v)); }

}  // namespace

CriticPanel::CriticPanel(SessionDocument* doc, QWidget* parent)
    : QWidget(parent), doc_(doc), runner_(new CriticRunner(this)) {
  method_ = new QComboBox;
  method_->addItem(tr("weight clipping + RMSProp"), "clip");
  method_->addItem(tr("gradient penalty + Adam"), "gp");
  method_->addItem(tr("spectral norm + Adam"), "sn");
  method_->setCurrentIndex(1);
  method_->setToolTip(tr("How the critic is kept (near) 1-Lipschitz; each uses its published defaults"));
  auto spin = [](int lo, int hi, int value, const QString& tip) {
    auto* s = new QSpinBox;
    s->setRange(lo, hi);
    s->setValue(value);
    s->setToolTip(tip);
    return s;
  };
  steps_ = spin(1, 1000000, 1000, tr("Training steps (critic updates)"));
  steps_->setObjectName("criticSteps");
  batch_ = spin(1, 65536, 64, tr("Points drawn from each cloud's weights per step"));
  width_ = spin(1, 1024, 64, tr("Units per hidden layer"));
  depth_ = spin(1, 8, 2, tr("Hidden layers"));
  seed_ = spin(0, 2147483647, 1, tr("Seed of initialisation and minibatches"));
  rate_ = new QLineEdit;
  rate_->setPlaceholderText(tr("paper"));
  rate_->setToolTip(tr("Learning rate; empty = the method's published value"));
  clip_ = new QDoubleSpinBox;
  clip_->setDecimals(4);
  clip_->setRange(0.0001, 100);
  clip_->setSingleStep(0.005);
  clip_->setValue(0.01);
  clip_->setToolTip(tr("Clipping: every weight and bias kept in [-c, c]"));
  lambda_ = new QDoubleSpinBox;
  lambda_->setRange(0, 1e4);
  lambda_->setValue(10);
  lambda_->setToolTip(tr("Gradient penalty weight λ"));
  activation_ = new QComboBox;
  for (const char* a : {"relu", "leaky_relu", "tanh"}) activation_->addItem(a);
  activation_->setToolTip(tr("Hidden-layer activation (all three are 1-Lipschitz, so the layer-norm bound holds)"));

  trainButton_ = new QPushButton(tr("Train"));
  stopButton_ = new QPushButton(tr("Stop"));
  stopButton_->setEnabled(false);
  trainButton_->setToolTip(tr("Train the critic on A and B off the GUI thread, then set it beside the exact W1 and "
                              "its potential"));
  stopButton_->setToolTip(tr("Stop training; what was trained so far is shown"));
  progress_ = new QProgressBar;
  progress_->setRange(0, 1000);
  progress_->setTextVisible(false);
  progress_->setMaximumHeight(8);
  summary_ = new QLabel(tr("Train a critic to compare it with the exact W1."));
  summary_->setWordWrap(true);
  summary_->setTextFormat(Qt::RichText);
  summary_->setTextInteractionFlags(Qt::TextSelectableByMouse);
  summary_->setAlignment(Qt::AlignTop | Qt::AlignLeft);

  auto* form = new QGridLayout;
  form->setVerticalSpacing(3);
  int row = 0;
  auto pairRow = [&](const QString& l1, QWidget* w1, const QString& l2, QWidget* w2) {
    form->addWidget(new QLabel(l1), row, 0);
    form->addWidget(w1, row, 1);
    if (w2) {
      form->addWidget(new QLabel(l2), row, 2);
      form->addWidget(w2, row, 3);
    }
    ++row;
  };
  form->addWidget(method_, row++, 0, 1, 4);
  pairRow(tr("Steps"), steps_, tr("Batch"), batch_);
  pairRow(tr("Width"), width_, tr("Depth"), depth_);
  pairRow(tr("Clip c"), clip_, tr("λ"), lambda_);
  pairRow(tr("Rate"), rate_, tr("Seed"), seed_);
  pairRow(tr("Activation"), activation_, QString(), nullptr);
  auto* buttons = new QHBoxLayout;
  buttons->addWidget(trainButton_);
  buttons->addWidget(stopButton_);
  form->addLayout(buttons, row++, 0, 1, 4);
  form->addWidget(progress_, row++, 0, 1, 4);
  auto* left = new QWidget;
  auto* leftBox = new QVBoxLayout(left);
  leftBox->setContentsMargins(0, 0, 0, 0);
  leftBox->addLayout(form);
  leftBox->addWidget(summary_, 1);
  left->setMinimumWidth(230);
  left->setMaximumWidth(340);

  curve_ = new QCustomPlot;
  curve_->setMinimumWidth(180);
  curve_->xAxis->setLabel(tr("step"));
  curve_->yAxis->setLabel(tr("value"));
  auto addGraph = [&](const QString& name, QPen pen) {
    QCPGraph* g = curve_->addGraph();
    g->setName(name);
    g->setPen(pen);
  };
  addGraph(tr("estimate E_A f − E_B f"), palette::curvePen(0, 1.8));
  addGraph(tr("certified bound (÷ L_upper)"), palette::curvePen(2, 1.8));
  QPen exactPen(palette::plotText(palette::currentScheme()), 1.4, Qt::DashLine);
  addGraph(tr("exact W1"), exactPen);
  curve_->legend->setVisible(true);
  curve_->legend->setFont(QFont(font().family(), 8));
  // The legend sits under the plot: inside, it covered the curves of a narrow pane.
  curve_->plotLayout()->addElement(1, 0, curve_->legend);
  curve_->plotLayout()->setRowStretchFactor(1, 0.001);
  curve_->legend->setBorderPen(Qt::NoPen);
  curve_->legend->setRowSpacing(0);
  followScheme(curve_, [this] {
    if (curve_->graphCount() > 2) curve_->graph(2)->setPen(QPen(palette::plotText(palette::currentScheme()), 1.4, Qt::DashLine));
  });

  fPlot_ = makeMap(tr("critic f\n(trained network)"), &fMap_);
  phiPlot_ = makeMap(tr("exact potential φ\n(W1 solver)"), &phiMap_);
  gradPlot_ = makeMap(tr("‖∇f‖ (white = 1)\nblue < 1 < orange"), &gradMap_);
  gradPlot_->setToolTip(tr("Gradient norm of the critic: white where it is 1 (what a 1-Lipschitz critic reaches on the transport lines), blue below, orange above; the scale runs from 0 to 2."));
  gradMap_->setGradient(slopeGradient());
  auto* maps = new QWidget;
  auto* mapBox = new QHBoxLayout(maps);
  mapBox->setContentsMargins(0, 0, 0, 0);
  mapBox->setSpacing(2);
  for (QCustomPlot* p : {fPlot_, phiPlot_, gradPlot_}) mapBox->addWidget(p, 1);

  auto* split = new QSplitter(Qt::Horizontal);
  split->addWidget(curve_);
  split->addWidget(maps);
  split->setStretchFactor(0, 2);
  split->setStretchFactor(1, 5);
  // In a scroll area: the pane's controls and four plots need about 800 pixels, and a dock's
  // minimum becomes the window's minimum; a narrow window scrolls the pane instead.
  auto* inner = new QWidget;
  auto* box = new QHBoxLayout(inner);
  box->setContentsMargins(4, 4, 4, 4);
  box->addWidget(left);
  box->addWidget(split, 1);
  auto* scroll = new QScrollArea(this);
  scroll->setWidgetResizable(true);
  scroll->setFrameShape(QFrame::NoFrame);
  scroll->setWidget(inner);
  auto* outer = new QVBoxLayout(this);
  outer->setContentsMargins(0, 0, 0, 0);
  outer->addWidget(scroll);

  connect(method_, &QComboBox::currentIndexChanged, this, &CriticPanel::methodChanged);
  connect(trainButton_, &QPushButton::clicked, this, &CriticPanel::train);
  connect(stopButton_, &QPushButton::clicked, runner_, &CriticRunner::cancel);
  connect(runner_, &CriticRunner::runningChanged, this, [this](bool on) {
    stopButton_->setEnabled(on);
    if (!on) progress_->setValue(progress_->maximum());
  });
  connect(runner_, &CriticRunner::progress, this, [this](double f) { progress_->setValue(int(f * 1000)); });
  connect(runner_, &CriticRunner::exactReady, this, [this](double w1) {
    curve_->graph(2)->setData(QVector<double>{0.0, double(steps_->value())}, QVector<double>{w1, w1});
    curve_->rescaleAxes();
    curve_->replot(QCustomPlot::rpQueuedReplot);
  });
  connect(runner_, &CriticRunner::curvePoint, this, [this](double step, double est, double bound) {
    curve_->graph(0)->addData(step, est);
    curve_->graph(1)->addData(step, bound);
    curve_->rescaleAxes();
    curve_->replot(QCustomPlot::rpQueuedReplot);
  });
  connect(runner_, &CriticRunner::finished, this, &CriticPanel::onFinished);
  connect(doc_, &SessionDocument::revisionChanged, this, &CriticPanel::updateStale);
  methodChanged();
}

QCustomPlot* CriticPanel::makeMap(const QString& title, QCPColorMap** map) {
  auto* plot = new QCustomPlot;
  plot->setMinimumSize(110, 120);
  plot->plotLayout()->insertRow(0);
  auto* t = new QCPTextElement(plot, title, QFont(font().family(), 9));
  plot->plotLayout()->addElement(0, 0, t);
  plot->xAxis->setTickLabelFont(QFont(font().family(), 7));
  plot->yAxis->setTickLabelFont(QFont(font().family(), 7));
  *map = new QCPColorMap(plot->xAxis, plot->yAxis);
  (*map)->setGradient(viridisGradient());
  (*map)->setInterpolate(true);
  for (int k = 0; k < 2; ++k) {
    QCPGraph* g = plot->addGraph();
    g->setLineStyle(QCPGraph::lsNone);
    const QColor c = k == 0 ? palette::cloudA() : palette::cloudB();
    g->setScatterStyle(QCPScatterStyle(k == 0 ? QCPScatterStyle::ssCircle : QCPScatterStyle::ssTriangle,
                                       QPen(Qt::white, 0.6), c, 5));
  }
  auto titleColour = [t] { t->setTextColor(palette::plotText(palette::currentScheme())); };
  followScheme(plot, titleColour);
  titleColour();
  return plot;
}

void CriticPanel::methodChanged() {
  critic::Method m;
  critic::parseMethod(method_->currentData().toString().toStdString(), &m);
  clip_->setEnabled(m == critic::Method::Clip);
  lambda_->setEnabled(m == critic::Method::Gp);
  const critic::CriticSettings d = critic::defaultSettings(m);
  rate_->setPlaceholderText(tr("paper: %1").arg(num(d.optimizer.rate)));
}

critic::CriticSettings CriticPanel::settings() const {
  critic::Method m;
  critic::parseMethod(method_->currentData().toString().toStdString(), &m);
  critic::CriticSettings s = critic::defaultSettings(m);
  s.steps = steps_->value();
  s.batch = batch_->value();
  s.shape.width = width_->value();
  s.shape.hidden = depth_->value();
  critic::parseActivation(activation_->currentText().toStdString(), &s.shape.activation);
  bool ok = false;
  const double rate = rate_->text().toDouble(&ok);
  if (ok && rate > 0 && rate <= 1) s.optimizer.rate = rate;
  s.clip = clip_->value();
  s.lambda = lambda_->value();
  s.seed = std::uint64_t(seed_->value());
  return s;
}

void CriticPanel::train() {
  const auto& session = doc_->session();
  if (session.a.validate() || session.b.validate()) {
    summary_->setText(tr("Both clouds need at least one point of positive weight."));
    return;
  }
  for (int k = 0; k < 3; ++k) curve_->graph(k)->data()->clear();
  curve_->replot(QCustomPlot::rpQueuedReplot);
  progress_->setValue(0);
  summary_->setText(tr("Training…"));
  runRevision_ = doc_->revision();
  runner_->start(session.a, session.b, settings());
}

void CriticPanel::onFinished(std::shared_ptr<const CriticOutcome> out) {
  outcome_ = out;
  if (!out->error.empty()) {
    summary_->setText(QString::fromStdString(out->error).toHtmlEscaped());
    return;
  }
  const critic::CriticCheck& c = out->check;
  QString text;
  if (c.status != Status::Ok) text = QString::fromStdString(c.message).toHtmlEscaped() + "<br>";
  // One quantity per row, the name left and the number right, so the eye compares columns.
  auto row = [](const QString& name, const QString& value) {
    return QStringLiteral("<tr><td>%1</td><td align=right>&nbsp;%2</td></tr>").arg(name, value);
  };
  text += "<table cellspacing=0 cellpadding=0>" + row(tr("estimate E_A f − E_B f"), num(c.estimate)) +
          row(tr("certified bound"), num(c.lowerBound)) + row(tr("exact W1"), num(c.w1)) +
          row(tr("gap W1 − bound"), num(c.w1 - c.lowerBound)) + row(tr("L_upper (layers)"), num(c.lipschitzUpper)) +
          row(tr("max ‖∇f‖ grid · data"), num(c.lipschitzGrid) + " · " + num(c.lipschitzData)) +
          row(tr("correlation with φ"), QString::number(c.potentialCorrelation, 'f', 3)) + "</table>" +
          tr("%1 steps in %2 s").arg(c.steps).arg(c.seconds, 0, 'f', 2);
  resultText_ = text;
  hasResult_ = true;
  trainedRevision_ = runRevision_;
  updateStale();
  if (c.status == Status::Ok) showMaps(*out);
}

bool CriticPanel::stale() const { return hasResult_ && !doc_->isCurrent(trainedRevision_); }

void CriticPanel::updateStale() {
  if (!hasResult_) return;
  // The same test as every other pane: results belong to one session revision.
  summary_->setText(stale() ? tr("<b>Out of date</b>: the clouds changed since this critic was trained; "
                                 "Train again.<br>") + resultText_
                            : resultText_);
}

void CriticPanel::showMaps(const CriticOutcome& out) {
  const auto& g = out.frame;
  auto fill = [&](QCustomPlot* plot, QCPColorMap* map, const Eigen::MatrixXd& values, bool slope) {
    map->data()->setSize(g.nx, g.ny);
    map->data()->setRange(QCPRange(g.x0, g.x0 + g.dx * (g.nx - 1)), QCPRange(g.y0, g.y0 + g.dy * (g.ny - 1)));
    for (int r = 0; r < g.ny; ++r)
      for (int c = 0; c < g.nx; ++c) map->data()->setCell(c, r, values(r, c));
    if (slope) map->setDataRange(QCPRange(0.0, 2.0));
    else map->rescaleDataRange(true);
    for (int k = 0; k < 2; ++k) {
      const Cloud& cl = k == 0 ? out.a : out.b;
      QVector<double> xs(cl.size()), ys(cl.size());
      for (Eigen::Index i = 0; i < cl.size(); ++i) {
        xs[i] = cl.points(i, 0);
        ys[i] = cl.points(i, 1);
      }
      plot->graph(k)->setData(xs, ys);
    }
    plot->xAxis->setRange(g.x0, g.x0 + g.dx * (g.nx - 1));
    plot->yAxis->setRange(g.y0, g.y0 + g.dy * (g.ny - 1));
    plot->replot(QCustomPlot::rpQueuedReplot);
  };
  fill(fPlot_, fMap_, out.f, false);
  fill(phiPlot_, phiMap_, out.phi, false);
  fill(gradPlot_, gradMap_, out.gradNorm, true);
}

}  // namespace barrow::ui
