// Curves told apart by every eye (issue #19): every registered measure (the 15 defaults and the
// opt-in critics) has its own pair of colour and dash, and every curve colour has a contrast
// of at least 3:1 against the plot background in the light and the dark scheme (WCAG 2.1,
// success criterion 1.4.11, non-text contrast; relative luminance and contrast ratio as WCAG
// 2.1 defines them, computed here independently of the code under test).
#include <gtest/gtest.h>

#include <QApplication>
#include <QImage>
#include <QPalette>
#include <QTest>
#include <QTreeWidget>
#include <cmath>
#include <iomanip>
#include <iostream>
#include <set>
#include <qcustomplot.h>
#include <tuple>

#include "measure_style.h"
#include "measures_panel.h"
#include "measures/registry.h"
#include "palette.h"
#include "field_panel.h"
#include "field_view.h"
#include "findings_panel.h"
#include "scenario/demo_scenario.h"
#include "sweep_panel.h"
#include "sweep_plots.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

// WCAG 2.1, "relative luminance": sRGB channels linearised (c/12.92 up to 0.03928, else
// ((c+0.055)/1.055)^2.4), weighted 0.2126 R + 0.7152 G + 0.0722 B [P] (WCAG 2.1).
double luminance(const QColor& c) {
  auto lin = [](int v) {
    const double s = v / 255.0;
    return s <= 0.03928 ? s / 12.92 : std::pow((s + 0.055) / 1.055, 2.4);
  };
  return 0.2126 * lin(c.red()) + 0.7152 * lin(c.green()) + 0.0722 * lin(c.blue());
}

// WCAG 2.1, "contrast ratio": (L1 + 0.05) / (L2 + 0.05), L1 the lighter [P] (WCAG 2.1).
double contrast(const QColor& a, const QColor& b) {
  const double la = luminance(a), lb = luminance(b);
  return (std::max(la, lb) + 0.05) / (std::min(la, lb) + 0.05);
}

const char* name(palette::Scheme s) { return s == palette::Scheme::Dark ? "dark" : "light"; }

// Puts the application in a scheme for one test and back afterwards.
class SchemeScope {
 public:
  explicit SchemeScope(palette::Scheme s) : saved_(QApplication::palette()) { palette::applyScheme(s); }
  ~SchemeScope() { QApplication::setPalette(saved_); }

 private:
  QPalette saved_;
};

// [D] from the formula: black on white is (1 + 0.05) / (0 + 0.05) = 21; and #767676 on white
// is about 4.54:1, the often quoted lightest grey that passes 4.5:1 on white (WCAG 2.1
// techniques, G18 (mem)).
TEST(SeriesStyleTest, ContrastFormulaGivesKnownValues) {
  EXPECT_NEAR(contrast(Qt::black, Qt::white), 21.0, 1e-12);
  EXPECT_NEAR(contrast(QColor(0x76, 0x76, 0x76), Qt::white), 4.54, 0.01);
  EXPECT_NEAR(contrast(Qt::white, Qt::white), 1.0, 1e-12);
}

TEST(SeriesStyleTest, EveryMeasureColourHasThreeToOneContrastInBothSchemes) {
  const auto& all = MeasureRegistry::instance().all();
  ASSERT_GE(all.size(), 18u) << "15 default measures and 3 critics";
  for (palette::Scheme s : {palette::Scheme::Light, palette::Scheme::Dark}) {
    const QColor bg = palette::plotBackground(s);
    for (std::size_t k = 0; k < all.size(); ++k) {
      const QColor c = palette::curveColor(int(k), s);
      const double r = contrast(c, bg);
      std::cout << name(s) << " " << std::setw(10) << all[k]->id() << " " << c.name().toStdString() << " on "
                << bg.name().toStdString() << ": " << std::fixed << std::setprecision(2) << r << ":1\n";
      EXPECT_GE(r, 3.0) << all[k]->id() << " in the " << name(s) << " scheme";
    }
    // Marks that belong to no measure, and the cursor, stand out as well.
    EXPECT_GE(contrast(palette::neutralMark(s), bg), 3.0) << name(s);
    EXPECT_GE(contrast(palette::cursor(s), bg), 3.0) << name(s);
    EXPECT_GE(contrast(palette::plotText(s), bg), 4.5) << name(s) << ": axis text";
  }
}

