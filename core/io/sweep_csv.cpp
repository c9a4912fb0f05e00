#include "io/sweep_csv.h"

#include <charconv>
#include <cmath>
#include <sstream>

#include "base/number_text.h"
#include "io/atomic_write.h"

namespace barrow {

namespace {

// Shortest text that reads back to the same double; "" for NaN (a failed cell).
std::string cell(double v) {
  if (std::isnan(v)) return "";
  return shortestText(v);
}

std::string joined(const std::vector<std::string>& parts, char sep) {
  std::string s;
  for (const auto& p : parts) s += (s.empty() ? "" : std::string(1, sep)) + p;
  return s;
}

std::string seedText(const SweepResult& r) {
  std::vector<std::string> seeds;
  for (const auto& ser : r.series)
    for (const auto& [k, v] : ser.frozen.values())
      if (k.find("seed") != std::string::npos) seeds.push_back(k + "=" + v);
  return seeds.empty() ? "none (the sweep draws no random numbers)" : joined(seeds, ' ');
}

std::vector<std::string> splitCsvLine(const std::string& line) {
  std::vector<std::string> out;
  std::string item;
  std::stringstream ss(line);
  while (std::getline(ss, item, ',')) out.push_back(item);
  if (!line.empty() && line.back() == ',') out.push_back("");
  return out;
}

std::string trimmed(std::string s) {
  while (!s.empty() && (s.back() == '\r' || s.back() == ' ' || s.back() == '\t')) s.pop_back();
  s.erase(0, s.find_first_not_of(" \t"));
  return s;
}

// Thrown while parsing; turned into a LoadError by parseSweepCsv.
struct ParseError {
  int line;
  std::string field;
  std::string reason;
};

double settingNumber(const std::string& key, const std::string& v, int line) {
  if (auto d = parseNumber(v); d && std::isfinite(*d)) return *d;
  throw ParseError{line, key, "'" + v + "' is not a finite number"};
}

void readSetting(SweepResult& r, std::map<std::string, std::string>& perMeasure, const std::string& key,
                 const std::string& v, int line) {
  SweepSettings& s = r.settings;
  auto pairOf = [&](const std::string& text) {
    const auto parts = splitCsvLine(text);
    if (parts.size() != 2) throw ParseError{line, key, "expected two numbers x,y, got '" + text + "'"};
    return std::array<double, 2>{settingNumber(key, parts[0], line), settingNumber(key, parts[1], line)};
  };
  if (key == "family") {
    const FamilySpec* f = findFamily(v);
    if (!f) throw ParseError{line, key, "unknown family '" + v + "' (expected " + familyChoices() + ")"};
    s.family = f->family;
  }
  else if (key == "direction") s.direction = pairOf(v);
  else if (key == "center") s.center = v == "auto" ? std::nullopt : std::optional(pairOf(v));
  else if (key == "from") s.from = settingNumber(key, v, line);
  else if (key == "to") s.to = settingNumber(key, v, line);
  else if (key == "steps") s.steps = int(settingNumber(key, v, line));
  else if (key == "reference") s.reference = settingNumber(key, v, line);
  else if (key == "threads") r.threads = int(settingNumber(key, v, line));
  else if (key == "warm_start") r.warmStart = v == "true";
  else if (key == "refine_tolerance") r.refineTolerance = settingNumber(key, v, line);
  else if (key == "refined_points") r.refinedPoints = int(settingNumber(key, v, line));
  else if (key == "refine_budget_hit") r.refineBudgetHit = v == "true";
  else if (key == "refine_budget") r.refineBudget = int(settingNumber(key, v, line));
  else if (key == "resamples") r.bandResamples = int(settingNumber(key, v, line));
  else if (key == "band_level") r.bandLevel = settingNumber(key, v, line);
  else if (key == "band_seed") r.bandSeed = std::uint64_t(settingNumber(key, v, line));
  else if (key.rfind("frozen.", 0) == 0 || key.rfind("rules.", 0) == 0 || key.rfind("gradient.", 0) == 0 ||
           key.rfind("accuracy.", 0) == 0 ||
           key.rfind("unit.", 0) == 0)
    perMeasure[key] = v;
}

bool hasBands(const SweepResult& r) {
  if (r.bandResamples <= 0) return false;
  for (const auto& ser : r.series)
    if (ser.low.size() != r.theta.size()) return false;
  return true;
}

}  // namespace

SweepTable sweepTable(const SweepResult& r) {
  SweepTable t;
  t.columns.push_back("theta");
  for (const auto& ser : r.series) t.columns.push_back(ser.id);
  for (const auto& ser : r.series) t.columns.push_back("d_" + ser.id);
  const bool bands = hasBands(r);  // resampling bands: lo_<id>,hi_<id> for each measure
  if (bands)
    for (const auto& ser : r.series) {
      t.columns.push_back("lo_" + ser.id);
      t.columns.push_back("hi_" + ser.id);
    }
  t.rows.reserve(r.theta.size());
  for (std::size_t k = 0; k < r.theta.size(); ++k) {
    std::vector<std::string> row;
    row.reserve(t.columns.size());
    row.push_back(cell(r.theta[k]));
    for (const auto& ser : r.series) row.push_back(k < ser.value.size() ? cell(ser.value[k]) : "");
    for (const auto& ser : r.series)
      row.push_back(k < ser.slope.size() && k < ser.value.size() && !std::isnan(ser.value[k]) ? cell(ser.slope[k]) : "");
    if (bands)
      for (const auto& ser : r.series) {
        row.push_back(k < ser.low.size() ? cell(ser.low[k]) : "");
        row.push_back(k < ser.high.size() ? cell(ser.high[k]) : "");
      }
    t.rows.push_back(std::move(row));
  }
  return t;
}

std::string formatSweepCsv(const SweepResult& r) {
  const SweepSettings& s = r.settings;
  std::ostringstream o;
  std::vector<std::string> ids;
  for (const auto& ser : r.series) ids.push_back(ser.id);
  o << "# barrow sweep, version 1: D(A_θ, B) per measure, then dD/dθ (d_<id>)\n";
  o << "# unit.<id> is the unit of column <id>; d_<id> is in that unit per unit of θ\n";
  o << "# family=" << familyName(s.family) << "\n";
  // The direction as used: normalised to unit length (only the shift family reads it).
  const double norm = std::hypot(s.direction[0], s.direction[1]);
  const bool unit = norm > 0 && std::isfinite(norm);
  o << "# direction=" << cell(unit ? s.direction[0] / norm : s.direction[0]) << ","
    << cell(unit ? s.direction[1] / norm : s.direction[1]) << "\n";
  o << "# center=" << (s.center ? cell((*s.center)[0]) + "," + cell((*s.center)[1]) : std::string("auto")) << "\n";
  o << "# from=" << cell(s.from) << "\n# to=" << cell(s.to) << "\n# steps=" << s.steps << "\n";
  o << "# reference=" << cell(s.referenceTheta()) << "\n";
  o << "# measures=" << joined(ids, ',') << "\n";
  o << "# seed=" << seedText(r) << "\n";
  o << "# threads=" << r.threads << "\n# warm_start=" << (r.warmStart ? "true" : "false") << "\n";
  o << "# refine_tolerance=" << cell(r.refineTolerance) << "\n# refined_points=" << r.refinedPoints << "\n";
  o << "# refine_budget=" << r.refineBudget << "\n";
  o << "# refine_budget_hit=" << (r.refineBudgetHit ? "true" : "false") << "\n";
  const bool bands = hasBands(r);
  if (bands)
    o << "# resamples=" << r.bandResamples << "\n# band_level=" << cell(r.bandLevel) << "\n# band_seed=" << r.bandSeed
      << "\n# bands: lo_<id>, hi_<id> = pointwise percentile interval of D over the resamples at each θ\n";
  for (const auto& ser : r.series) {
    std::vector<std::string> kv;
    for (const auto& [k, v] : ser.frozen.values()) kv.push_back(k + "=" + v);
    o << "# frozen." << ser.id << "=" << joined(kv, ' ') << "\n";
    kv.clear();
    for (const auto& [k, v] : ser.rules.values()) kv.push_back(k + "=" + v);
    o << "# rules." << ser.id << "=" << joined(kv, ' ') << "\n";
    o << "# gradient." << ser.id << "=" << ser.gradientMethod << "\n";
    o << "# accuracy." << ser.id << "=" << cell(ser.accuracy) << "\n";
    o << "# unit." << ser.id << "=" << ser.unit << "\n";
  }
  const SweepTable t = sweepTable(r);
  o << joined(t.columns, ',') << "\n";
  for (const auto& row : t.rows) o << joined(row, ',') << "\n";
  return o.str();
}

std::optional<std::string> writeSweepCsv(const std::string& path, const SweepResult& r) {
  return atomicWriteFile(path, formatSweepCsv(r));
}

Loaded<SweepResult> parseSweepCsv(const std::string& text, const std::string& file) {
  SweepResult r;
  std::map<std::string, std::string> perMeasure;
  std::istringstream in(text);
  std::string raw;
  int line = 0;
  bool header = false;
  bool bands = false;
  try {
    while (std::getline(in, raw)) {
      ++line;
      const std::string l = trimmed(raw);
      if (l.empty()) continue;
      if (l[0] == '#') {
        const std::string body = trimmed(l.substr(1));
        const auto eq = body.find('=');
        if (eq != std::string::npos && !header) readSetting(r, perMeasure, body.substr(0, eq), body.substr(eq + 1), line);
        continue;
      }
      const auto fields = splitCsvLine(l);
      if (!header) {
        if (fields.empty() || trimmed(fields[0]) != "theta")
          throw ParseError{line, "", "the header must start with 'theta'"};
        // theta, n ids, n d_<id>, and optionally lo_<id>,hi_<id> for each (resampling bands).
        std::size_t n = 0;
        while (1 + n < fields.size() && trimmed(fields[1 + n]).rfind("d_", 0) != 0) ++n;
        bands = fields.size() == 1 + 4 * n;
        if (n == 0 || (fields.size() != 1 + 2 * n && !bands))
          throw ParseError{line, "", "the header must be theta, the measure ids, then d_<id> for each "
                                     "(and lo_<id>,hi_<id> for each when the sweep has bands)"};
        for (std::size_t j = 0; j < n; ++j) {
          SweepSeries s;
          s.id = trimmed(fields[1 + j]);
          if (s.id.empty()) throw ParseError{line, "column " + std::to_string(j + 2), "empty measure id"};
          if (trimmed(fields[1 + n + j]) != "d_" + s.id)
            throw ParseError{line, "column " + std::to_string(n + j + 2),
                             "expected 'd_" + s.id + "', got '" + trimmed(fields[1 + n + j]) + "'"};
          if (bands)
            for (const char* side : {"lo_", "hi_"}) {
              const std::size_t col = 1 + 2 * n + 2 * j + (side[0] == 'h');
              if (trimmed(fields[col]) != side + s.id)
                throw ParseError{line, "column " + std::to_string(col + 1),
                                 "expected '" + std::string(side) + s.id + "', got '" + trimmed(fields[col]) + "'"};
            }
          r.series.push_back(std::move(s));
        }
        header = true;
        continue;
      }
      const std::size_t width = 1 + (bands ? 4 : 2) * r.series.size();
      if (fields.size() != width)
        throw ParseError{line, "", "found " + std::to_string(fields.size()) + " fields; expected " +
                                       std::to_string(width)};
      const auto theta = parseNumber(fields[0]);
      if (!theta || !std::isfinite(*theta)) throw ParseError{line, "theta", "'" + fields[0] + "' is not a finite number"};
      if (!r.theta.empty() && !(*theta > r.theta.back()))
        throw ParseError{line, "theta", "θ must increase from row to row"};
      r.theta.push_back(*theta);
      for (std::size_t j = 0; j < r.series.size(); ++j) {
        SweepSeries& s = r.series[j];
        auto read = [&](const std::string& f, const std::string& col) {
          const std::string t = trimmed(f);
          if (t.empty()) return double(NAN);
          const auto v = parseNumber(t);
          if (!v) throw ParseError{line, col, "'" + t + "' is not a number"};
          return *v;
        };
        const double v = read(fields[1 + j], s.id);
        s.value.push_back(v);
        s.status.push_back(std::isnan(v) ? Status::InvalidInput : std::isinf(v) ? Status::Infinite : Status::Ok);
        s.slope.push_back(read(fields[1 + r.series.size() + j], "d_" + s.id));
        if (bands) {
          s.low.push_back(read(fields[1 + 2 * r.series.size() + 2 * j], "lo_" + s.id));
          s.high.push_back(read(fields[2 + 2 * r.series.size() + 2 * j], "hi_" + s.id));
        }
        s.seconds.push_back(0.0);
        s.oneSided.push_back(false);
      }
    }
    if (!header) throw ParseError{0, "", "no header line 'theta,<id>,...,d_<id>,...'"};
    if (r.theta.empty()) throw ParseError{0, "", "no data rows"};
  } catch (const ParseError& e) {
    return Loaded<SweepResult>::fail(LoadError{file, e.line, e.field, e.reason});
  }
  std::vector<std::string> ids;
  for (auto& s : r.series) {
    ids.push_back(s.id);
    if (auto it = perMeasure.find("gradient." + s.id); it != perMeasure.end()) s.gradientMethod = it->second;
    if (auto it = perMeasure.find("accuracy." + s.id); it != perMeasure.end())
      if (auto v = parseNumber(it->second); v && *v >= 0 && std::isfinite(*v)) s.accuracy = *v;
    if (auto it = perMeasure.find("unit." + s.id); it != perMeasure.end()) s.unit = it->second;
    for (auto [prefix, set] : {std::pair{"frozen.", &s.frozen}, std::pair{"rules.", &s.rules}})
      if (auto it = perMeasure.find(prefix + s.id); it != perMeasure.end()) {
        std::istringstream kv(it->second);
        std::string item;
        while (kv >> item) set->assign(item);
      }
  }
  r.settings.measures = ids;
  return Loaded<SweepResult>::success(std::move(r));
}

Loaded<SweepResult> readSweepCsv(const std::string& path) {
  std::string error;
  const auto text = readWholeFile(path, &error);
  if (!text) return Loaded<SweepResult>::fail(LoadError{path, 0, "", "cannot open: " + error});
  return parseSweepCsv(*text, path);
}

}  // namespace barrow
