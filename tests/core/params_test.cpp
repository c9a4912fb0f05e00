// Parameter specs and key=value sets (the --set / session / GUI editor contract).
#include <gtest/gtest.h>

#include "base/params.h"

namespace barrow {
namespace {

ParamSpec epsilon() {
  ParamSpec s;
  s.key = "sinkhorn.epsilon";
  s.defaultValue = "0.05";
  s.min = 0;
  s.minExclusive = true;
  return s;
}

TEST(ParamsTest, AcceptsNumberInRange) { EXPECT_FALSE(checkParam(epsilon(), "0.01")); }

TEST(ParamsTest, RejectsZeroWhenExclusive) {
  const auto e = checkParam(epsilon(), "0");
  ASSERT_TRUE(e);
  EXPECT_NE(e->find("sinkhorn.epsilon"), std::string::npos);
}

TEST(ParamsTest, RejectsTextAndNan) {
  EXPECT_TRUE(checkParam(epsilon(), "abc"));
  EXPECT_TRUE(checkParam(epsilon(), "nan"));
  EXPECT_TRUE(checkParam(epsilon(), "0.1x"));
}

TEST(ParamsTest, WordsAreAcceptedInPlaceOfNumbers) {
  ParamSpec s;
  s.key = "mmd.sigma";
  s.choices = {"median"};
  s.min = 0;
  s.minExclusive = true;
  EXPECT_FALSE(checkParam(s, "median"));
  EXPECT_FALSE(checkParam(s, "0.3"));
  EXPECT_TRUE(checkParam(s, "mean"));
}

TEST(ParamsTest, PairTakesOneOrTwoNumbers) {
  ParamSpec s;
  s.key = "density.bandwidth";
  s.kind = ParamKind::RealPair;
  s.min = 0;
  s.minExclusive = true;
  EXPECT_FALSE(checkParam(s, "0.1"));
  EXPECT_FALSE(checkParam(s, "0.1,0.2"));
  EXPECT_TRUE(checkParam(s, "0.1,0.2,0.3"));
  ParamSet p;
  p.set("density.bandwidth", "0.1,0.2");
  EXPECT_DOUBLE_EQ(p.pair("density.bandwidth").second, 0.2);
  p.set("density.bandwidth", "0.3");
  EXPECT_DOUBLE_EQ(p.pair("density.bandwidth").second, 0.3);
}

TEST(ParamsTest, IntegerAndChoiceAndBoolean) {
  ParamSpec k;
  k.key = "sliced.directions";
  k.kind = ParamKind::Integer;
  k.min = 1;
  EXPECT_TRUE(checkParam(k, "2.5"));
  EXPECT_FALSE(checkParam(k, "16"));
  ParamSpec c;
  c.key = "density.estimator";
  c.kind = ParamKind::Choice;
  c.choices = {"hist", "kde", "knn"};
  EXPECT_FALSE(checkParam(c, "kde"));
  EXPECT_TRUE(checkParam(c, "histogram"));
  ParamSpec b;
  b.key = "chamfer.squared";
  b.kind = ParamKind::Boolean;
  EXPECT_TRUE(checkParam(b, "yes"));
}

TEST(ParamsTest, AssignParsesGroupKeyValue) {
  ParamSet p;
  EXPECT_FALSE(p.assign("sinkhorn.epsilon=0.01"));
  EXPECT_DOUBLE_EQ(p.real("sinkhorn.epsilon"), 0.01);
  EXPECT_TRUE(p.assign("epsilon=0.01"));
  EXPECT_TRUE(p.assign("sinkhorn.epsilon"));
}

TEST(ParamsTest, ResolvedFillsDefaultsAndReportsFirstError) {
  ParamSet p;
  std::string err;
  auto r = p.resolved({epsilon()}, &err);
  EXPECT_TRUE(err.empty());
  EXPECT_EQ(r.text("sinkhorn.epsilon"), "0.05");
  p.set("sinkhorn.epsilon", "-1");
  r = p.resolved({epsilon()}, &err);
  EXPECT_FALSE(err.empty());
}

// Frozen numbers are written so that reading them back gives the same double (the sweep
// replays them; common practice for round-trip text, std::to_chars shortest form).
TEST(ParamsTest, NumbersAndPairsReadBackBitForBit) {
  ParamSet p;
  for (double v : {0.1, 1.0 / 3.0, 0.015624009898307622, 1e-300, 6.02214076e23}) {
    p.setNumber("g.x", v);
    EXPECT_EQ(p.real("g.x"), v) << p.text("g.x");
  }
  p.setPair("g.xy", 1.0 / 3.0, -2.0 / 7.0);
  EXPECT_EQ(p.pair("g.xy"), std::make_pair(1.0 / 3.0, -2.0 / 7.0)) << p.text("g.xy");
  p.setNumber("g.x", 0.25);
  EXPECT_EQ(p.text("g.x"), "0.25");  // shortest form, not 17 digits
}

}  // namespace
}  // namespace barrow
