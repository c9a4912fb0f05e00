// The --set group.key=value parser and the parameter checks behind it (the same steps as
// barrow-cli's parseSets): one assignment per input line. Whatever is accepted must then be
// readable by the typed accessors the measures use, without an exception.
#include <algorithm>
#include <cstddef>
#include <cstdint>
#include <sstream>
#include <string>

#include "fuzz_check.h"
#include "measures/evaluate.h"
#include "measures/registry.h"

using namespace barrow;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  static const auto specs = MeasureRegistry::instance().allParams();
  std::istringstream in(std::string(reinterpret_cast<const char*>(data), size));
  ParamSet set;
  std::string line;
  while (std::getline(in, line))
    if (set.assign(line)) return 0;
  for (const auto& entry : set.values()) {
    const std::string& key = entry.first;  // not a structured binding: clang 14 cannot capture one
    const auto it = std::find_if(specs.begin(), specs.end(), [&](const ParamSpec& p) { return p.key == key; });
    if (it == specs.end() || checkParam(*it, entry.second)) return 0;
  }
  for (const Measure* m : MeasureRegistry::instance().all()) {
    std::string error;
    const ParamSet r = resolveParams(*m, set, &error);
    FUZZ_CHECK(error.empty(), "accepted set rejected by %s: %s", m->id().c_str(), error.c_str());
    for (const ParamSpec& p : m->params()) {
      const std::string& v = r.text(p.key);
      if (std::find(p.choices.begin(), p.choices.end(), v) != p.choices.end()) continue;  // a word ("median")
      try {
        switch (p.kind) {
          case ParamKind::Real: (void)r.real(p.key); break;
          case ParamKind::Integer: (void)r.integer(p.key); break;
          case ParamKind::Boolean: (void)r.boolean(p.key); break;
          case ParamKind::Choice: (void)r.text(p.key); break;
          case ParamKind::RealPair: (void)r.pair(p.key); break;
        }
      } catch (const std::exception& e) {
        FUZZ_CHECK(false, "accepted %s=%s unreadable: %s", p.key.c_str(), r.text(p.key).c_str(), e.what());
      }
    }
  }
  return 0;
}