// [D] No two registered measures share both colour and dash, so no two curves shown at once
// do; and any two differ in at least two of colour, dash and marker.
TEST(SeriesStyleTest, NoTwoMeasuresShareColourAndDash) {
  const auto& all = MeasureRegistry::instance().all();
  for (palette::Scheme s : {palette::Scheme::Light, palette::Scheme::Dark}) {
    std::set<std::pair<QRgb, int>> seen;
    for (std::size_t i = 0; i < all.size(); ++i) {
      const QPen pi = palette::curvePen(int(measureRank(all[i]->id())), 1.7, s);
      EXPECT_TRUE(seen.insert({pi.color().rgb(), int(pi.style())}).second)
          << all[i]->id() << " repeats a colour and dash in the " << name(s) << " scheme";
      for (std::size_t j = 0; j < i; ++j) {
        const QPen pj = palette::curvePen(int(measureRank(all[j]->id())), 1.7, s);
        const int cues = int(pi.color() != pj.color()) + int(pi.style() != pj.style()) +
                         int(palette::curveMarker(int(i)) != palette::curveMarker(int(j)));
        EXPECT_GE(cues, 2) << all[i]->id() << " and " << all[j]->id();
      }
    }
  }
}

// A sweep result with every registered measure (values only; the style is what matters).
SweepResult everyMeasure() {
  SweepResult r;
  for (int k = 0; k <= 40; ++k) r.theta.push_back(-1 + k * 0.05);
  int n = 0;
  for (const Measure* m : MeasureRegistry::instance().all()) {
    SweepSeries s;
    s.id = m->id();
    for (double t : r.theta) {
      s.value.push_back(std::sin(t * (1 + 0.1 * n)) + 0.2 * n);
      s.slope.push_back((1 + 0.1 * n) * std::cos(t * (1 + 0.1 * n)));
    }
    r.series.push_back(std::move(s));
    ++n;
  }
  return r;
}

// The plot as drawn: each curve's pen from the measure's style, distinct (colour, dash) among
// the curves shown, and 3:1 against the background actually painted — in the light scheme
// and after the application switches to a dark palette (which the plot follows live).
TEST(SeriesStyleTest, PlottedCurvesAreDistinctAndContrastInBothSchemes) {
  SchemeScope light(palette::Scheme::Light);
  SweepPlots plots;
  plots.resize(1200, 700);
  plots.setResult({everyMeasure()}, {});
  plots.show();
  ASSERT_TRUE(QTest::qWaitForWindowExposed(&plots));
  ASSERT_EQ(plots.curveCount(), int(MeasureRegistry::instance().all().size()));
  for (palette::Scheme s : {palette::Scheme::Light, palette::Scheme::Dark}) {
    palette::applyScheme(s);
    QApplication::processEvents();
    ASSERT_EQ(palette::currentScheme(), s);
    QCustomPlot* plot = plots.plot();
    plot->replot();
    const QImage img = plot->toPixmap(plot->width(), plot->height()).toImage();
    const QColor painted = img.pixelColor(2, 2);  // the plot's own margin: background only
    EXPECT_EQ(painted.rgb(), palette::plotBackground(s).rgb()) << name(s);
    const QCPAxis* y = plots.valueRect()->axis(QCPAxis::atLeft);
    EXPECT_EQ(y->tickLabelColor(), palette::plotText(s)) << name(s);
    std::set<std::pair<QRgb, int>> seen;
    int shown = 0;
    for (int g = 0; g < plot->graphCount(); ++g) {
      QCPGraph* graph = plot->graph(g);
      const std::string id = graph->property("measure").toString().toStdString();
      if (id.empty() || graph->valueAxis() != y) continue;  // bands, explanations; slopes repeat the pen
      ++shown;
      const QPen pen = graph->pen();
      EXPECT_EQ(pen.color(), palette::curveColor(int(measureRank(id)), s)) << id;
      EXPECT_TRUE(seen.insert({pen.color().rgb(), int(pen.style())}).second) << id << " looks like another curve";
      EXPECT_GE(contrast(pen.color(), painted), 3.0) << id << " in the " << name(s) << " scheme";
      EXPECT_FALSE(graph->scatterStyle().isNone()) << id << " has no marker";
      ASSERT_NE(plot->legend->itemWithPlottable(graph), nullptr) << id;
      EXPECT_EQ(plot->legend->itemWithPlottable(graph)->textColor(), palette::plotText(s)) << id;
    }
    EXPECT_EQ(shown, plots.curveCount()) << name(s);
  }
}

