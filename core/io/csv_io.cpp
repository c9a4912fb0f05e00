#include "io/csv_io.h"

#include <algorithm>
#include <array>
#include <cctype>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <string_view>
#include <vector>

#include "base/params.h"
#include "io/atomic_write.h"
#include "io/file_block.h"
#include "io/page_prefault.h"

namespace barrow {

namespace {

std::string_view trim(std::string_view s) {
  const auto b = s.find_first_not_of(" \t\r");
  if (b == std::string_view::npos) return {};
  const auto e = s.find_last_not_of(" \t\r");
  return s.substr(b, e - b + 1);
}

std::string lower(std::string s) {
  std::transform(s.begin(), s.end(), s.begin(), [](unsigned char ch) { return std::tolower(ch); });
  return s;
}

char detectDelimiter(std::string_view line) {
  for (char d : {',', ';', '\t'})
    if (line.find(d) != std::string_view::npos) return d;
  return ' ';
}

// The first few fields of one line, as views into it, and how many fields it has in all.
// Only `maxFields` + 1 are kept (no allocation per line), so that a line of millions of fields
// costs no more than a short one; `count` is still the true number, for the message.
struct LineFields {
  static constexpr std::size_t kKept = 4;
  std::array<std::string_view, kKept> kept;
  std::size_t stored = 0;
  std::size_t count = 0;

