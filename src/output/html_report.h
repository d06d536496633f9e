#pragma once
// The fit as one self-contained HTML page (`coilspin fit … --report OUT.html`,
// docs/report.md): the parameter table with intervals and assumptions, ratios,
// derived quantities and what is not identified; Kt/Ke consistency and the
// datasheet verification when there is one; the torque–speed line with its
// band; the correlation matrix as a colour map; per test, its residual figures,
// readings set aside, warnings and charts (report_charts.h); the fit's warnings
// and notes. The charting library is inlined (plotting_library.h) and nothing
// is fetched: the page opens offline. The same estimate and logs give the same
// bytes (no date, no random identifiers).

#include <string>
#include <vector>

#include "fitters/core/motor_estimate.h"
#include "src/ingest/bench_log.h"
#include "src/verify/verification.h"

namespace coilspin::output {

// `logs[k]` is the log of `estimate.tests[k]` (null: no charts for that test);
// the charts show the fitted model when the estimate holds its model traces.
std::string HtmlReport(const MotorEstimate& estimate, const std::vector<const BenchLog*>& logs,
                       const verify::Verification* verification);

}  // namespace coilspin::output
