#include "src/cli/consistency_command.h"

#include <cmath>
#include <cstdio>
#include <nlohmann/json.hpp>
#include <ostream>
#include <stdexcept>

#include "src/check/kt_ke_consistency.h"
#include "src/cli/exit_codes.h"
#include "src/cli/output_path.h"
#include "src/ingest/input_error.h"
#include "src/output/atomic_file.h"
#include "src/units/compound_units.h"

namespace coilspin::cli {
namespace {

using units::ConstantKind;

// Exit status 1 (exit_codes.h): the check ran and its answer is "inconsistent".
constexpr ExitCode kInconsistent = kUndetermined;
constexpr int kShownDigits = 6;  // significant digits of the printed values

struct FlagInfo {
  const char* flag;
  ConstantKind kind;
  const char* examples;  // how a datasheet writes this kind
};

constexpr FlagInfo kTorqueFlag{"--kt", ConstantKind::kTorqueConstant, "2.2 oz*in/A or 15 mN*m/A"};
constexpr FlagInfo kBackEmfFlag{"--ke", ConstantKind::kBackEmfConstant, "1.6 V/krpm or 0.0167 V*s/rad"};
constexpr FlagInfo kSpeedFlag{"--kv", ConstantKind::kSpeedConstant, "850 rpm/V"};

[[noreturn]] void BadOption(const std::string& message) {
  throw InputError(InputErrorKind::kBadOption, "", 0, 0, message);
}

// Which flag takes a constant of `kind`, for the hint in a mismatch message.
const FlagInfo& FlagFor(ConstantKind kind) {
  if (kind == ConstantKind::kTorqueConstant) return kTorqueFlag;
  return kind == ConstantKind::kBackEmfConstant ? kBackEmfFlag : kSpeedFlag;
}

units::MotorConstant ParseFlag(const FlagInfo& info, const std::string& text) {
  const units::MotorConstantParse parsed = units::ParseMotorConstant(text);
  if (!parsed.constant) BadOption(std::string(info.flag) + ": " + parsed.error);
  const units::MotorConstant& constant = *parsed.constant;
  if (constant.kind != info.kind) {
    const FlagInfo& right = FlagFor(constant.kind);
    BadOption(std::string(info.flag) + " expects a " + std::string(units::ConstantKindName(info.kind)) +
              " such as " + info.examples + ", got '" + constant.unit + "' (a " +
              std::string(units::ConstantKindName(constant.kind)) + ", " +
              std::string(units::ConstantKindMeaning(constant.kind)) + "; give it with " + right.flag + ")");
  }
  if (!(constant.value > 0.0)) {
    BadOption(std::string(info.flag) + " expects a positive " + std::string(units::ConstantKindName(info.kind)) +
              ", got '" + constant.as_given + "'");
  }
  // In SI (and, for Kv, as Ke = 1/Kv) the figure must stay a positive finite double: 1e-308 rpm/V would
  // give Ke = inf, and the check would answer with infinities.
  const double si = constant.kind == ConstantKind::kTorqueConstant ? constant.value_si
                                                                   : units::BackEmfConstantOf_V_s_per_rad(constant);
  if (!(std::isfinite(constant.value_si) && constant.value_si > 0.0 && std::isfinite(si) && si > 0.0)) {
    BadOption(std::string(info.flag) + " '" + constant.as_given + "' is too " +
              (constant.value_si > 1.0 ? "large" : "small") + ": " +
              (constant.kind == ConstantKind::kSpeedConstant ? "Ke = 1/Kv" : "its value") + " in " +
              std::string(units::SiUnitOf(constant.kind == ConstantKind::kTorqueConstant
                                              ? ConstantKind::kTorqueConstant
                                              : ConstantKind::kBackEmfConstant)) +
              " is beyond the range of a double; check the figure and its unit");
  }
  return constant;
}

// Six significant digits, no trailing zeros.
std::string Shown(double value) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.*g", kShownDigits, value);
  return buffer;
}

nlohmann::ordered_json ConstantJson(double value_si, ConstantKind si_kind, const std::string& as_given) {
  return {{"value", value_si}, {"unit", std::string(units::SiUnitOf(si_kind))}, {"as_given", as_given}};
}

std::string ResultJson(const check::DatasheetKtKe& check, const units::MotorConstant& kt,
                       const units::MotorConstant& ke) {
  nlohmann::ordered_json j;
  j["format"] = "coilspin.consistency/1";
  j["kt"] = ConstantJson(check.torque_constant_N_m_per_A, ConstantKind::kTorqueConstant, kt.as_given);
  j["ke"] = ConstantJson(check.back_emf_constant_V_s_per_rad, ConstantKind::kBackEmfConstant, ke.as_given);
  j["kt_over_ke"] = check.kt_over_ke;
  j["tolerance"] = check.tolerance;
  j["verdict"] = check.verdict;
  j["explanation"] = check.explanation;
  if (check.cause) {
    j["cause"] = {{"kind", check::MismatchKindName(check.cause->factor.kind)},
                  {"name", check.cause->factor.name},
                  {"kt_over_ke", check.cause->factor.kt_over_ke}};
  }
  return j.dump(2) + "\n";
}

void PrintReport(const check::DatasheetKtKe& check, const units::MotorConstant& kt, const units::MotorConstant& ke,
                 std::ostream& out) {
  out << "torque constant    Kt = " << Shown(check.torque_constant_N_m_per_A) << " "
      << units::SiUnitOf(ConstantKind::kTorqueConstant) << "  (given as " << kt.as_given << ")\n";
  out << "back-EMF constant  Ke = " << Shown(check.back_emf_constant_V_s_per_rad) << " "
      << units::SiUnitOf(ConstantKind::kBackEmfConstant) << "  (given as ";
  if (ke.kind == ConstantKind::kSpeedConstant) out << "speed constant ";
  out << ke.as_given << (ke.kind == ConstantKind::kSpeedConstant ? "; Ke = 1/Kv in SI)\n" : ")\n");
  out << "Kt/Ke = " << Shown(check.kt_over_ke) << "  (in SI, 1 N*m/A = 1 V*s/rad)\n";
  out << "tolerance: 1 \u00b1 " << Shown(check.tolerance) << "\n";
  out << "verdict: " << check.verdict << "\n";
  out << check.explanation << "\n";
}

}  // namespace

