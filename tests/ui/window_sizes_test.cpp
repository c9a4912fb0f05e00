// The window at the sizes people use (issue 19): no measure name in the Measures table is
// elided — a row shows "id — name" only when the whole text fits its cell, else the id alone
// (short, unique), with the full name in the tooltip — and the sweep legend stays inside the
// window. The text room is taken from the style, as the item delegate lays the cell out
// (QStyle::SE_ItemViewItemText), and compared with the font's advance of the shown text [CP].
#include <gtest/gtest.h>

#include <QHeaderView>
#include <QSettings>
#include <QStyle>
#include <QStyleOptionViewItem>
#include <QTreeWidget>

#include "measures_panel.h"
#include "qcustomplot.h"
#include "scenario/demo_scenario.h"
#include "sweep_panel.h"
#include "sweep_plots.h"
#include "ui_test_support.h"

// Test names and messages show a size as "1000x700" (GoogleTest finds PrintTo in QSize's
// namespace, the global one) instead of its bytes.
inline void PrintTo(const QSize& s, std::ostream* os) { *os << s.width() << "x" << s.height(); }

namespace barrow::ui {
namespace {

// Room for the glyphs of column 0: the cell from its left edge (after the branch) to the
// column's right edge, less the check box and the icon, each with the style's item margin on
// both sides, and the text's own margins — the layout of QCommonStyle's view items [CP] (mem).
int textRoom(QTreeWidget* tree, QTreeWidgetItem* item) {
  QStyle* st = tree->style();
  const int margin = st->pixelMetric(QStyle::PM_FocusFrameHMargin, nullptr, tree) + 1;
  const int right = tree->header()->sectionViewportPosition(0) + tree->columnWidth(0);
  const int cell = right - tree->visualItemRect(item).left();
  const int check = st->pixelMetric(QStyle::PM_IndicatorWidth, nullptr, tree) + 2 * margin;
  const int icon = (tree->iconSize().isValid() ? tree->iconSize().width() : 16) + 2 * margin;
  return cell - check - icon - 2 * margin;
}

class WindowSizesTest : public ::testing::TestWithParam<QSize> {};

TEST_P(WindowSizesTest, NoMeasureNameIsElidedAndTheLegendIsInsideTheWindow) {
  // Opened at that size, as the application opens it (the default layout depends on it).
  QSettings().setValue("ui/gettingStartedShown", true);
  QSettings().remove("ui/geometry");
  QSettings().remove("ui/state");
  MainWindow::Options o;
  o.quiet = true;
  o.autoSweep = true;
  auto w = std::make_unique<MainWindow>(o);
  w->resize(GetParam());
  w->setSession(demoSession());
  w->show();
  ASSERT_TRUE(QTest::qWaitForWindowExposed(w.get()));
  ASSERT_TRUE(test::waitIdle(*w));
  QTest::qWait(50);
  QApplication::processEvents();
  auto* tree = w->measures()->findChild<QTreeWidget*>("measuresTable");
  ASSERT_NE(tree, nullptr);
  const QFontMetrics fm(tree->font());
  int full = 0;
  for (int r = 0; r < tree->topLevelItemCount(); ++r) {
    QTreeWidgetItem* it = tree->topLevelItem(r);
    const QString text = it->text(0);
    EXPECT_LE(fm.horizontalAdvance(text), textRoom(tree, it)) << text.toStdString() << " at " << GetParam().width();
    EXPECT_FALSE(text.isEmpty());
    EXPECT_FALSE(text.contains(QChar(0x2026))) << text.toStdString();
    // The id is always there, and the whole name is one hover away.
    const QString id = text.section(QStringLiteral(" — "), 0, 0);
    EXPECT_FALSE(id.contains(' ')) << text.toStdString();
    EXPECT_FALSE(it->toolTip(0).isEmpty());
    if (text.contains(QStringLiteral(" — "))) ++full;
  }
  EXPECT_TRUE(full == 0 || full == tree->topLevelItemCount()) << full << " rows with names";  // one form
  if (GetParam().width() >= 1920) EXPECT_EQ(full, tree->topLevelItemCount());  // room for every name
  // The sweep legend: inside its plot widget, which is inside the window.
  ASSERT_NE(w->sweep()->plots(), nullptr);
  QCustomPlot* plots = w->sweep()->plots()->plot();
  const QRect legend = plots->legend->outerRect();
  EXPECT_TRUE(plots->rect().contains(legend)) << legend.x() << "," << legend.y() << " " << legend.width() << "x"
                                              << legend.height() << " in " << plots->width() << "x" << plots->height();
  EXPECT_TRUE(w->rect().contains(QRect(plots->mapTo(w.get(), legend.topLeft()), legend.size())));
  // No legend row is squeezed below the height its text asks for (a squeezed row cuts off the
  // underscore of kl_ab: each item is clipped to its own rectangle).
  for (int i = 0; i < plots->legend->itemCount(); ++i) {
    QCPAbstractLegendItem* item = plots->legend->item(i);
    if (!item) continue;
    EXPECT_GE(item->outerRect().height(), item->minimumOuterSizeHint().height()) << "legend row " << i;
    // QCustomPlot draws a layerable clipped to its outer rectangle moved up by one pixel (seen in
    // its QCPLayer::draw) (mem): the text's full line height, descent and underscore included,
    // must end inside that clip.
    const int textBottom = item->rect().top() + QFontMetrics(item->font()).height() - 1;
    EXPECT_LE(textBottom, item->outerRect().bottom() - 1) << "legend row " << i << " loses its underscore";
  }
}

INSTANTIATE_TEST_SUITE_P(Sizes, WindowSizesTest,
                         ::testing::Values(QSize(1000, 700), QSize(1400, 900), QSize(1920, 1080)),
                         [](const auto& info) { return std::to_string(info.param.width()); });

}  // namespace
}  // namespace barrow::ui
