#include "result_text.h"

#include <QObject>
#include <algorithm>
#include <cmath>
#include <limits>
#include <optional>
#include <sstream>

#include "measures/details_text.h"

namespace barrow::ui {

namespace {

QString num(double v) { return QString::number(v, 'g', 5); }

// The marginal error, if the measure reported one (entropic solvers do).
std::optional<double> marginalError(const Result& r) {
  for (const char* key : {"marginal_error", "marginalError"}) {
    if (r.details.contains(key) && r.details[key].is_number()) return r.details[key].get<double>();
  }
  return std::nullopt;
}

}  // namespace

QString valueText(const Result& r) {
  if (!r.usable()) return QStringLiteral("—");
  if (std::isinf(r.value)) return r.value > 0 ? QStringLiteral("∞") : QStringLiteral("−∞");
  if (std::isnan(r.value)) return QStringLiteral("—");
  // A certified bracket: its midpoint ± half its width (the bounds are in the status column).
  if (r.status == Status::Bracketed && std::isfinite(r.low) && std::isfinite(r.high))
    return num(r.value) + " ± " + QString::number(0.5 * (r.high - r.low), 'g', 2);
  return num(r.value);
}

QString changeText(const Result& now, const Result& ref) {
  if (!now.usable() || !ref.usable() || std::isnan(now.value) || std::isnan(ref.value)) return QStringLiteral("—");
  if (std::isinf(now.value) || std::isinf(ref.value)) {
    // +∞ at both: the difference is undefined, not 0 (the measure cannot see the change).
    if (std::isinf(now.value) && std::isinf(ref.value)) return QStringLiteral("∞ → ∞");
    return std::isinf(now.value) ? QStringLiteral("+∞") : QStringLiteral("−∞");
  }
  const double d = now.value - ref.value;
  // A difference at rounding level of the values themselves is no change (2.2e-16 on ln 2
  // would read as a tiny real effect).
  if (std::abs(d) <= 8 * std::numeric_limits<double>::epsilon() * std::max(std::abs(now.value), std::abs(ref.value)))
    return QStringLiteral("0");
  // Three significant digits: a change is read for its size and sign, and "+1.54e-05" fits
  // the column where five digits would be cut off.
  return (d > 0 ? "+" : "") + QString::number(d, 'g', 3);
}

QString statusText(const Result& r) {
  switch (r.status) {
    case Status::Ok:
      return QObject::tr("ok");
    case Status::Infinite:
      return QObject::tr("infinite");
    case Status::NotConverged: {
      const auto e = marginalError(r);
      return e ? QObject::tr("not converged (marginal error %1)").arg(*e, 0, 'g', 2)
               : QObject::tr("not converged");
    }
    case Status::InvalidInput:
      return QObject::tr("invalid: %1").arg(QString::fromStdString(r.message));
    case Status::Cancelled:
      return QObject::tr("cancelled");
    case Status::Bracketed:
      return QObject::tr("bracketed [%1, %2]").arg(num(r.low), num(r.high));
  }
  return {};
}

QString statusTooltip(const Result& r) {
  QString t = QString::fromLatin1(statusName(r.status));
  if (!r.message.empty()) t += ": " + QString::fromStdString(r.message);
  if (r.iterations > 0) t += "\n" + QObject::tr("%n iteration(s)", "", r.iterations);
  return t;
}

QString secondsText(double s) {
  if (!(s >= 0)) return {};
  if (s < 1e-3) return QObject::tr("%1 µs").arg(s * 1e6, 0, 'f', 0);
  if (s < 1) return QObject::tr("%1 ms").arg(s * 1e3, 0, 'f', s < 0.01 ? 2 : 1);
  return QObject::tr("%1 s").arg(s, 0, 'f', 2);
}

QString detailsHtml(const Measure& m, const Result* r) {
  QString h = "<b>" + QString::fromStdString(m.displayName()).toHtmlEscaped() + "</b> <tt>[" +
              QString::fromStdString(m.id()) + "]</tt><br><tt>" +
              QString::fromStdString(m.formula()).toHtmlEscaped() + "</tt>";
  if (!m.unitRule().empty())
    h += "<br>" + QObject::tr("Unit: %1").arg(QString::fromStdString(m.unitRule()).toHtmlEscaped());
  if (!m.cheap()) h += "<br><i>" + QObject::tr("Slow: updates after the cheap measures.") + "</i>";
  if (!r) return h;
  h += "<br>" + QObject::tr("Status: %1").arg(statusText(*r).toHtmlEscaped());
  if (!r->message.empty() && r->status != Status::InvalidInput)
    h += "<br>" + QString::fromStdString(r->message).toHtmlEscaped();
  if (r->iterations > 0) h += "<br>" + QObject::tr("%n iteration(s)", "", r->iterations);
  const std::vector<std::string> items = detailItems(r->details);
  if (!items.empty()) {
    QStringList shown;
    for (const auto& item : items) shown << QString::fromStdString(item).toHtmlEscaped();
    h += "<br>" + QObject::tr("Settings and diagnostics:") + " <tt>" + shown.join("; ") + "</tt>";
  }
  return h;
}

std::string csvNumber(const Result& r) {
  if (!r.usable() || std::isnan(r.value)) return "";
  if (std::isinf(r.value)) return r.value > 0 ? "inf" : "-inf";
  std::ostringstream o;
  o.precision(17);
  o << r.value;
  return o.str();
}

std::string csvDifference(double now, double ref) {
  if (std::isnan(now) || std::isnan(ref)) return "";
  if (std::isinf(now) || std::isinf(ref)) {
    if (std::isinf(now) && std::isinf(ref)) return "0";
    return std::isinf(now) ? "inf" : "-inf";
  }
  std::ostringstream o;
  o.precision(17);
  o << now - ref;
  return o.str();
}

}  // namespace barrow::ui
