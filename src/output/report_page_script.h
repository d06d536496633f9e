#pragma once
// The HTML report's own script and style sheet (the charts are dygraphs,
// plotting_library.h). The script reads the chart specs (report_charts.h) from
// the page's JSON element "chart-data", draws each chart into its element,
// shades the parts of a log the fit did not use, draws a zero line under
// residuals, and lists any error it meets in the page's "report-problems" box.
// When done it records on <body> how many charts it drew (data-charts-drawn)
// and where they are (data-chart-boxes, "x,y,w,h;..." in page pixels), the
// page's height and how many resources it fetched (data-resources-fetched: 0),
// which the browser test reads.

namespace coilspin::output {

const char* ReportScript();
const char* ReportStyle();

}  // namespace coilspin::output
