#include "io/npy_io.h"

#include <algorithm>
#include <bit>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <vector>

#include "io/atomic_write.h"
#include "io/file_block.h"
#include "io/page_prefault.h"
#include "io/csv_io.h"

namespace barrow {

namespace {

constexpr std::size_t kMaxHeader = 1 << 16;  // numpy itself refuses headers past 10 KiB by default

struct Dtype {
  char kind = 0;     // 'f', 'i', 'u'
  int size = 0;      // bytes
  bool big = false;  // big-endian
};

// Extracts the value text of 'key' from the header dict literal.
std::optional<std::string> dictValue(const std::string& h, const std::string& key) {
  for (const char* q : {"'", "\""}) {
    const std::string k = std::string(q) + key + q;
    auto p = h.find(k);
    if (p == std::string::npos) continue;
    p = h.find(':', p + k.size());
    if (p == std::string::npos) return std::nullopt;
    ++p;
    while (p < h.size() && h[p] == ' ') ++p;
    if (p >= h.size()) return std::nullopt;
    if (h[p] == '(') {
      const auto e = h.find(')', p);
      if (e == std::string::npos) return std::nullopt;
      return h.substr(p, e - p + 1);
    }
    if (h[p] == '\'' || h[p] == '"') {
      const auto e = h.find(h[p], p + 1);
      if (e == std::string::npos) return std::nullopt;
      return h.substr(p + 1, e - p - 1);
    }
    auto e = h.find_first_of(",}", p);
    if (e == std::string::npos) e = h.size();
    std::string v = h.substr(p, e - p);
    while (!v.empty() && v.back() == ' ') v.pop_back();
    return v;
  }
  return std::nullopt;
}

std::optional<Dtype> parseDescr(const std::string& d) {
  if (d.size() < 2) return std::nullopt;
  Dtype t;
  std::size_t p = 0;
  if (d[0] == '<' || d[0] == '>' || d[0] == '|' || d[0] == '=') {
    t.big = d[0] == '>' || (d[0] == '=' && std::endian::native == std::endian::big);
    p = 1;
  }
  if (p >= d.size()) return std::nullopt;
  t.kind = d[p];
  const std::string sz = d.substr(p + 1);
  if (sz != "1" && sz != "2" && sz != "4" && sz != "8") return std::nullopt;
  t.size = std::stoi(sz);
  if (t.kind == 'f' && (t.size == 4 || t.size == 8)) return t;
  if (t.kind == 'i' || t.kind == 'u') return t;
  return std::nullopt;
}

double readValue(const unsigned char* p, const Dtype& t) {
  // Assemble the bits most-significant byte first, whatever the file's byte order.
  std::uint64_t bits = 0;
  for (int k = 0; k < t.size; ++k) bits = (bits << 8) | p[t.big ? k : t.size - 1 - k];
  if (t.kind == 'f') {
    if (t.size == 4) return double(std::bit_cast<float>(std::uint32_t(bits)));
    return std::bit_cast<double>(bits);
  }
  if (t.kind == 'u') return double(bits);
  const int shift = 64 - 8 * t.size;  // sign-extend
  return double(std::int64_t(bits << shift) >> shift);
}

// Header text quoted in a message: at most 40 characters (the header may be 64 KiB).
std::string shortened(const std::string& v) {
  return v.size() <= 40 ? v : v.substr(0, 37) + "...";
}

}  // namespace

Loaded<Cloud> parseCloudNpy(std::string_view bytes, const std::string& file) {
  auto fail = [&](std::string field, std::string why) {
    return Loaded<Cloud>::fail(LoadError{file, 0, std::move(field), std::move(why)});
  };
  const auto* u = reinterpret_cast<const unsigned char*>(bytes.data());
  if (bytes.size() < 10 || std::memcmp(bytes.data(), "\x93NUMPY", 6) != 0)
    return fail("", "not a .npy file (missing the \\x93NUMPY magic)");
  const int major = u[6];
  if (major < 1 || major > 3)
    return fail("", "unsupported .npy format version " + std::to_string(major) + "." +
                        std::to_string(u[7]));
  std::size_t headerLen = 0, offset = 0;
  if (major == 1) {
    headerLen = std::size_t(u[8]) | std::size_t(u[9]) << 8;
    offset = 10;
  } else {
    if (bytes.size() < 12) return fail("", "file truncated inside the header length");
    headerLen = std::size_t(u[8]) | std::size_t(u[9]) << 8 | std::size_t(u[10]) << 16 |
                std::size_t(u[11]) << 24;
    offset = 12;
  }
  if (headerLen > kMaxHeader)
    return fail("header", "header length " + std::to_string(headerLen) + " bytes exceeds the " +
                              std::to_string(kMaxHeader) + "-byte limit");
  if (offset + headerLen > bytes.size())
    return fail("header", "file truncated inside the header");
  const std::string header(bytes.substr(offset, headerLen));
  offset += headerLen;

  const auto descr = dictValue(header, "descr");
  if (!descr) return fail("descr", "missing from the header");
  const auto dtype = parseDescr(*descr);
  if (!dtype)
    return fail("descr", "dtype '" + shortened(*descr) + "' is not supported (use float32, float64 or an integer type)");
  const auto fortran = dictValue(header, "fortran_order");
  if (!fortran || (*fortran != "False" && *fortran != "True"))
    return fail("fortran_order", "missing or not True/False");
  const auto shape = dictValue(header, "shape");
  if (!shape) return fail("shape", "missing from the header");
  // dictValue returns a tuple with its parentheses; anything else ("", "5") is no shape.
  if (shape->size() < 2 || shape->front() != '(' || shape->back() != ')')
    return fail("shape", "'" + shortened(*shape) + "' is not a tuple such as (n, 2)");
  std::vector<long long> dims;
  {
    std::string s = shape->substr(1, shape->size() - 2);
    std::size_t p = 0;
    while (p < s.size()) {
      while (p < s.size() && (s[p] == ' ' || s[p] == ',')) ++p;
      if (p >= s.size()) break;
      std::size_t e = p;
      while (e < s.size() && s[e] != ',') ++e;
      std::string tok = s.substr(p, e - p);
      while (!tok.empty() && (tok.back() == ' ' || tok.back() == 'L')) tok.pop_back();
      try {
        std::size_t used = 0;
        dims.push_back(std::stoll(tok, &used));
        if (used != tok.size()) throw std::invalid_argument(tok);
      } catch (...) {
        return fail("shape", "'" + shortened(*shape) + "' is not a tuple of whole numbers");
      }
      p = e;
    }
  }
  if (dims.size() != 2 || (dims[1] != 2 && dims[1] != 3) || dims[0] < 0)
    return fail("shape", "shape " + shortened(*shape) + " is not (n, 2) or (n, 3)");
  const auto n = std::size_t(dims[0]);
  const auto cols = std::size_t(dims[1]);
  if (n == 0) return fail("shape", "the array has no rows, so the cloud would be empty");
  // Compare the claimed row count with the rows the data part can hold before multiplying
  // (n * cols * size wraps around for n near 2^60) and before allocating anything for n.
  const std::size_t rowBytes = cols * std::size_t(dtype->size);
  const std::size_t present = bytes.size() - offset;
  if (n > present / rowBytes)
    return fail("data", "file truncated: the shape claims " + std::to_string(n) + " rows of " +
                            std::to_string(rowBytes) + " bytes, " + std::to_string(present) +
                            " data bytes present");

  const bool isFortran = *fortran == "True";
  // float64 in this machine's byte order (what NumPy writes by default): a plain copy.
  const bool nativeDouble = dtype->kind == 'f' && dtype->size == 8 &&
                            dtype->big == (std::endian::native == std::endian::big);
  auto at = [&](std::size_t row, std::size_t col) {
    const std::size_t k = isFortran ? col * n + row : row * cols + col;
    const unsigned char* p = u + offset + k * std::size_t(dtype->size);
    if (nativeDouble) {
      double d;
      std::memcpy(&d, p, sizeof d);
      return d;
    }
    return readValue(p, *dtype);
  };
  Cloud c;
  c.name = fileStem(file);
  c.points.resize(Eigen::Index(n), 2);
  c.weights.resize(Eigen::Index(n));
  prefaultForWrite(c.points.data(), n * 2 * sizeof(double));
  prefaultForWrite(c.weights.data(), n * sizeof(double));
  static const char* names[3] = {"x", "y", "w"};
  // Checked row by row in file order, so the message names the first bad value; the message
  // text is only built for it.
  for (std::size_t r = 0; r < n; ++r) {
    for (std::size_t col = 0; col < cols; ++col) {
      const double v = at(r, col);
      if (!std::isfinite(v) || (col == 2 && v < 0)) {
        const std::string where = "row " + std::to_string(r + 1) + ", column " + names[col];
        if (std::isnan(v)) return fail(where, "value is NaN");
        if (std::isinf(v)) return fail(where, "value is infinite");
        return fail(where, "weight is negative");
      }
      if (col < 2) c.points(Eigen::Index(r), Eigen::Index(col)) = v;
      else c.weights(Eigen::Index(r)) = v;
    }
    if (cols == 2) c.weights(Eigen::Index(r)) = 1.0 / double(n);
  }
  if (!(c.weights.sum() > 0)) return fail("data", "all weights are zero, so the cloud has no mass");
  return Loaded<Cloud>::success(std::move(c));
}

Loaded<Cloud> readCloudNpy(const std::string& path) {
  std::string why;
  const auto block = FileBlock::read(path, &why);
  if (!block) return Loaded<Cloud>::fail(LoadError{path, 0, "", "cannot open: " + why});
  return parseCloudNpy(block->text(), path);
}

std::string formatCloudNpy(const Cloud& c) {
  std::string dict = "{'descr': '<f8', 'fortran_order': False, 'shape': (" +
                     std::to_string(c.size()) + ", 3), }";
  // Pad with spaces so that magic + length + dict + '\n' is a multiple of 64 bytes.
  const std::size_t total = 10 + dict.size() + 1;
  dict.append((64 - total % 64) % 64, ' ');
  dict += '\n';
  std::string out("\x93NUMPY\x01\x00", 8);
  out += char(dict.size() & 0xff);
  out += char((dict.size() >> 8) & 0xff);
  out += dict;
  for (Eigen::Index i = 0; i < c.size(); ++i) {
    const double row[3] = {c.points(i, 0), c.points(i, 1), c.weights(i)};
    for (double v : row) {
      unsigned char b[8];
      std::memcpy(b, &v, 8);
      if (std::endian::native == std::endian::big) std::reverse(b, b + 8);
      out.append(reinterpret_cast<const char*>(b), 8);
    }
  }
  return out;
}

std::optional<std::string> writeCloudNpy(const std::string& path, const Cloud& c) {
  return atomicWriteFile(path, formatCloudNpy(c));
}

}  // namespace barrow
