#include "cli/measures_help.h"

#include <set>

#include "base/param_text.h"
#include "measures/registry.h"

namespace barrow::cli {

std::string measuresHelp() {
  std::string out = "Measures (id, name, formula, the unit of the value and why; then their --set parameters: key = default, valid values, unit: meaning).\n"
                    "Units: 'length' is the unit of the coordinates in the files, 'length^2' its square; nats are natural-log units.\n"
                    "Parameters shared by several measures (e.g. density.*) are listed once, with the first measure using them.\n";
  std::set<std::string> listed;  // parameter keys already shown
  for (const Measure* m : MeasureRegistry::instance().all()) {
    out += "\n  " + m->id() + std::string(m->id().size() < 10 ? 10 - m->id().size() : 1, ' ') + m->displayName() +
           (m->cheap() ? "" : "  (slow: updates after the others in the GUI)") +
           (m->inDefaultSet() ? "" : "  (not in the default set: name it in --measures)") + "\n";
    out += "            " + m->formula() + "\n";
    out += "            unit: " + m->unitRule() + "\n";
    std::set<std::string> pointed;  // groups of this measure already shown above
    for (const ParamSpec& p : m->params()) {
      if (!listed.insert(p.key).second) {
        const std::string group = p.key.substr(0, p.key.find('.'));
        if (pointed.insert(group).second) out += "            " + group + ".* as above\n";
        continue;
      }
      out += "            " + p.key + " = " + p.defaultValue + ", valid " + rangeShort(p);
      if (!p.unit.empty()) out += ", in " + p.unit;
      if (!p.help.empty()) out += ": " + p.help;
      out += "\n";
    }
  }
  return out;
}

}  // namespace barrow::cli
