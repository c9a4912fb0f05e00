// The Field's editing tools: select (click, rubber band) and move points, add a point,
// spray a brush of points, pan; delete the selection and set its weight. Every edit goes
// through SessionDocument, so it is one undo step (a whole drag or spray stroke included).
#pragma once

#include <QObject>
#include <QPointF>
#include <QTimer>
#include <random>
#include <vector>

#include "session_document.h"

class QMouseEvent;
class QRubberBand;

namespace barrow::ui {

class FieldView;

enum class FieldTool { Select, Add, Spray, Pan };

class FieldEditor : public QObject {
  Q_OBJECT
 public:
  FieldEditor(FieldView* view, SessionDocument* doc, QObject* parent = nullptr);

  void setTool(FieldTool t);
  FieldTool tool() const { return tool_; }
  /// Cloud that Add and Spray put points into.
  void setTarget(Which w) { target_ = w; }
  Which target() const { return target_; }
  /// Spray brush: disc of `radius` (data units), `perDab` points per dab.
  void setBrush(double radius, int perDab);
  double brushRadius() const { return radius_; }
  int brushCount() const { return perDab_; }

  const std::vector<bool>& selection(Which w) const { return w == Which::A ? selA_ : selB_; }
  int selectedCount() const;
  void selectAll();
  void clearSelection();
  /// Selects exactly these points (tests, scripted use).
  void select(Which w, const std::vector<int>& indices);
  /// Returns an explanation when nothing was deleted (e.g. a cloud would become empty).
  QString deleteSelection();
  /// Sets the raw weight of every selected point; w >= 0.
  QString setSelectionWeight(double w);
  /// Moves the selection by (dx, dy) as one undo step.
  void moveSelection(double dx, double dy);
  /// Cancels a drag or spray in progress, restoring the state before it.
  void cancelGesture();

 signals:
  /// Emitted before an edit starts, so the owner can release the θ cursor first.
  void editStarting();
  void selectionChanged(int selectedA, int selectedB);
  void message(const QString& text);

 private:
  void onPress(QMouseEvent* e);
  void onMove(QMouseEvent* e);
  void onRelease(QMouseEvent* e);
  void onCloudsChanged();
  void sprayDab(const QPointF& at);
  QPointF toData(const QPointF& px) const;
  void pushSelection();

  FieldView* view_;
  SessionDocument* doc_;
  FieldTool tool_ = FieldTool::Select;
  Which target_ = Which::A;
  double radius_ = 0.15;
  int perDab_ = 6;
  std::vector<bool> selA_, selB_;

  enum class Gesture { None, Drag, Band, Spray } gesture_ = Gesture::None;
  QPointF pressPx_;
  QPointF pressData_;
  QPointF lastDab_;
  Cloud origA_, origB_;
  QRubberBand* band_ = nullptr;
  QTimer sprayTimer_;
  QPointF sprayAt_;
  int sprayed_ = 0;
  std::mt19937_64 rng_{20240611};
  bool bandAdditive_ = false;
  int hoverIdx_ = -1;
  Which hoverWhich_ = Which::A;
};

}  // namespace barrow::ui
