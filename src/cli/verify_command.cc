#include "src/cli/verify_command.h"

#include <ostream>

#include "src/cli/exit_codes.h"
#include "src/cli/output_path.h"
#include "src/ingest/input_error.h"
#include "src/output/atomic_file.h"
#include "src/output/verification_csv.h"
#include "src/output/verification_json.h"
#include "src/output/verification_table.h"
#include "src/result/result_reader.h"
#include "src/verify/datasheet_file.h"
#include "src/verify/verification.h"

namespace coilspin::cli {

void DeclareVerifyOptions(CLI::App* c, VerifyArguments* a) {
  c->add_option("--datasheet", a->datasheet_path, "The supplier's datasheet (TOML; docs/file-formats.md)")
      ->required()
      ->check(CLI::ExistingFile);
  c->add_option("results", a->result_paths, "Result files (coilspin.result/1 or /2), one per motor of the lot")
      ->required()
      ->check(CLI::ExistingFile);
  c->add_option("--json", a->json_path,
                "Write the verification (coilspin.verification/1) here, atomically; - writes it to standard output "
                "instead of the table");
  c->add_option("--csv", a->csv_path,
                "Write one row per motor and line as CSV here, atomically; - writes it to standard output instead "
                "of the table");
  c->add_flag("--quiet", a->quiet, "Print no table");
}

int RunVerify(const VerifyArguments& a, std::ostream& out, std::ostream& err) {
  // Before any work (output_path.h); standard output takes one of them at most.
  if (a.json_path) RequireOutputPath("--json", *a.json_path);
  if (a.csv_path) RequireOutputPath("--csv", *a.csv_path);
  const bool json_on_stdout = a.json_path && output::IsStandardOutput(*a.json_path);
  const bool csv_on_stdout = a.csv_path && output::IsStandardOutput(*a.csv_path);
  if (json_on_stdout && csv_on_stdout)
    throw InputError(InputErrorKind::kBadOutputPath, "-", 0, 0,
                     "--json - and --csv -: standard output takes one of them; give the other a file name");
  const verify::Datasheet sheet = verify::LoadDatasheet(a.datasheet_path);
  std::vector<verify::NamedResult> results;
  for (const std::string& path : a.result_paths) results.push_back({path, result::ReadResultFile(path).estimate});
  const verify::Verification v = verify::Verify(sheet, results);
  if (a.json_path) output::WriteFileAtomically(*a.json_path, output::VerificationJson(v));
  if (a.csv_path) output::WriteFileAtomically(*a.csv_path, output::VerificationCsv(v));
  if (!a.quiet && !json_on_stdout && !csv_on_stdout) out << output::VerificationText(v);
  bool all_pass = true;
  for (const verify::MotorCheck& m : v.motors) {
    for (const verify::LineCheck& c : m.lines) {
      if (c.decision.verdict == verify::Verdict::kPass) continue;
      all_pass = false;
      err << "coilspin: " << m.result_file << ": datasheet line " << c.key << ": "
          << verify::VerdictName(c.decision.verdict) << "\n";
    }
  }
  return all_pass ? kSuccess : kUndetermined;
}

}  // namespace coilspin::cli
