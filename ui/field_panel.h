// The Field with its controls: the editing tools (select/move, add, spray, pan), the target
// cloud and brush, generators and weight setting, and the overlay switches (exact plan with
// its mass threshold, entropic plan, W1 potential map, displacement interpolation at t).
#pragma once

#include <QWidget>
#include <optional>

#include "field_editor.h"
#include "live_evaluator.h"
#include "scenario/generators.h"
#include "session_document.h"

class QCheckBox;
class QComboBox;
class QSlider;
class QDoubleSpinBox;
class QSpinBox;
class QToolButton;
class QLabel;

namespace barrow::ui {

class FieldView;

class FieldPanel : public QWidget {
  Q_OBJECT
 public:
  FieldPanel(SessionDocument* doc, QWidget* parent = nullptr);

  FieldView* view() const { return view_; }
  FieldEditor* editor() const { return editor_; }

  // What the live evaluation must deliver for the overlays.
  std::string planId() const;     // "w2", "w1" or "" (plan overlay off)
  bool entropicPlanShown() const;
  bool potentialShown() const;

  /// Shows A_θ (nullopt: A as drawn) — the θ cursor's effect.
  void setThetaActive(bool active) { thetaActive_ = active; }
  bool thetaActive() const { return thetaActive_; }
  void applyUpdate(const LiveUpdate& u);
  /// Redraws from the session (A as drawn, B).
  void showSessionClouds();

  void openGenerator();
  /// Puts a generated cloud into A or B (replacing it or joining it); one undo step.
  QString applyGenerated(const ShapeSpec& spec, Which w, bool replace);
  void askSelectionWeight();

  // Overlay switches, also used by tests and the session's view options.
  void setPlanShown(bool on);
  void setPlanCost(const QString& id);
  void setEntropicShown(bool on);
  void setPotentialShown(bool on);
  void setInterpolationShown(bool on);
  void setInterpolationT(double t);
  void setThreshold(double fraction);
  nlohmann::json viewOptions() const;
  void setViewOptions(const nlohmann::json& v);

 signals:
  void overlaysChanged();
  void message(const QString& text);

 private:
  QWidget* buildToolRow();
  QWidget* buildOverlayRow();
  void syncInterpolation();

  SessionDocument* doc_;
  FieldView* view_;
  FieldEditor* editor_;
  bool thetaActive_ = false;
  QToolButton* tools_[4];
  QComboBox* target_;
  QDoubleSpinBox* radius_;
  QSpinBox* perDab_;
  QCheckBox* plan_;
  QComboBox* planCost_;
  QSlider* threshold_;
  QCheckBox* entropic_;
  QCheckBox* potential_;
  QCheckBox* interp_;
  QSlider* interpT_;
  QLabel* interpLabel_;
};

}  // namespace barrow::ui
