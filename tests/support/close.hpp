// check_close: passes when |actual - expected| <= max(rel * |expected|, abs). On failure it prints both
// values with 17 digits, the difference and the two thresholds. Use it instead of doctest::Approx,
// whose default epsilon (1.2e-5 relative, scale 1) would accept any mas-scale angle in radians as 0.
#pragma once

#include <doctest/doctest.h>

#include <cmath>
#include <cstdio>
#include <string>

namespace siiplan::test {

inline bool check_close(double actual, double expected, double rel, double abs, const std::string& what = "") {
  double diff = std::fabs(actual - expected);
  bool ok = diff <= std::max(rel * std::fabs(expected), abs) || (actual == expected);
  char buf[512];
  std::snprintf(buf, sizeof buf, "%s: actual %.17g expected %.17g |diff| %.3g (rel tol %.3g, abs tol %.3g)",
                what.c_str(), actual, expected, diff, rel, abs);
  INFO(buf);
  CHECK(ok);
  return ok;
}

}  // namespace siiplan::test
