// Result details as readable key=value items (common practice for a human-readable dump; the
// expected strings are written out by hand).
#include <gtest/gtest.h>

#include "measures/details_text.h"

namespace barrow {
namespace {

TEST(DetailsTextTest, NestedKeysShortNumbersAndArrays) {
  const nlohmann::json d = {{"duality_gap", -1.1102230246251565e-15},
                            {"pivots", 1851},
                            {"plan_unique", true},
                            {"solver", "network-simplex"},
                            {"points_used", {{"a", 300}, {"b", 300}}},
                            {"mean", {0.0018907141112192254, 0.04064712527795181}},
                            {"missing", nullptr}};
  const auto items = detailItems(d);
  const std::vector<std::string> expected = {"duality_gap=-1.11022e-15", "mean=0.00189071,0.0406471", "missing=none",
                                             "pivots=1851", "plan_unique=true", "points_used.a=300",
                                             "points_used.b=300", "solver=network-simplex"};
  EXPECT_EQ(items, expected);
}

TEST(DetailsTextTest, LinesRespectTheWidthExceptForOneLongItem) {
  const nlohmann::json d = {{"a", 1}, {"b", 2}, {"c", std::string(30, 'x')}};
  EXPECT_EQ(detailLines(d, 12), (std::vector<std::string>{"a=1; b=2", "c=" + std::string(30, 'x')}));
  EXPECT_TRUE(detailLines(nlohmann::json::object()).empty());
  EXPECT_TRUE(detailItems(nlohmann::json(3.0)).empty());  // not an object: nothing to list
}

}  // namespace
}  // namespace barrow
