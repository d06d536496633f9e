#include "src/verify/sheet_consistency.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>
#include <optional>

#include "src/check/unit_slips.h"
#include "src/check/winding_conventions.h"
#include "src/units/constants.h"
#include "src/units/datasheet_units.h"
#include "src/verify/sheet_relations.h"

namespace coilspin::verify {
namespace {

// Two factors or voltages closer than this are the same (rounding of their products).
constexpr double kSameRelative = 1e-9;
constexpr double kDecimalBase = 10.0;

bool Same(double a, double b) { return std::fabs(a - b) <= kSameRelative * std::max(std::fabs(a), std::fabs(b)); }

// The sheet's figures as the relations see them, possibly with one line corrected.
struct Figures {
  LineValues nominal;                     // SI; a one-sided line's limit, a two-sided one's middle without nominal
  std::map<std::string, Band> bands;
  std::map<std::string, double> printed_for_V;  // a line taken as printed for another voltage
};

double Reference(const SpecLine& line) {
  if (line.nominal) return *line.nominal;
  if (line.band.HasLow() && line.band.HasHigh()) return 0.5 * (line.band.low + line.band.high);
  return line.band.HasLow() ? line.band.low : line.band.high;
}

Figures FiguresOf(const Datasheet& sheet) {
  Figures f;
  for (const SpecLine& line : sheet.lines) {
    f.nominal[line.key] = Reference(line);
    f.bands[line.key] = line.band;
  }
  return f;
}

struct Evaluated {
  double predicted, low, high, stated, mismatch;
  bool consistent;
};

// The relation over the box of its inputs' bands; nothing when an input's band is open.
std::optional<Evaluated> Evaluate(const Relation& r, const Figures& f, double rated_V) {
  for (const std::string& input : r.inputs) {
    const Band& b = f.bands.at(input);
    if (!b.HasLow() || !b.HasHigh()) return std::nullopt;
  }
  const auto voltage = f.printed_for_V.find(r.stated);
  const double v = r.uses_voltage && voltage != f.printed_for_V.end() ? voltage->second : rated_V;
  Evaluated e{};
  e.predicted = r.predict(f.nominal, v);
  e.low = std::numeric_limits<double>::infinity();
  e.high = -std::numeric_limits<double>::infinity();
  const std::size_t corners = std::size_t{1} << r.inputs.size();
  for (std::size_t corner = 0; corner < corners; ++corner) {
    LineValues at = f.nominal;
    for (std::size_t k = 0; k < r.inputs.size(); ++k) {
      const Band& b = f.bands.at(r.inputs[k]);
      at[r.inputs[k]] = (corner >> k) & 1u ? b.high : b.low;
    }
    const double y = r.predict(at, v);
    if (!std::isfinite(y)) continue;
    e.low = std::min(e.low, y);
    e.high = std::max(e.high, y);
  }
  if (!std::isfinite(e.predicted) || e.low > e.high) return std::nullopt;
  const Band& stated = f.bands.at(r.stated);
  e.stated = f.nominal.at(r.stated);
  e.mismatch = e.stated / e.predicted - 1.0;
  e.consistent = e.high >= stated.low && e.low <= stated.high;
  return e;
}

bool Involves(const Relation& r, const std::string& key) {
  return r.stated == key || std::find(r.inputs.begin(), r.inputs.end(), key) != r.inputs.end();
}

struct Correction {
  double multiplier = 1.0;            // the line's figures are multiplied by it
  std::optional<double> voltage_V;    // or the line is taken as printed for this voltage
  Explanation explanation;
};

Figures Apply(const Figures& f, const std::string& key, const Correction& c) {
  Figures out = f;
  if (c.voltage_V) {
    out.printed_for_V[key] = *c.voltage_V;
    return out;
  }
  out.nominal[key] *= c.multiplier;
  Band& b = out.bands[key];
  b.low *= c.multiplier;   // multiplier > 0: the order of the limits is kept; ±∞ stays
  b.high *= c.multiplier;
  return out;
}

bool IsMotorConstant(const std::string& key) {
  return key == "torque_constant" || key == "back_emf_constant" || key == "speed_constant" ||
         key == "speed_constant_si";
}

std::vector<Correction> CandidatesFor(const SpecLine& line, const std::vector<Relation>& relations, double rated_V) {
  std::vector<Correction> out;
  Explanation base;
  base.line = line.key;
  base.written_unit = line.unit;
  std::vector<units::CompoundUnitFactor> same_kind;
  for (const units::DatasheetUnit& u : units::DistinctDatasheetUnits(line.spec->dimension))
    same_kind.push_back({u.spelling, u.factor_to_si});
  std::vector<double> slip_factors;
  for (const check::FigureSlip& slip : check::FigureUnitSlips(line.unit_factor_to_si, same_kind)) {
    Correction c{1.0 / slip.read_over_meant, std::nullopt, base};
    c.explanation.cause = Explanation::Cause::kUnitSlip;
    c.explanation.printed_over_meant = slip.read_over_meant;
    c.explanation.meant_unit = slip.meant_unit;
    slip_factors.push_back(slip.read_over_meant);
    out.push_back(c);
  }
  for (int exponent : check::DecimalSlipExponents()) {
    const double factor = std::pow(kDecimalBase, exponent);
    if (std::any_of(slip_factors.begin(), slip_factors.end(), [factor](double s) { return Same(s, factor); }))
      continue;  // the same factor as a unit slip, which says more
    Correction c{1.0 / factor, std::nullopt, base};
    c.explanation.cause = Explanation::Cause::kDecimalSlip;
    c.explanation.printed_over_meant = factor;
    c.explanation.decimal_exponent = exponent;
    out.push_back(c);
  }
  if (IsMotorConstant(line.key)) {
    // A pair of conventions giving Kt/Ke = f prints Kt f times, Ke (and so 1/Kv) 1/f times, too large.
    const bool ke_line = line.key == "back_emf_constant";
    for (const check::MismatchFactor& factor : check::WindingConventionFactors()) {
      Correction c{ke_line ? factor.kt_over_ke : 1.0 / factor.kt_over_ke, std::nullopt, base};
      c.explanation.cause = Explanation::Cause::kWindingConvention;
      c.explanation.printed_over_meant = 1.0 / c.multiplier;
      c.explanation.convention = factor;
      out.push_back(c);
    }
  }
  const bool depends_on_voltage = std::any_of(relations.begin(), relations.end(), [&](const Relation& r) {
    return r.stated == line.key && r.uses_voltage;
  });
  if (depends_on_voltage) {
    for (double v : units::kCommonRatedVoltages_V) {
      if (Same(v, rated_V)) continue;
      Correction c{1.0, v, base};
      c.explanation.cause = Explanation::Cause::kAnotherVoltage;
      c.explanation.voltage_V = v;
      out.push_back(c);
    }
  }
  return out;
}

// Every checkable relation that `key` takes part in is consistent under `f`.
bool AllConsistent(const std::vector<Relation>& relations, const std::string& key, const Figures& f, double rated_V) {
  for (const Relation& r : relations) {
    if (!Involves(r, key)) continue;
    const std::optional<Evaluated> e = Evaluate(r, f, rated_V);
    if (e && !e->consistent) return false;
  }
  return true;
}

// How many of the sheet's inconsistent relations are consistent under `f`.
int Mended(const std::vector<Relation>& relations, const std::vector<bool>& inconsistent, const Figures& f,
           double rated_V) {
  int mended = 0;
  for (std::size_t k = 0; k < relations.size(); ++k) {
    if (!inconsistent[k]) continue;
    const std::optional<Evaluated> e = Evaluate(relations[k], f, rated_V);
    if (e && e->consistent) ++mended;
  }
  return mended;
}

std::vector<Explanation> Explain(const Relation& target, const std::vector<Relation>& relations,
                                 const std::vector<bool>& inconsistent, const Datasheet& sheet,
                                 const Figures& figures) {
  struct Found {
    int mended;       // inconsistent relations of the sheet it mends (more is the better explanation)
    double distance;  // |ln(y/f)| of the target relation after it (nearer is better)
    Explanation explanation;
  };
  std::vector<Found> found;
  std::vector<std::string> lines = {target.stated};
  lines.insert(lines.end(), target.inputs.begin(), target.inputs.end());
  for (const std::string& key : lines) {
    for (const Correction& c : CandidatesFor(*sheet.Find(key), relations, sheet.rated_voltage_V)) {
      const Figures corrected = Apply(figures, key, c);
      if (!AllConsistent(relations, key, corrected, sheet.rated_voltage_V)) continue;
      const std::optional<Evaluated> e = Evaluate(target, corrected, sheet.rated_voltage_V);
      found.push_back({Mended(relations, inconsistent, corrected, sheet.rated_voltage_V),
                       e ? std::fabs(std::log(e->stated / e->predicted)) : 0.0, c.explanation});
    }
  }
  if (found.empty()) return {};
  // Only the corrections that mend the most of the sheet: one line that explains two
  // mismatches is a better account than another that explains one of them.
  const int most = std::max_element(found.begin(), found.end(), [](const Found& a, const Found& b) {
                     return a.mended < b.mended;
                   })->mended;
  found.erase(std::remove_if(found.begin(), found.end(), [most](const Found& f) { return f.mended < most; }),
              found.end());
  const int all = static_cast<int>(std::count(inconsistent.begin(), inconsistent.end(), true));
  for (Found& f : found) f.explanation.whole_sheet = f.mended == all;
  std::stable_sort(found.begin(), found.end(), [](const Found& a, const Found& b) { return a.distance < b.distance; });
  std::vector<Explanation> out;
  for (const Found& f : found) out.push_back(f.explanation);
  return out;
}

}  // namespace

std::string CauseName(Explanation::Cause cause) {
  switch (cause) {
    case Explanation::Cause::kUnitSlip:
      return "unit-slip";
    case Explanation::Cause::kDecimalSlip:
      return "decimal-slip";
    case Explanation::Cause::kWindingConvention:
      return "winding-convention";
    case Explanation::Cause::kAnotherVoltage:
      break;
  }
  return "another-voltage";
}

std::vector<RelationCheck> CheckSheet(const Datasheet& sheet) {
  std::vector<std::string> present;
  for (const SpecLine& line : sheet.lines) present.push_back(line.key);
  const std::vector<Relation> relations = RelationsFor(present);
  const Figures figures = FiguresOf(sheet);
  std::vector<bool> inconsistent;
  for (const Relation& r : relations) {
    const std::optional<Evaluated> e = Evaluate(r, figures, sheet.rated_voltage_V);
    inconsistent.push_back(e && !e->consistent);
  }
  std::vector<RelationCheck> checks;
  for (const Relation& r : relations) {
    const std::optional<Evaluated> e = Evaluate(r, figures, sheet.rated_voltage_V);
    if (!e) continue;
    RelationCheck c;
    c.relation = r.formula;
    c.lines = {r.stated};
    c.lines.insert(c.lines.end(), r.inputs.begin(), r.inputs.end());
    c.stated = e->stated;
    c.predicted = e->predicted;
    c.predicted_low = e->low;
    c.predicted_high = e->high;
    c.mismatch = e->mismatch;
    c.consistent = e->consistent;
    if (!c.consistent) c.explained_by = Explain(r, relations, inconsistent, sheet, figures);
    checks.push_back(std::move(c));
  }
  return checks;
}

}  // namespace coilspin::verify
