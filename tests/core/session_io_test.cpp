// Session file: round trip, versioning, field-level errors, and atomic save.
#include <gtest/gtest.h>

#include <filesystem>

#include "io/session_io.h"
#include "scenario/demo_scenario.h"
#include "support/test_support.h"

namespace barrow {
namespace {

TEST(SessionIoTest, DemoSessionRoundTripsExactly) {
  Session s = demoSession();
  s.params.set("sinkhorn.epsilon", "0.01");
  s.selected = {"w1", "js"};
  s.sweep.center = std::array<double, 2>{0.5, -1.0 / 3.0};
  s.view["showPlan"] = true;
  const std::string path = test::tempPath("s.json");
  ASSERT_FALSE(writeSession(path, s));
  auto back = readSession(path);
  ASSERT_TRUE(back) << back.error.text();
  const Session& t = *back.value;
  EXPECT_EQ(t.a.points, s.a.points);
  EXPECT_EQ(t.a.weights, s.a.weights);
  EXPECT_EQ(t.b.points, s.b.points);
  EXPECT_EQ(t.a.name, s.a.name);
  EXPECT_EQ(t.params.values(), s.params.values());
  EXPECT_EQ(t.selected, s.selected);
  EXPECT_EQ(t.sweep.family, s.sweep.family);
  EXPECT_EQ(t.sweep.from, s.sweep.from);
  EXPECT_EQ(t.sweep.steps, s.sweep.steps);
  EXPECT_EQ(t.sweep.reference, s.sweep.reference);
  EXPECT_EQ(t.sweep.center, s.sweep.center);
  EXPECT_EQ(t.view, s.view);
  EXPECT_EQ(formatSession(t), formatSession(s));
}

TEST(SessionIoTest, InterruptedSaveLeavesPreviousSessionIntact) {
  const std::string path = test::tempPath("keep.json");
  Session s = demoSession();
  ASSERT_FALSE(writeSession(path, s));
  const std::string before = test::readText(path);
  Session changed = s;
  changed.a.points(0, 0) += 1.0;
  WriteFault fault{100};
  const auto err = writeSession(path, changed, &fault);
  ASSERT_TRUE(err);
  EXPECT_NE(err->find(path), std::string::npos);
  EXPECT_EQ(test::readText(path), before);
  // No temporary file is left beside it.
  const auto dir = std::filesystem::path(path).parent_path();
  for (const auto& e : std::filesystem::directory_iterator(dir))
    EXPECT_EQ(e.path().string().find(path + ".tmp"), std::string::npos) << e.path();
}

TEST(SessionIoTest, ErrorsNameFieldOrLine) {
  struct Case {
    std::string text;
    const char* expect;
  } cases[] = {
      {"{\n\"format\": \"barrow-session\",\n oops }", ":3: not valid JSON"},
      {"[]", "expected a JSON object"},
      {R"({"format":"other","version":1})", "field 'format'"},
      {R"({"format":"barrow-session","version":99,"clouds":{}})", "version 99 is not supported"},
      {R"({"format":"barrow-session","version":1})", "field 'clouds': missing"},
      {R"({"format":"barrow-session","version":1,"clouds":{"A":{"points":[[0,0]]}}})", "field 'clouds.B': missing"},
      {R"({"format":"barrow-session","version":1,"clouds":{"A":{"points":[[0,"x"]]},"B":{"points":[[1,1]]}}})",
       "field 'clouds.A.points[0][1]': expected a number"},
      {R"({"format":"barrow-session","version":1,"clouds":{"A":{"points":[[0,0]],"weights":[-1]},"B":{"points":[[1,1]]}}})",
       "weight is negative"},
      {R"({"format":"barrow-session","version":1,"clouds":{"A":{"points":[]},"B":{"points":[[1,1]]}}})", "empty"},
      {R"({"format":"barrow-session","version":1,"clouds":{"A":{"points":[[0,0]]},"B":{"points":[[1,1]]}},"sweep":{"family":"twist"}})",
       "unknown family 'twist'"},
  };
  for (const auto& c : cases) {
    auto r = parseSession(c.text, "s.json");
    ASSERT_FALSE(r) << c.text;
    EXPECT_NE(r.error.text().find(c.expect), std::string::npos) << r.error.text();
    EXPECT_EQ(r.error.text().rfind("s.json", 0), 0u);
  }
}

}  // namespace
}  // namespace barrow
