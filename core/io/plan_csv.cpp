#include "io/plan_csv.h"

#include <algorithm>
#include <cmath>
#include <sstream>

#include "base/number_text.h"
#include "base/params.h"
#include "transport/exact_cost.h"

namespace barrow {

namespace {

constexpr const char* kHeader = "i,j,mass,ax,ay,bx,by,cost";

std::vector<std::string> fields(const std::string& line) {
  std::vector<std::string> out;
  std::string cur;
  for (char c : line) {
    if (c == ',') {
      out.push_back(cur);
      cur.clear();
    } else if (c != '\r') {
      cur += c;
    }
  }
  out.push_back(cur);
  return out;
}

}  // namespace

std::string formatPlanCsv(const Cloud& a, const Cloud& b, const std::vector<PlanEntry>& plan, double p) {
  std::vector<PlanEntry> sorted;
  for (const PlanEntry& e : plan)
    if (e.i >= 0 && e.i < a.size() && e.j >= 0 && e.j < b.size()) sorted.push_back(e);
  std::sort(sorted.begin(), sorted.end(),
            [](const PlanEntry& x, const PlanEntry& y) { return x.i != y.i ? x.i < y.i : x.j < y.j; });
  const GroundCost c(p);  // the solver's own cost, so the column adds up to its value
  std::string out = std::string(kHeader) + "\n";
  for (const PlanEntry& e : sorted) {
    const double ax = a.points(e.i, 0), ay = a.points(e.i, 1), bx = b.points(e.j, 0), by = b.points(e.j, 1);
    const double cost = c(ax, ay, bx, by);
    out += std::to_string(e.i) + "," + std::to_string(e.j) + "," + shortestText(e.mass) + "," + shortestText(ax) +
           "," + shortestText(ay) + "," + shortestText(bx) + "," + shortestText(by) + "," + shortestText(cost) + "\n";
  }
  return out;
}

std::optional<std::string> writePlanCsv(const std::string& path, const Cloud& a, const Cloud& b,
                                        const std::vector<PlanEntry>& plan, double p, const WriteFault* fault) {
  return atomicWriteFile(path, formatPlanCsv(a, b, plan, p), fault);
}

Loaded<std::vector<PlanRow>> parsePlanCsv(const std::string& text, const std::string& file) {
  using Out = Loaded<std::vector<PlanRow>>;
  static const char* kNames[] = {"i", "j", "mass", "ax", "ay", "bx", "by", "cost"};
  std::istringstream in(text);
  std::string line;
  int n = 0;
  std::vector<PlanRow> rows;
  while (std::getline(in, line)) {
    ++n;
    if (!line.empty() && line.back() == '\r') line.pop_back();
    if (n == 1) {
      if (line != kHeader) return Out::fail({file, 1, "", std::string("expected the header ") + kHeader});
      continue;
    }
    if (line.empty()) continue;
    const auto f = fields(line);
    if (f.size() != 8) return Out::fail({file, n, "", "expected 8 fields, got " + std::to_string(f.size())});
    double v[8];
    for (int k = 0; k < 8; ++k) {
      const auto x = parseNumber(f[std::size_t(k)]);
      if (!x || !std::isfinite(*x)) return Out::fail({file, n, kNames[k], "'" + f[std::size_t(k)] + "' is not a finite number"});
      v[k] = *x;
    }
    PlanRow r;
    for (int k = 0; k < 2; ++k)
      if (v[k] < 0 || v[k] != std::floor(v[k]) || v[k] > 2147483647.0)
        return Out::fail({file, n, kNames[k], "'" + f[std::size_t(k)] + "' is not a row index"});
    if (v[2] < 0) return Out::fail({file, n, "mass", "negative mass"});
    r.i = int(v[0]);
    r.j = int(v[1]);
    r.mass = v[2];
    r.ax = v[3];
    r.ay = v[4];
    r.bx = v[5];
    r.by = v[6];
    r.cost = v[7];
    rows.push_back(r);
  }
  if (n == 0) return Out::fail({file, 0, "", "empty file"});
  return Out::success(std::move(rows));
}

Loaded<std::vector<PlanRow>> readPlanCsv(const std::string& path) {
  std::string error;
  const auto text = readWholeFile(path, &error);
  if (!text) return Loaded<std::vector<PlanRow>>::fail(LoadError{path, 0, "", "cannot open: " + error});
  return parsePlanCsv(*text, path);
}

}  // namespace barrow
