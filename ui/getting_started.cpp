#include "getting_started.h"

#include <QEvent>
#include <QLabel>
#include <QPushButton>
#include <QVBoxLayout>

namespace barrow::ui {

GettingStarted::GettingStarted(QWidget* parent) : QFrame(parent) {
  setObjectName("gettingStarted");
  setFrameShape(QFrame::StyledPanel);
  setAutoFillBackground(true);
  setStyleSheet("#gettingStarted { background: rgba(255,255,255,245); border: 2px solid #0072B2; border-radius: 6px; }");
  text_ = new QLabel(this);
  text_->setObjectName("gettingStartedText");
  text_->setWordWrap(true);
  text_->setTextFormat(Qt::RichText);
  setDemoShown(true);
  auto* ok = new QPushButton(tr("Got it"), this);
  ok->setToolTip(tr("Close this guide; it is in the Help menu if you want it again"));
  ok->setDefault(true);
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(16, 10, 16, 12);
  layout->addWidget(text_);
  layout->addWidget(ok, 0, Qt::AlignRight);
  connect(ok, &QPushButton::clicked, this, [this] {
    hide();
    emit dismissed();
  });
  parent->installEventFilter(this);
  place();
}

void GettingStarted::setDemoShown(bool demo) {
  const QString intro =
      demo ? tr("<p>The demo holds two batches of readings from a line-scan sensor: <b>A</b> (blue discs) "
                "before and <b>B</b> (orange triangles) after the mount slipped sideways. Their supports "
                "barely overlap — exactly where losses disagree.</p>")
           : tr("<p>The Field shows your two clouds: <b>A</b> (blue discs), the one the sweep moves, and "
                "<b>B</b> (orange triangles), which stays put. File → New session starts over from two "
                "example blobs.</p>");
  text_->setText(tr("<h3>Getting started</h3>") + intro +
                 tr("<ol>"
                    "<li><b>Drag points</b> on the Field (Select tool) and watch every measure update in the "
                    "Measures table. The black segments are the exact transport plan.</li>"
                    "<li><b>Click and drag on the Sweep plot</b> to move the θ cursor: A moves along the "
                    "sweep's family and the Field follows. Flat curves give no gradient; jumps mean a loss that "
                    "cannot guide training. Double-click to let go.</li>"
                    "<li><b>Read the Findings</b>: one plain verdict per measure. Click one to highlight it.</li>"
                    "</ol>"
                    "<p>Everything is undoable (Ctrl+Z). Save with Ctrl+S; figures and tables export from the "
                    "File menu.</p>"));
  if (isVisible()) place();
}

QString GettingStarted::text() const { return text_->text(); }

void GettingStarted::place() {
  const QSize s(std::min(520, parentWidget()->width() - 40), 0);
  resize(s.width(), heightForWidth(s.width()) > 0 ? heightForWidth(s.width()) : sizeHint().height());
  adjustSize();
  resize(std::min(520, parentWidget()->width() - 40), height());
  move((parentWidget()->width() - width()) / 2, (parentWidget()->height() - height()) / 3);
  raise();
}

bool GettingStarted::eventFilter(QObject* watched, QEvent* event) {
  if (watched == parentWidget() && event->type() == QEvent::Resize) place();
  return QFrame::eventFilter(watched, event);
}

}  // namespace barrow::ui
