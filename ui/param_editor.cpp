#include "param_editor.h"

#include <QComboBox>
#include <QLineEdit>


namespace barrow::ui {

namespace {

QString num(double v) { return QString::number(v, 'g', 6); }

}  // namespace

QString describeRange(const ParamSpec& s) {
  QString words;
  for (const auto& c : s.choices) words += (words.isEmpty() ? "" : ", ") + QString::fromStdString(c);
  switch (s.kind) {
    case ParamKind::Boolean:
      return QObject::tr("true or false");
    case ParamKind::Choice:
      return QObject::tr("one of %1").arg(words);
    case ParamKind::Real:
    case ParamKind::Integer:
    case ParamKind::RealPair: {
      QString r;
      if (s.hasMin()) r = (s.minExclusive ? "> " : "≥ ") + num(s.min);
      if (s.hasMax()) r += (r.isEmpty() ? "" : QObject::tr(" and ")) + "≤ " + num(s.max);
      if (r.isEmpty()) r = QObject::tr("any number");
      if (s.kind == ParamKind::Integer) r = QObject::tr("whole number, %1").arg(r);
      if (s.kind == ParamKind::RealPair) r = QObject::tr("s or sx,sy, each %1").arg(r);
      if (!words.isEmpty()) r += QObject::tr(", or %1").arg(words);
      return r;
    }
  }
  return {};
}

ParamDelegate::ParamDelegate(SpecLookup specOf, QObject* parent)
    : QStyledItemDelegate(parent), specOf_(std::move(specOf)) {}

QWidget* ParamDelegate::createEditor(QWidget* parent, const QStyleOptionViewItem& option,
                                     const QModelIndex& index) const {
  const auto spec = specOf_(index);
  if (!spec) return nullptr;
  const QString tip = QString::fromStdString(spec->help) + "\n" + tr("Valid: %1").arg(describeRange(*spec));
  if (spec->kind == ParamKind::Choice || spec->kind == ParamKind::Boolean) {
    auto* box = new QComboBox(parent);
    if (spec->kind == ParamKind::Boolean) box->addItems({"true", "false"});
    for (const auto& c : spec->choices) box->addItem(QString::fromStdString(c));
    box->setToolTip(tip);
    return box;
  }
  if (!spec->choices.empty()) {
    // A number or one of the spec's words ("median", "auto").
    auto* box = new QComboBox(parent);
    box->setEditable(true);
    for (const auto& c : spec->choices) box->addItem(QString::fromStdString(c));
    box->setToolTip(tip);
    return box;
  }
  auto* edit = new QLineEdit(parent);
  edit->setToolTip(tip);
  (void)option;
  return edit;
}

void ParamDelegate::setEditorData(QWidget* editor, const QModelIndex& index) const {
  const QString v = index.data(Qt::EditRole).toString();
  if (auto* box = qobject_cast<QComboBox*>(editor)) {
    if (box->isEditable()) box->setEditText(v);
    else box->setCurrentText(v);
  } else if (auto* edit = qobject_cast<QLineEdit*>(editor)) {
    edit->setText(v);
    edit->selectAll();
  }
}

void ParamDelegate::setModelData(QWidget* editor, QAbstractItemModel* model, const QModelIndex& index) const {
  const auto spec = specOf_(index);
  if (!spec) return;
  QString v;
  if (auto* box = qobject_cast<QComboBox*>(editor)) v = box->currentText().trimmed();
  else if (auto* edit = qobject_cast<QLineEdit*>(editor)) v = edit->text().trimmed();
  const auto err = checkParam(*spec, v.toStdString());
  const QString key = QString::fromStdString(spec->key);
  if (err) {
    emit committed(key, v, QString::fromStdString(*err));
    return;  // the cell keeps the old value
  }
  (void)model;  // the session is the model; the panel redraws from it
  emit committed(key, v, QString());
}

}  // namespace barrow::ui