void DeclareConsistencyOptions(CLI::App* c, ConsistencyArguments* a) {
  c->add_option("--kt", a->torque_constant, "Torque constant as the datasheet writes it, e.g. \"2.2 oz*in/A\"")
      ->required();
  c->add_option("--ke", a->back_emf_constant, "Back-EMF constant as the datasheet writes it, e.g. \"1.6 V/krpm\"");
  c->add_option("--kv", a->speed_constant,
                "Speed constant instead of --ke, e.g. \"850 rpm/V\" (Ke = 60/(2*pi*Kv) V*s/rad)");
  c->add_option("--tolerance", a->tolerance, "Kt/Ke counts as consistent within 1 +/- this (default 0.05)");
  c->add_option("--json", a->json_path,
                "Write the result file (coilspin.consistency/1) here, atomically; - writes it to standard output "
                "instead of the report");
}

int RunConsistency(const ConsistencyArguments& a, std::ostream& out) {
  if (a.json_path) RequireOutputPath("--json", *a.json_path);
  const double tolerance = a.tolerance.value_or(units::kDefaultKtKeTolerance);
  if (!check::IsValidKtKeTolerance(tolerance) || !std::isfinite(tolerance)) {
    BadOption("--tolerance expects a number strictly between 0 and 1, such as 0.05, got " + Shown(tolerance));
  }
  if (a.back_emf_constant.empty() && a.speed_constant.empty()) {
    BadOption("give the back-EMF constant with --ke (such as " + std::string(kBackEmfFlag.examples) +
              ") or the speed constant with --kv (such as " + kSpeedFlag.examples + ")");
  }
  if (!a.back_emf_constant.empty() && !a.speed_constant.empty()) {
    BadOption("give either --ke or --kv, not both: the back-EMF constant follows from the speed constant "
              "(Ke = 60/(2*pi*Kv) V*s/rad for Kv in rpm/V)");
  }
  const units::MotorConstant kt = ParseFlag(kTorqueFlag, a.torque_constant);
  const units::MotorConstant ke = a.back_emf_constant.empty() ? ParseFlag(kSpeedFlag, a.speed_constant)
                                                              : ParseFlag(kBackEmfFlag, a.back_emf_constant);
  const double kt_over_ke = kt.value_si / units::BackEmfConstantOf_V_s_per_rad(ke);
  if (!(std::isfinite(kt_over_ke) && kt_over_ke > 0.0)) {
    BadOption("Kt/Ke of '" + kt.as_given + "' and '" + ke.as_given +
              "' is beyond the range of a double; check the figures and their units");
  }
  const check::DatasheetKtKe check = check::CheckDatasheetKtKe(kt, ke, tolerance);
  const bool json_on_stdout = a.json_path && output::IsStandardOutput(*a.json_path);
  if (json_on_stdout) {
    out << ResultJson(check, kt, ke);
    if (!out.flush()) throw std::runtime_error("cannot write the result to standard output");
  } else {
    if (a.json_path) output::WriteFileAtomically(*a.json_path, ResultJson(check, kt, ke));
    PrintReport(check, kt, ke, out);
  }
  return check.verdict == "consistent" ? kSuccess : kInconsistent;
}

}  // namespace coilspin::cli