  const std::string_view* begin() const { return kept.data(); }
  const std::string_view* end() const { return kept.data() + stored; }
  std::size_t size() const { return stored; }
  std::string_view operator[](std::size_t k) const { return kept[k]; }
};

void splitFields(std::string_view line, char delim, std::size_t maxFields, LineFields& out) {
  out.stored = 0;
  out.count = 0;
  const std::size_t limit = std::min(maxFields + 1, LineFields::kKept);
  auto keep = [&](std::string_view f) {
    if (out.stored < limit) out.kept[out.stored++] = f;
    ++out.count;
  };
  if (delim == ' ') {
    std::size_t i = 0;
    while (i < line.size()) {
      while (i < line.size() && (line[i] == ' ' || line[i] == '\t')) ++i;
      if (i >= line.size()) break;
      std::size_t j = i;
      while (j < line.size() && line[j] != ' ' && line[j] != '\t') ++j;
      keep(line.substr(i, j - i));
      i = j;
    }
  } else {
    std::size_t start = 0;
    while (true) {
      const auto k = line.find(delim, start);
      keep(trim(line.substr(start, k == std::string_view::npos ? std::string_view::npos : k - start)));
      if (k == std::string_view::npos) break;
      start = k + 1;
    }
  }
}

// A field shown in a message: at most 40 characters, so a 100 MB field is not echoed back.
std::string shown(std::string_view f) {
  if (f.size() <= 40) return std::string(f);
  return std::string(f.substr(0, 37)) + "... (" + std::to_string(f.size()) + " characters)";
}

std::string quoted(std::string_view f) {
  if (f.size() <= 40) return "'" + std::string(f) + "'";
  return "'" + std::string(f.substr(0, 37)) + "...' (" + std::to_string(f.size()) + " characters)";
}

// Longer than any number a person or a program writes (17 significant digits, an exponent,
// some leading zeros); refusing it keeps the parse of a huge field cheap.
constexpr std::size_t kMaxNumberText = 400;

std::optional<double> fieldNumber(std::string_view f) {
  if (f.size() > kMaxNumberText) return std::nullopt;
  // Fast path: when std::from_chars reads the whole field (one leading '+' dropped, as
  // parseNumber does) it has read exactly the text parseNumber would read, so the value is
  // the same; anything else (blanks, words, inf/nan spellings, out of range) takes
  // parseNumber's own path.
  std::string_view t = f;
  if (!t.empty() && t.front() == '+') t.remove_prefix(1);
  double v = 0;
  const auto [end, ec] = std::from_chars(t.data(), t.data() + t.size(), v);
  if (ec == std::errc() && end == t.data() + t.size() && !t.empty()) return v;
  return parseNumber(std::string(f));
}

const char* kColumnNames[3] = {"x", "y", "w"};

// Why a data field cannot be used (it did not read as a number, or read as NaN, infinite, or
// a negative weight): "column 3 (w): weight -1 is negative". Only built for the failing field.
std::string fieldProblem(int role, int fieldIndex, std::string_view f, const std::optional<double>& num) {
  const std::string col = std::string("column ") + std::to_string(fieldIndex + 1) + " (" + kColumnNames[role] + ")";
  if (!num)
    return col + ": " + quoted(f) + " " +
           (f.size() > kMaxNumberText ? std::string("is too long to be a number") : notNumberReason(std::string(f)));
  if (std::isnan(*num)) return col + ": value is NaN";
  if (std::isinf(*num)) return col + ": value is infinite";
  return col + ": weight " + shown(f) + " is negative";
}

}  // namespace

std::string fileStem(const std::string& path) {
  auto slash = path.find_last_of("/\\");
  std::string base = slash == std::string::npos ? path : path.substr(slash + 1);
  auto dot = base.find_last_of('.');
  return dot == std::string::npos || dot == 0 ? base : base.substr(0, dot);
}

Loaded<Cloud> parseCloudCsv(std::string_view textIn, const std::string& file) {
  auto fail = [&](int line, std::string why) {
    return Loaded<Cloud>::fail(LoadError{file, line, "", std::move(why)});
  };
  std::string_view text = textIn;
  if (text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);  // UTF-8 byte-order mark

  char delim = 0;
  int columns = 0;           // 2 or 3 once known
  int columnsLine = 0;       // line that fixed the column count
  int order[3] = {0, 1, 2};  // field index of x, y, w
  bool headerAllowed = true;
  std::vector<double> xs, ys, ws;
  LineFields fields;
  {
    // At most one row per line, and a row takes at least 4 bytes ("1 2" and its line end):
    // reserving that avoids regrowing (and re-faulting) the columns of a million-row file,
    // and never exceeds what a file of this size could really hold.
    const auto lines = std::size_t(std::count(text.begin(), text.end(), '\n')) + 1;
    const std::size_t rows = std::min(lines, text.size() / 4 + 1);
    for (std::vector<double>* column : {&xs, &ys, &ws}) {
      column->reserve(rows);
      prefaultForWrite(column->data(), rows * sizeof(double));
    }
  }

  std::size_t pos = 0;
  int lineNo = 0;
  while (pos <= text.size()) {
    auto nl = text.find('\n', pos);
    if (nl == std::string_view::npos) nl = text.size();
    std::string_view raw = text.substr(pos, nl - pos);
    pos = nl + 1;
    ++lineNo;
    if (const auto hash = raw.find('#'); hash != std::string_view::npos) raw = raw.substr(0, hash);
    const std::string_view line = trim(raw);
    if (line.empty()) {
      if (nl == text.size()) break;
      continue;
    }
    if (!delim) delim = detectDelimiter(line);
    splitFields(line, delim, 3, fields);
    const std::size_t fieldCount = fields.count;

    // A header is a first row in which some field is not a number.
    if (headerAllowed) {
      headerAllowed = false;
      const bool anyText = std::any_of(fields.begin(), fields.end(),
                                       [](std::string_view f) { return !fieldNumber(f); });
      if (anyText) {
        if (fieldCount != 2 && fieldCount != 3)
          return fail(lineNo, "header has " + std::to_string(fieldCount) +
                                  " columns; expected x,y or x,y,w");
        bool seen[3] = {false, false, false};
        for (std::size_t k = 0; k < fields.size(); ++k) {
          const std::string name = lower(std::string(fields[k].substr(0, 16)));
          int role = -1;
          if (name == "x") role = 0;
          else if (name == "y") role = 1;
          else if (name == "w" || name == "weight" || name == "weights" || name == "mass") role = 2;
          if (role < 0)
            return fail(lineNo, "header column " + quoted(fields[k]) +
                                    " is not recognised (expected x, y and optionally w)");
          if (seen[role]) return fail(lineNo, "header names column " + quoted(fields[k]) + " twice");
          seen[role] = true;
          order[role] = int(k);
        }
        if (!seen[0] || !seen[1]) return fail(lineNo, "header must name both x and y");
        columns = int(fieldCount);
        columnsLine = lineNo;
        continue;
      }
    }

    if (columns == 0) {
      if (fieldCount != 2 && fieldCount != 3)
        return fail(lineNo, "found " + std::to_string(fieldCount) +
                                " columns; expected 2 (x,y) or 3 (x,y,w)");
      columns = int(fieldCount);
      columnsLine = lineNo;
    } else if (fieldCount != std::size_t(columns)) {
      return fail(lineNo, "found " + std::to_string(fieldCount) + " columns; expected " +
                              std::to_string(columns) + " as on line " + std::to_string(columnsLine));
    }

    double v[3] = {0, 0, 1};
    for (int role = 0; role < columns; ++role) {
      const std::string_view f = fields[std::size_t(order[role])];
      const auto num = fieldNumber(f);
      if (!num || !std::isfinite(*num) || (role == 2 && *num < 0))
        return fail(lineNo, fieldProblem(role, order[role], f, num));
      v[role] = *num;
    }
    xs.push_back(v[0]);
    ys.push_back(v[1]);
    ws.push_back(v[2]);
    if (nl == text.size()) break;
  }

  if (xs.empty())
    return fail(0, "no data rows (the file is empty or holds only comments and a header)");
  Cloud c;
  c.name = fileStem(file);
  c.points.resize(Eigen::Index(xs.size()), 2);
  c.weights.resize(Eigen::Index(xs.size()));
  prefaultForWrite(c.points.data(), xs.size() * 2 * sizeof(double));
  prefaultForWrite(c.weights.data(), xs.size() * sizeof(double));
  for (std::size_t i = 0; i < xs.size(); ++i) {
    c.points(Eigen::Index(i), 0) = xs[i];
    c.points(Eigen::Index(i), 1) = ys[i];
    c.weights(Eigen::Index(i)) = columns == 3 ? ws[i] : 1.0 / double(xs.size());
  }
  if (!(c.weights.sum() > 0)) return fail(0, "all weights are zero, so the cloud has no mass");
  return Loaded<Cloud>::success(std::move(c));
}

Loaded<Cloud> readCloudCsv(const std::string& path) {
  std::string why;
  const auto block = FileBlock::read(path, &why);
  if (!block) return Loaded<Cloud>::fail(LoadError{path, 0, "", "cannot open: " + why});
  return parseCloudCsv(block->text(), path);
}

std::string formatCloudCsv(const Cloud& c) {
  std::string out = "x,y,w\n";
  char buf[96];
  for (Eigen::Index i = 0; i < c.size(); ++i) {
    std::snprintf(buf, sizeof buf, "%.17g,%.17g,%.17g\n", c.points(i, 0), c.points(i, 1),
                  c.weights(i));
    out += buf;
  }
  return out;
}

std::optional<std::string> writeCloudCsv(const std::string& path, const Cloud& c) {
  return atomicWriteFile(path, formatCloudCsv(c));
}

}  // namespace barrow