// The whole window under a dark application palette (as a dark system gives it): the Field and
// the Sweep plot paint the dark background, every curve drawn keeps 3:1 against it, the plan
// is not drawn black on it, and the Findings' coloured verdicts keep 4.5:1 against the table
// (WCAG 2.1, success criterion 1.4.3, for text).
TEST(SeriesStyleTest, WindowFollowsADarkPalette) {
  SchemeScope dark(palette::Scheme::Dark);
  auto w = test::makeWindow(demoSession());
  w->sweep()->run();
  ASSERT_TRUE(test::waitIdle(*w));
  const QColor bg = palette::plotBackground(palette::Scheme::Dark);
  for (QCustomPlot* plot : {w->sweep()->plots()->plot(), w->field()->view()->plot()}) {
    plot->replot();
    const QImage img = plot->toPixmap(plot->width(), plot->height()).toImage();
    EXPECT_EQ(img.pixelColor(2, 2).rgb(), bg.rgb()) << plot->objectName().toStdString();
    EXPECT_GE(contrast(plot->xAxis->tickLabelColor(), bg), 4.5) << plot->objectName().toStdString();
  }
  QCustomPlot* sweep = w->sweep()->plots()->plot();
  int curves = 0;
  for (int g = 0; g < sweep->graphCount(); ++g) {
    if (sweep->graph(g)->property("measure").toString().isEmpty()) continue;
    ++curves;
    EXPECT_GE(contrast(sweep->graph(g)->pen().color(), bg), 3.0) << sweep->graph(g)->name().toStdString();
  }
  EXPECT_GT(curves, 0);
  EXPECT_GE(contrast(palette::exactPlan(), bg), 3.0) << "the plan's segments";
  QTableWidget* t = w->findings()->table();
  ASSERT_GT(t->rowCount(), 0);
  const QColor base = t->palette().color(QPalette::Base);
  for (int r = 0; r < t->rowCount(); ++r)
    EXPECT_GE(contrast(t->item(r, 1)->foreground().color(), base), 4.5) << t->item(r, 1)->text().toStdString();
  for (palette::Scheme s : {palette::Scheme::Light, palette::Scheme::Dark}) {
    const QColor b = s == palette::Scheme::Dark ? base : QColor(Qt::white);
    EXPECT_GE(contrast(palette::goodText(s), b), 4.5) << name(s);
    EXPECT_GE(contrast(palette::warnText(s), b), 4.5) << name(s);
  }
}

// A system that switches to dark while the window is open (the palette changes under it): the
// plots and the Findings' verdicts take the new scheme's colours without a new sweep.
TEST(SeriesStyleTest, SwitchingSchemeWhileOpenRecoloursPlotsAndVerdicts) {
  SchemeScope light(palette::Scheme::Light);
  auto w = test::makeWindow(demoSession());
  w->sweep()->run();
  ASSERT_TRUE(test::waitIdle(*w));
  QTableWidget* t = w->findings()->table();
  ASSERT_GT(t->rowCount(), 0);
  for (palette::Scheme s : {palette::Scheme::Dark, palette::Scheme::Light}) {
    palette::applyScheme(s);
    QApplication::processEvents();
    QCustomPlot* plot = w->sweep()->plots()->plot();
    plot->replot();
    EXPECT_EQ(plot->toPixmap(plot->width(), plot->height()).toImage().pixelColor(2, 2).rgb(),
              palette::plotBackground(s).rgb())
        << name(s);
    for (int r = 0; r < t->rowCount(); ++r) {
      const QColor c = t->item(r, 1)->foreground().color();
      EXPECT_TRUE(c == palette::goodText(s) || c == palette::warnText(s)) << name(s) << " row " << r;
    }
    // The Measures table's series icons follow the scheme too.
    auto* tree = w->measures()->findChild<QTreeWidget*>("measuresTable");
    ASSERT_NE(tree, nullptr);
    for (int r = 0; r < tree->topLevelItemCount(); ++r) {
      QTreeWidgetItem* it = tree->topLevelItem(r);
      const std::string id = it->text(0).section(QStringLiteral(" — "), 0, 0).toStdString();
      EXPECT_EQ(it->icon(0).pixmap(16, 16).toImage(), measureIcon(id).pixmap(16, 16).toImage()) << name(s) << " " << id;
    }
  }
}

}  // namespace
}  // namespace barrow::ui
