#include "src/check/winding_conventions.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <string>
#include <string_view>

#include "src/units/constants.h"

namespace coilspin::check {
namespace {

// A factor √2^p·√3^q, kept as the exponents so that factors compare exactly and
// print as symbols. √2 is a sinusoid's peak over rms, √3 a star winding's
// line-to-line over phase voltage (src/units/constants.h); 3/2 = √3²/√2².
struct RootFactor {
  int sqrt2_power = 0;
  int sqrt3_power = 0;
};

constexpr int kSquareOfSqrt2 = 2;  // (√2)²: the radicand printed for √2
constexpr int kSquareOfSqrt3 = 3;  // (√3)²: the radicand printed for √3

RootFactor Over(RootFactor a, RootFactor b) { return {a.sqrt2_power - b.sqrt2_power, a.sqrt3_power - b.sqrt3_power}; }
RootFactor Inverse(RootFactor a) { return {-a.sqrt2_power, -a.sqrt3_power}; }
bool IsOne(RootFactor a) { return a.sqrt2_power == 0 && a.sqrt3_power == 0; }
bool operator==(RootFactor a, RootFactor b) {
  return a.sqrt2_power == b.sqrt2_power && a.sqrt3_power == b.sqrt3_power;
}

double ValueOf(RootFactor a) {
  return std::pow(units::kSinusoidPeakOverRms, a.sqrt2_power) *
         std::pow(units::kStarLineOverPhaseVoltage, a.sqrt3_power);
}

int IntegerPower(int base, int exponent) {
  int value = 1;
  for (int i = 0; i < exponent; ++i) value *= base;
  return value;
}

// One side of a fraction from non-negative exponents: "1", "3", "√2", "2√3", ...
struct Side {
  int whole = 1;
  int radicand = 1;
  std::string Text() const {
    if (radicand == 1) return std::to_string(whole);
    return (whole == 1 ? "" : std::to_string(whole)) + "\u221a" + std::to_string(radicand);
  }
};

Side SideOf(int sqrt2_power, int sqrt3_power) {
  return {IntegerPower(kSquareOfSqrt2, sqrt2_power / 2) * IntegerPower(kSquareOfSqrt3, sqrt3_power / 2),
          IntegerPower(kSquareOfSqrt2, sqrt2_power % 2) * IntegerPower(kSquareOfSqrt3, sqrt3_power % 2)};
}

// "√3", "1/√3", "3/2", "√(3/2)".
std::string Symbol(RootFactor a) {
  const Side top = SideOf(std::max(a.sqrt2_power, 0), std::max(a.sqrt3_power, 0));
  const Side bottom = SideOf(std::max(-a.sqrt2_power, 0), std::max(-a.sqrt3_power, 0));
  if (bottom.whole == 1 && bottom.radicand == 1) return top.Text();
  if (top.whole == 1 && bottom.whole == 1 && top.radicand > 1 && bottom.radicand > 1) {
    return "\u221a(" + std::to_string(top.radicand) + "/" + std::to_string(bottom.radicand) + ")";
  }
  return top.Text() + "/" + bottom.Text();
}

// "k_ph", "√3·k_ph", "(3/2)·k_ph", "k_ph/√2".
std::string TimesPhaseConstant(RootFactor a) {
  if (IsOne(a)) return "k_ph";
  const std::string symbol = Symbol(a);
  if (symbol.rfind("1/", 0) == 0) return "k_ph/" + symbol.substr(2);
  const bool has_slash = symbol.find('/') != std::string::npos && symbol.find('(') == std::string::npos;
  return (has_slash ? "(" + symbol + ")" : symbol) + "\u00b7k_ph";
}

struct Convention {
  std::string_view words;
  RootFactor times_phase_constant;  // the quoted constant over k_ph (table in the header)
};

// The Kt conventions of winding_conventions.h, as multiples of k_ph.
constexpr std::array<Convention, 4> kTorqueConventions = {{
    {"per phase", {0, 0}},
    {"per phase per ampere rms", {-1, 0}},
    {"for the whole machine per ampere peak", {-2, 2}},
    {"for the whole machine per ampere rms", {-1, 2}},
}};

// The Ke conventions of winding_conventions.h, as multiples of k_ph.
constexpr std::array<Convention, 4> kBackEmfConventions = {{
    {"per phase in peak volts", {0, 0}},
    {"per phase in rms volts", {-1, 0}},
    {"line-to-line in peak volts", {0, 1}},
    {"line-to-line in rms volts", {-1, 1}},
}};

struct Group {
  RootFactor kt_over_ke;
  std::vector<std::string> pairs;
};

std::string Joined(const std::vector<std::string>& parts) {
  std::string text;
  for (const std::string& part : parts) text += (text.empty() ? "" : "; or ") + part;
  return text;
}

std::string LargerText(RootFactor kt_over_ke) {
  const bool kt_larger = ValueOf(kt_over_ke) > 1.0;
  const RootFactor magnitude = kt_larger ? kt_over_ke : Inverse(kt_over_ke);
  return "factor " + Symbol(magnitude) + (kt_larger ? ", Kt the larger" : ", Ke the larger");
}

std::vector<MismatchFactor> Build() {
  std::vector<Group> groups;
  for (const Convention& kt : kTorqueConventions) {
    for (const Convention& ke : kBackEmfConventions) {
      const RootFactor ratio = Over(kt.times_phase_constant, ke.times_phase_constant);
      if (IsOne(ratio)) continue;  // a consistent pair
      const std::string pair = "Ke quoted " + std::string(ke.words) + " (" +
                               TimesPhaseConstant(ke.times_phase_constant) + ") while Kt is " +
                               std::string(kt.words) + " (" + TimesPhaseConstant(kt.times_phase_constant) + ")";
      auto group = std::find_if(groups.begin(), groups.end(), [ratio](const Group& g) { return g.kt_over_ke == ratio; });
      if (group == groups.end()) {
        groups.push_back({ratio, {pair}});
      } else {
        group->pairs.push_back(pair);
      }
    }
  }
  std::vector<MismatchFactor> factors;
  for (const Group& g : groups) {
    factors.push_back({MismatchKind::kWindingConvention, ValueOf(g.kt_over_ke), Symbol(g.kt_over_ke),
                       Joined(g.pairs) + ": " + LargerText(g.kt_over_ke)});
  }
  for (const Group& g : groups) {
    const RootFactor reverse = Inverse(g.kt_over_ke);
    const bool produced = std::any_of(groups.begin(), groups.end(), [reverse](const Group& other) {
      return other.kt_over_ke == reverse;
    });
    if (produced) continue;
    factors.push_back({MismatchKind::kWindingConvention, ValueOf(reverse), Symbol(reverse),
                       "the reverse of " + Joined(g.pairs) +
                           "; no usual pair of conventions gives this, so Kt and Ke may carry each other's "
                           "conventions: " + LargerText(reverse)});
  }
  return factors;
}

}  // namespace

const std::vector<MismatchFactor>& WindingConventionFactors() {
  static const std::vector<MismatchFactor> factors = Build();
  return factors;
}

}  // namespace coilspin::check
