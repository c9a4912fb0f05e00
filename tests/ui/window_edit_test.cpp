// Editing on the Field through real mouse events: adding, dragging and deleting points
// updates the clouds and the Measures table; undo and redo restore each state exactly; a
// drag is one undo step; parameters edited in place are checked before they are used.
#include <gtest/gtest.h>

#include <QComboBox>
#include <QLineEdit>
#include <QTreeWidget>

#include "cloud_layer.h"
#include "field_editor.h"
#include "field_panel.h"
#include "measures/evaluate.h"
#include "measures/registry.h"
#include "measures_panel.h"
#include "param_editor.h"
#include "result_text.h"
#include "scenario/demo_scenario.h"
#include "scenario/generators.h"
#include "ui_test_support.h"

namespace barrow::ui {
namespace {

using test::fieldPixel;
using test::makeWindow;
using test::sameCloud;
using test::waitIdle;

// The first cheap measure: updated in the first delivery of every live request.
const Measure* cheapMeasure() {
  for (const Measure* m : MeasureRegistry::instance().all())
    if (m->cheap()) return m;
  return nullptr;
}

// [D] The table must show the engine's value for exactly the clouds on the Field.
void expectTableMatchesEngine(MainWindow& w, const Measure& m) {
  EvalRequest req;
  req.params = w.session().params;
  const Result direct = evaluateMeasure(m, w.session().a, w.session().b, req);
  EXPECT_EQ(w.measures()->cellText(m.id(), 1), valueText(direct)) << m.id();
}

TEST(WindowEditTest, AddDragDeleteUpdateCloudsAndMeasuresAndUndoRestoresExactly) {
  const Measure* m = cheapMeasure();
  ASSERT_NE(m, nullptr) << "no cheap measure registered";
  auto w = makeWindow(demoSession());
  ASSERT_TRUE(waitIdle(*w));
  FieldView* view = w->field()->view();
  FieldEditor* ed = w->field()->editor();
  QCustomPlot* plot = view->plot();
  QUndoStack* undo = w->document()->undoStack();
  const Session s0 = w->session();
  expectTableMatchesEngine(*w, *m);

  // Add: one click puts one point into A where the click was; B is untouched.
  ed->setTool(FieldTool::Add);
  ed->setTarget(Which::A);
  const QPoint at = fieldPixel(*view, 0.6, 0.3);
  QTest::mouseClick(plot, Qt::LeftButton, {}, at);
  ASSERT_TRUE(waitIdle(*w));
  const Session s1 = w->session();
  ASSERT_EQ(s1.a.size(), s0.a.size() + 1);
  EXPECT_TRUE(sameCloud(s1.b, s0.b));
  EXPECT_EQ(s1.a.points.topRows(s0.a.size()), s0.a.points);
  EXPECT_DOUBLE_EQ(s1.a.points(s0.a.size(), 0), plot->xAxis->pixelToCoord(at.x()));
  EXPECT_DOUBLE_EQ(s1.a.points(s0.a.size(), 1), plot->yAxis->pixelToCoord(at.y()));
  EXPECT_NEAR(s1.a.points(s0.a.size(), 0), 0.6, 2 * std::abs(plot->xAxis->pixelToCoord(1) - plot->xAxis->pixelToCoord(0)));
  expectTableMatchesEngine(*w, *m);

  // Drag a point of B by 40 pixels to the right in small moves: one undo step.
  ed->setTool(FieldTool::Select);
  const int before = undo->count();
  const QPoint p = fieldPixel(*view, s1.b.points(0, 0), s1.b.points(0, 1));
  QTest::mousePress(plot, Qt::LeftButton, {}, p);
  for (int k = 1; k <= 4; ++k) QTest::mouseMove(plot, p + QPoint(10 * k, 0));
  QTest::mouseRelease(plot, Qt::LeftButton, {}, p + QPoint(40, 0));
  ASSERT_TRUE(waitIdle(*w));
  EXPECT_EQ(undo->count(), before + 1);
  const Session s2 = w->session();
  const double dx = plot->xAxis->pixelToCoord(p.x() + 40) - plot->xAxis->pixelToCoord(p.x());
  EXPECT_NEAR(s2.b.points(0, 0), s1.b.points(0, 0) + dx, 1e-12);
  EXPECT_NEAR(s2.b.points(0, 1), s1.b.points(0, 1), 1e-12);
  EXPECT_EQ(s2.b.points.bottomRows(s2.b.size() - 1), s1.b.points.bottomRows(s1.b.size() - 1));
  EXPECT_TRUE(sameCloud(s2.a, s1.a));
  expectTableMatchesEngine(*w, *m);

  // Delete three points of B.
  ed->select(Which::B, {0, 1, 2});
  EXPECT_TRUE(ed->deleteSelection().isEmpty());
  ASSERT_TRUE(waitIdle(*w));
  const Session s3 = w->session();
  ASSERT_EQ(s3.b.size(), s2.b.size() - 3);
  EXPECT_EQ(s3.b.points, s2.b.points.bottomRows(s2.b.size() - 3));
  expectTableMatchesEngine(*w, *m);

  // Undo walks back through every state bit for bit; redo walks forward again.
  const std::vector<Session> states = {s0, s1, s2, s3};
  for (int k = 2; k >= 0; --k) {
    undo->undo();
    EXPECT_TRUE(sameCloud(w->session().a, states[k].a)) << "undo to state " << k;
    EXPECT_TRUE(sameCloud(w->session().b, states[k].b)) << "undo to state " << k;
  }
  ASSERT_TRUE(waitIdle(*w));
  expectTableMatchesEngine(*w, *m);
  for (int k = 1; k <= 3; ++k) {
    undo->redo();
    EXPECT_TRUE(sameCloud(w->session().a, states[k].a)) << "redo to state " << k;
    EXPECT_TRUE(sameCloud(w->session().b, states[k].b)) << "redo to state " << k;
  }
  EXPECT_TRUE(w->document()->isModified());
}

TEST(WindowEditTest, SprayStrokeAddsPointsInTheBrushAsOneUndoStep) {
  auto w = makeWindow(demoSession());
  FieldView* view = w->field()->view();
  FieldEditor* ed = w->field()->editor();
  ed->setTool(FieldTool::Spray);
  ed->setTarget(Which::B);
  ed->setBrush(0.1, 5);
  const Session s0 = w->session();
  const QPoint p = test::fieldPixel(*view, 0.6, 0.0);
  QTest::mousePress(view->plot(), Qt::LeftButton, {}, p);
  QTest::mouseMove(view->plot(), p + QPoint(30, 0));
  QTest::mouseRelease(view->plot(), Qt::LeftButton, {}, p + QPoint(30, 0));
  const Cloud& b = w->session().b;
  // [D] each dab adds the brush's 5 points, and one stroke is one undo step (below).
  const Eigen::Index added = b.size() - s0.b.size();
  EXPECT_GE(added, 5);
  EXPECT_EQ(added % 5, 0);
  EXPECT_TRUE(test::sameCloud(w->session().a, s0.a));
  // [D] every sprayed point lies within the brush radius of the stroke (a horizontal segment).
  const double x0 = view->plot()->xAxis->pixelToCoord(p.x()), x1 = view->plot()->xAxis->pixelToCoord(p.x() + 30);
  const double y0 = view->plot()->yAxis->pixelToCoord(p.y());
  for (Eigen::Index i = s0.b.size(); i < b.size(); ++i) {
    const double dx = std::max({x0 - b.points(i, 0), 0.0, b.points(i, 0) - x1});
    EXPECT_LE(std::hypot(dx, b.points(i, 1) - y0), 0.1 + 1e-12);
  }
  EXPECT_EQ(w->document()->undoStack()->count(), 1);
  w->document()->undoStack()->undo();
  EXPECT_TRUE(test::sameCloud(w->session().b, s0.b));
  ASSERT_TRUE(waitIdle(*w));
}

TEST(WindowEditTest, RubberBandSelectsExactlyThePointsInsideAndMovesThem) {
  auto w = makeWindow(demoSession());
  FieldView* view = w->field()->view();
  FieldEditor* ed = w->field()->editor();
  ed->setTool(FieldTool::Select);
  // A box around the upper half of A only (A lies near x = 0, B near x = 1.2).
  const QPoint from = test::fieldPixel(*view, -0.3, 1.3), to = test::fieldPixel(*view, 0.3, 0.0);
  QTest::mousePress(view->plot(), Qt::LeftButton, {}, from);
  QTest::mouseMove(view->plot(), to);
  QTest::mouseRelease(view->plot(), Qt::LeftButton, {}, to);
  const Cloud& a = w->session().a;
  const QRectF box = QRectF(QPointF(from), QPointF(to)).normalized();
  int inside = 0;
  for (Eigen::Index i = 0; i < a.size(); ++i) {
    const bool in = box.contains(QPointF(view->plot()->xAxis->coordToPixel(a.points(i, 0)),
                                         view->plot()->yAxis->coordToPixel(a.points(i, 1))));
    EXPECT_EQ(ed->selection(Which::A)[std::size_t(i)], in) << i;
    inside += in;
  }
  // [D] the same box in data coordinates, give or take points on its edge pixels: the box
  // caught what lies in it, not a token few.
  int expected = 0;
  for (Eigen::Index i = 0; i < a.size(); ++i)
    expected += a.points(i, 0) > -0.3 && a.points(i, 0) < 0.3 && a.points(i, 1) > 0.0 && a.points(i, 1) < 1.3;
  EXPECT_NEAR(inside, expected, 2);
  EXPECT_GT(expected, 0);
  EXPECT_EQ(std::count(ed->selection(Which::B).begin(), ed->selection(Which::B).end(), true), 0);
  const Session s0 = w->session();
  ed->moveSelection(0.5, 0.0);
  for (Eigen::Index i = 0; i < a.size(); ++i)
    EXPECT_EQ(w->session().a.points(i, 0), s0.a.points(i, 0) + (ed->selection(Which::A)[std::size_t(i)] ? 0.5 : 0.0));
  ASSERT_TRUE(waitIdle(*w));
}

TEST(WindowEditTest, GeneratorReplacesOrExtendsACloud) {
  auto w = makeWindow(demoSession());
  const Session s0 = w->session();
  ShapeSpec spec;
  spec.shape = "ring";
  spec.count = 40;
  spec.center = {0.5, -0.5};
  spec.spread = 0.7;
  spec.seed = 9;
  // [D] the generator is deterministic: the same spec gives the same points.
  ASSERT_TRUE(w->field()->applyGenerated(spec, Which::B, true).isEmpty());
  const Cloud expected = generate(spec, s0.b.name);
  EXPECT_EQ(w->session().b.points, expected.points);
  EXPECT_TRUE(test::sameCloud(w->session().a, s0.a));
  ASSERT_TRUE(w->field()->applyGenerated(spec, Which::A, false).isEmpty());
  ASSERT_EQ(w->session().a.size(), s0.a.size() + 40);
  EXPECT_EQ(w->session().a.points.topRows(s0.a.size()), s0.a.points);
  EXPECT_EQ(w->session().a.points.bottomRows(40), expected.points);
  EXPECT_EQ(w->document()->undoStack()->count(), 2);
  spec.count = 0;
  EXPECT_FALSE(w->field()->applyGenerated(spec, Which::A, true).isEmpty());  // refused, nothing changes
  EXPECT_EQ(w->document()->undoStack()->count(), 2);
  ASSERT_TRUE(waitIdle(*w));
}

// [D] Delete edits the Field only when the Field has the focus: pressed in the Measures
// table it removes nothing, pressed on the Field it removes the selected points.
TEST(WindowEditTest, DeleteKeyOnTheFieldRemovesTheSelection) {
  auto w = makeWindow(demoSession());
  QCustomPlot* plot = w->field()->view()->plot();
  const Eigen::Index n = w->session().a.size();
  w->field()->editor()->select(Which::A, {1, 4});
  QTreeWidget* tree = w->measures()->tree();
  tree->setFocus();
  QTest::keyClick(tree, Qt::Key_Delete);
  EXPECT_EQ(w->session().a.size(), n);
  plot->setFocus();
  QTest::keyClick(plot, Qt::Key_Delete);
  EXPECT_EQ(w->session().a.size(), n - 2);
  ASSERT_TRUE(waitIdle(*w));
}

TEST(WindowEditTest, DeletingAWholeCloudIsRefusedAndChangesNothing) {
  auto w = makeWindow(demoSession());
  FieldEditor* ed = w->field()->editor();
  const Session s0 = w->session();
  std::vector<int> all(std::size_t(s0.b.size()));
  for (std::size_t k = 0; k < all.size(); ++k) all[k] = int(k);
  ed->select(Which::B, all);
  EXPECT_FALSE(ed->deleteSelection().isEmpty());
  EXPECT_TRUE(sameCloud(w->session().b, s0.b));
  EXPECT_EQ(w->document()->undoStack()->count(), 0);
}

TEST(WindowEditTest, WeightOfSelectionChangesMarkerAndIsOneUndoStep) {
  auto w = makeWindow(demoSession());
  FieldEditor* ed = w->field()->editor();
  const Session s0 = w->session();
  ed->select(Which::A, {5});
  const double heavy = 4 * s0.a.weights(5);
  EXPECT_TRUE(ed->setSelectionWeight(heavy).isEmpty());
  EXPECT_EQ(w->session().a.weights(5), heavy);
  EXPECT_EQ(w->session().a.points, s0.a.points);
  // [D] marker area ∝ weight: 4× the weight of its neighbour → twice the diameter.
  const CloudLayer* layer = w->field()->view()->layer(Which::A);
  EXPECT_NEAR(layer->markerSize(5) / layer->markerSize(6), 2.0, 1e-12);
  EXPECT_FALSE(ed->setSelectionWeight(-1).isEmpty());
  w->document()->undoStack()->undo();
  EXPECT_TRUE(sameCloud(w->session().a, s0.a));
}

TEST(WindowEditTest, ParameterEditedInPlaceIsValidatedThenUndoable) {
  auto w = makeWindow(demoSession());
  QTreeWidget* tree = w->measures()->tree();
  // The first numeric parameter with a lower bound, wherever it is.
  QTreeWidgetItem* child = nullptr;
  ParamSpec spec;
  for (const Measure* m : MeasureRegistry::instance().defaults())
    for (const auto& p : m->params())
      if (!child && p.kind == ParamKind::Real && p.hasMin())
        for (int r = 0; r < tree->topLevelItemCount() && !child; ++r)
          for (int c = 0; c < tree->topLevelItem(r)->childCount(); ++c)
            if (tree->topLevelItem(r)->child(c)->data(1, Qt::UserRole + 2).toString().toStdString() == p.key) {
              child = tree->topLevelItem(r)->child(c);
              spec = p;
              break;
            }
  ASSERT_NE(child, nullptr) << "no bounded numeric parameter registered";
  const QModelIndex index = tree->indexFromItem(child, 1);
  auto* delegate = tree->itemDelegateForColumn(1);
  auto commit = [&](const QString& text) {
    QWidget* editor = delegate->createEditor(tree->viewport(), QStyleOptionViewItem(), index);
    ASSERT_NE(editor, nullptr);
    if (auto* line = qobject_cast<QLineEdit*>(editor)) line->setText(text);
    else if (auto* box = qobject_cast<QComboBox*>(editor)) box->setEditText(text);
    delegate->setModelData(editor, tree->model(), index);
    delete editor;
  };
  const std::string key = spec.key;
  // Below the spec's lower bound: rejected by the engine's own check, session unchanged.
  commit(QString::number(spec.min - 1.0));
  EXPECT_FALSE(w->session().params.has(key));
  EXPECT_EQ(w->document()->undoStack()->count(), 0);
  // A valid value is used, shown in the cell, and is one undo step.
  const double good = spec.min + 0.25 + (spec.hasMax() ? 0.0 : 1.0);
  commit(QString::number(good));
  ASSERT_TRUE(w->session().params.has(key));
  EXPECT_EQ(w->session().params.real(key), good);
  EXPECT_EQ(child->text(1).toDouble(), good);
  w->document()->undoStack()->undo();
  EXPECT_FALSE(w->session().params.has(key));
  ASSERT_TRUE(waitIdle(*w));
}

}  // namespace
}  // namespace barrow::ui
