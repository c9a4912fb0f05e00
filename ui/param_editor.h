// In-place editors for measure parameters, built from their ParamSpec: a list of words for
// choices and booleans, a text field (with the spec's words offered) for numbers. Values are
// checked with the engine's own checkParam() before they reach the session.
#pragma once

#include <QStyledItemDelegate>
#include <functional>
#include <optional>
#include <string>

#include "base/params.h"

namespace barrow::ui {

/// "≥ 0", "> 0 and ≤ 1", "one of hist, kde, knn": the valid values of a spec in words.
QString describeRange(const ParamSpec& spec);

class ParamDelegate : public QStyledItemDelegate {
  Q_OBJECT
 public:
  /// `specOf` returns the spec for an index, or nullopt when the cell is not a parameter.
  using SpecLookup = std::function<std::optional<ParamSpec>(const QModelIndex&)>;
  ParamDelegate(SpecLookup specOf, QObject* parent = nullptr);

  QWidget* createEditor(QWidget* parent, const QStyleOptionViewItem& option,
                        const QModelIndex& index) const override;
  void setEditorData(QWidget* editor, const QModelIndex& index) const override;
  void setModelData(QWidget* editor, QAbstractItemModel* model, const QModelIndex& index) const override;

 signals:
  /// A value was committed: valid (error empty) or rejected with the reason.
  void committed(const QString& key, const QString& value, const QString& error) const;

 private:
  SpecLookup specOf_;
};

}  // namespace barrow::ui
