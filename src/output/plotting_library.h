#pragma once
// The charting library the HTML report inlines: dygraphs from the Debian package
// libjs-dygraphs, put into the binary at build time by
// cmake/inline_plotting_library.cmake (docs/report.md says why build time).

#include <string>

namespace coilspin::output {

struct PlottingLibrary {
  std::string name;       // "dygraphs"
  std::string version;    // "v2.2.1", read from the library's licence comment
  std::string licence;    // "MIT"
  std::string read_from;  // the file it was read from at build time
  std::string script;     // dygraph.min.js, without its source-map comment
  std::string style;      // dygraph.min.css
};

const PlottingLibrary& ThePlottingLibrary();

}  // namespace coilspin::output
