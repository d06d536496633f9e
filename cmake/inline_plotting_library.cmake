# The report's plotting library, dygraphs from the Debian package libjs-dygraphs,
# put into the binary at build time as C++ text (docs/report.md says why), so a
# report never depends on a file at run time and opens offline.
#
# Makes ${CMAKE_BINARY_DIR}/generated/plotting_library.cc defining
# coilspin::output::PlottingLibrary() (src/output/plotting_library.h).
set(COILSPIN_DYGRAPHS_DIR /usr/share/javascript/dygraphs
    CACHE PATH "Folder of dygraph.min.js and dygraph.min.css (Debian libjs-dygraphs)")
set(dygraphs_js ${COILSPIN_DYGRAPHS_DIR}/dygraph.min.js)
set(dygraphs_css ${COILSPIN_DYGRAPHS_DIR}/dygraph.min.css)
foreach(file ${dygraphs_js} ${dygraphs_css})
  if(NOT EXISTS ${file})
    message(FATAL_ERROR "${file} not found: the HTML report inlines dygraphs from the Debian package "
                        "libjs-dygraphs (bash .ci/setup installs it), or set COILSPIN_DYGRAPHS_DIR")
  endif()
  set_property(DIRECTORY APPEND PROPERTY CMAKE_CONFIGURE_DEPENDS ${file})
endforeach()
file(READ ${dygraphs_js} js)
file(READ ${dygraphs_css} css)
# The source-map comments name files beside the library; the report has none, so they go.
string(REGEX REPLACE "\n?//# sourceMappingURL=[^\n]*" "" js "${js}")
string(REGEX REPLACE "/\\*# sourceMappingURL=[^*]*\\*/" "" css "${css}")
set(delimiter "coilspin_inline")
if(js MATCHES "\\)${delimiter}\"" OR css MATCHES "\\)${delimiter}\"")
  message(FATAL_ERROR "the plotting library holds the raw-string delimiter ${delimiter}")
endif()
string(REGEX MATCH "v[0-9]+\\.[0-9]+\\.[0-9]+" version "${js}")

# Pieces of at most 32000 characters (ISO C++ asks compilers for 65536 per literal).
function(coilspin_raw_pieces text out)
  string(LENGTH "${text}" length)
  set(pieces "")
  set(at 0)
  while(at LESS length)
    string(SUBSTRING "${text}" ${at} 32000 piece)
    string(APPEND pieces "      R\"${delimiter}(${piece})${delimiter}\",\n")
    math(EXPR at "${at} + 32000")
  endwhile()
  set(${out} "${pieces}" PARENT_SCOPE)
endfunction()
coilspin_raw_pieces("${js}" js_pieces)
coilspin_raw_pieces("${css}" css_pieces)

set(generated ${CMAKE_BINARY_DIR}/generated/plotting_library.cc)
file(WRITE ${generated}.new
"// Made by cmake/inline_plotting_library.cmake from ${dygraphs_js} and
// ${dygraphs_css} (Debian libjs-dygraphs, MIT licence); do not edit.
#include \"src/output/plotting_library.h\"

#include <cstddef>

namespace coilspin::output {
namespace {
const char* const kScript[] = {
${js_pieces}};
const char* const kStyle[] = {
${css_pieces}};
std::string Joined(const char* const* pieces, std::size_t count) {
  std::string text;
  for (std::size_t k = 0; k < count; ++k) text += pieces[k];
  return text;
}
}  // namespace

const PlottingLibrary& ThePlottingLibrary() {
  static const PlottingLibrary library{\"dygraphs\", \"${version}\", \"MIT\", \"${dygraphs_js}\",
                                       Joined(kScript, sizeof kScript / sizeof *kScript),
                                       Joined(kStyle, sizeof kStyle / sizeof *kStyle)};
  return library;
}

}  // namespace coilspin::output
")
configure_file(${generated}.new ${generated} COPYONLY)  # rewritten only when it changed
set(COILSPIN_PLOTTING_LIBRARY_SOURCE ${generated})
