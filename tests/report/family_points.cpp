// Test helper for the browser tests: prints A_θ as the engine's FamilyMap builds it, so the
// page's points can be checked against the core rather than against a second copy of the maps.
//   barrow_family_points A.csv B.csv family dx,dy|- cx,cy|- θ1 [θ2 ...]
// prints {"<θ>": {"points": [[x, y], ...], "weights": [...]}, ...} (JSON, full precision).
#include <cstdio>
#include <iostream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "families/family_map.h"
#include "families/family_spec.h"
#include "io/cloud_file.h"

namespace {

std::array<double, 2> pairOf(const std::string& s) {
  std::array<double, 2> p{};
  char comma = 0;
  std::istringstream in(s);
  in >> p[0] >> comma >> p[1];
  return p;
}

}  // namespace

int main(int argc, char** argv) {
  using namespace barrow;
  if (argc < 7) {
    std::fprintf(stderr, "usage: %s A B family dx,dy|- cx,cy|- theta...\n", argv[0]);
    return 2;
  }
  auto a = readCloudFile(argv[1]);
  auto b = readCloudFile(argv[2]);
  if (!a || !b) {
    std::fprintf(stderr, "%s\n", (!a ? a.error : b.error).text().c_str());
    return 2;
  }
  FamilySettings s;
  const FamilySpec* spec = findFamily(argv[3]);
  if (!spec) {
    std::fprintf(stderr, "unknown family '%s' (expected %s)\n", argv[3], familyChoices().c_str());
    return 2;
  }
  s.family = spec->family;
  if (std::string(argv[4]) != "-") s.direction = pairOf(argv[4]);
  if (std::string(argv[5]) != "-") s.center = pairOf(argv[5]);
  const FamilyMap map(*a.value, *b.value, s);
  if (map.error()) {
    std::fprintf(stderr, "%s\n", map.error()->c_str());
    return 2;
  }
  nlohmann::json out = nlohmann::json::object();
  for (int k = 6; k < argc; ++k) {
    const Cloud c = map.at(std::stod(argv[k]));
    nlohmann::json pts = nlohmann::json::array(), w = nlohmann::json::array();
    for (Eigen::Index i = 0; i < c.size(); ++i) {
      pts.push_back({c.points(i, 0), c.points(i, 1)});
      w.push_back(c.weights(i));
    }
    out[argv[k]] = {{"points", pts}, {"weights", w}};
  }
  std::cout << out.dump() << "\n";
  return 0;
}
