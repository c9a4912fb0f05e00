// The registry holds exactly the documented measures: deleting a registration line (or adding
// a measure without documenting it) fails here instead of quietly changing what users see.
#include <gtest/gtest.h>

#include <string>
#include <vector>

#include "measures/registry.h"

namespace barrow {
namespace {

// The measure ids of DEVELOPERS.md ("Measure conventions") and of `barrow-cli --help`, in their order.
// A new measure appends its id here, to designMeasureIds() in core/measures/registry.cpp and
// to the documents (DEVELOPERS.md, "Adding a measure").
const std::vector<std::string> kDocumentedIds = {
    "w1",      "w2",        "entropic", "sinkhorn", "sliced", "mmd", "energy",   "frechet",
    "chamfer", "hausdorff", "kl_ab",    "kl_ba",    "js",     "tv",  "hellinger",
};

std::vector<std::string> registeredIds() {
  std::vector<std::string> ids;
  for (const Measure* m : MeasureRegistry::instance().all()) ids.push_back(m->id());
  return ids;
}

// [CP] the documented list is the contract; the registry must match it id for id, in order:
// the default set is that list, and all() adds the opt-in critics after it (DEVELOPERS.md,
// Command-line contract).
TEST(RegistryTest, RegisteredIdsAreExactlyTheDocumentedOnesInOrder) {
  std::vector<std::string> defaults;
  for (const Measure* m : MeasureRegistry::instance().defaults()) defaults.push_back(m->id());
  EXPECT_EQ(defaults, kDocumentedIds);
  EXPECT_EQ(designMeasureIds(), kDocumentedIds);
  std::vector<std::string> all = kDocumentedIds;
  for (const char* id : {"critic_clip", "critic_gp", "critic_sn"}) all.push_back(id);
  EXPECT_EQ(registeredIds(), all);
}

TEST(RegistryTest, RankFollowsTheListedOrderAndUnknownIdsGoLast) {
  const auto& reg = MeasureRegistry::instance();
  for (std::size_t k = 0; k < reg.all().size(); ++k) EXPECT_EQ(reg.rank(reg.all()[k]->id()), k);
  EXPECT_EQ(reg.rank("no_such_measure"), reg.all().size());
  EXPECT_EQ(reg.find("no_such_measure"), nullptr);
}

}  // namespace
}  // namespace barrow
