#include "src/cli/export_command.h"

#include <ostream>

#include "src/cli/exit_codes.h"
#include "src/cli/output_path.h"
#include "src/ingest/input_error.h"
#include "src/model/state_space.h"
#include "src/output/atomic_file.h"
#include "src/output/c_header.h"
#include "src/output/export_source.h"
#include "src/output/spice_subcircuit.h"
#include "src/output/state_space_json.h"
#include "src/output/torque_speed_csv.h"
#include "src/result/model_parameters.h"
#include "src/result/result_reader.h"

namespace coilspin::cli {
namespace {

constexpr const char* kDefaultName = "coilspin_motor";

// Says on `err` what the format needs and the result lacks.
int Missing(const std::string& format, const result::ModelParameters& p, std::ostream& err) {
  err << "coilspin: export --format " << format << " needs R, L, Ke, Kt and J; the result does not determine:\n";
  for (const auto& [key, reason] : p.missing) err << "  " << key << ": " << reason << "\n";
  return kUndetermined;
}

}  // namespace

void DeclareExportOptions(CLI::App* c, ExportArguments* a) {
  c->add_option("result", a->result_path, "Result file of a fit (coilspin.result/2 or /1)")->required();
  c->add_option("--format", a->format,
                "spice (subcircuit p n shaft), state-space (coilspin.state-space/1 JSON), c-header (constexpr "
                "double SI values), csv (the torque-speed line with its band)")
      ->required()
      ->check(CLI::IsMember({"spice", "state-space", "c-header", "csv"}));
  c->add_option("--out", a->out_path, "File to write (atomically); - writes it to standard output")->required();
  c->add_option("--name", a->name,
                "Name of the SPICE subcircuit or C++ namespace (default: from the motor label, else coilspin_motor)");
}

int RunExport(const ExportArguments& a, std::ostream& out, std::ostream& err) {
  RequireOutputPath("--out", a.out_path);  // before any work (output_path.h)
  const result::ResultFile file = result::ReadResultFile(a.result_path);
  const MotorEstimate& e = file.estimate;
  output::ExportSource source{a.result_path,
                              file.format_version == 1 ? result::kResultFormat1 : result::kResultFormat2,
                              e.motor_label, e.confidence};
  const std::string name = output::IdentifierFrom(a.name.empty() ? e.motor_label : a.name, kDefaultName);
  if (!a.name.empty() && name != a.name)
    throw InputError(InputErrorKind::kBadOption, "", 0, 0,
                     "--name " + a.name + ": use letters, digits and '_' only, not starting with a digit (e.g. " +
                         name + ")");
  std::string text;
  if (a.format == "spice" || a.format == "state-space") {
    const result::ModelParameters p = result::ModelParametersOf(e);
    if (!p.complete()) return Missing(a.format, p, err);
    text = a.format == "spice" ? output::SpiceSubcircuit(e, p, name, source)
                               : output::StateSpaceJson(model::MotorStateSpace(p.values), p, source);
  } else if (a.format == "c-header") {
    text = output::CHeader(e, name, source);
  } else {
    if (!e.torque_speed) {
      err << "coilspin: export --format csv: the result has no torque-speed line (it needs R, Kt and Ke, and an "
             "operating voltage)\n";
      return kUndetermined;
    }
    text = output::TorqueSpeedCsv(*e.torque_speed, source);
  }
  output::WriteFileAtomically(a.out_path, text);
  if (output::IsStandardOutput(a.out_path)) return kSuccess;  // stdout holds the export and nothing else
  out << "wrote " << a.format << " export of " << (e.motor_label.empty() ? name : e.motor_label) << " to "
      << a.out_path << "\n";
  return kSuccess;
}

}  // namespace coilspin::cli
