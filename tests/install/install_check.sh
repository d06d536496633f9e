#!/usr/bin/env bash
# Installs the built coilspin into a temporary prefix and checks what README's
# "Install" section promises (run by CTest as install_into_a_prefix):
#   - cmake --install puts the binary, the demo logs, the manual page and the
#     bash completion in the usual places under the prefix;
#   - the installed `coilspin demo`, run from another folder with
#     COILSPIN_DEMO_DIR unset, fits the demo logs installed beside it (it says
#     which session it fits; a prefix other than the configured one shows that
#     the path is found from the executable, not compiled in);
#   - the completion offers the commands, a command's options and an option's values;
#   - cpack -G DEB makes a .deb holding the same files.
# Usage: install_check.sh BUILD_DIR CMAKE_COMMAND CPACK_COMMAND PYTHON SOURCE_DIR
set -euo pipefail
build=$1 cmake=$2 cpack=$3 python=$4 source=$5
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
passed=0 failed=0
check() {  # check DESCRIPTION COMMAND...
  local what=$1
  shift
  if "$@" >/dev/null 2>&1; then passed=$((passed + 1)); else failed=$((failed + 1)); echo "FAILED: $what"; fi
}

prefix=$work/prefix
"$cmake" --install "$build" --prefix "$prefix" >"$work/install.log"
check "binary in bin/" test -x "$prefix/bin/coilspin"
check "demo session in share/coilspin/demo/" test -f "$prefix/share/coilspin/demo/session.toml"
check "demo logs in share/coilspin/demo/" test -f "$prefix/share/coilspin/demo/step.csv"
check "manual page in share/man/man1/" grep -q '^\.TH COILSPIN "1"' "$prefix/share/man/man1/coilspin.1"
check "manual page lists export" grep -q 'export' "$prefix/share/man/man1/coilspin.1"
check "bash completion in share/bash-completion/completions/" test -f "$prefix/share/bash-completion/completions/coilspin"

mkdir "$work/elsewhere"
(cd "$work/elsewhere" && env -u COILSPIN_DEMO_DIR "$prefix/bin/coilspin" demo --json demo.json >out.txt 2>err.txt) || true
check "installed demo fits the installed session" \
  grep -qF "coilspin demo: fitting $prefix/share/coilspin/demo/session.toml" "$work/elsewhere/err.txt"
check "installed demo prints the table" grep -qE 'resistance +R +1\.37[0-9]+ +ohm' "$work/elsewhere/out.txt"
check "installed demo verifies its installed datasheet" \
  grep -qF "($prefix/share/coilspin/demo/datasheet.toml)" "$work/elsewhere/out.txt"
check "installed demo lot is installed" test -f "$prefix/share/coilspin/demo/lot/motor-0104.toml"
check "installed demo's result conforms to the format-2 schema" \
  "$python" "$source/tests/tools/validate_result.py" "$source/docs/result-format-2.schema.json" "$work/elsewhere/demo.json"

complete_words() {  # complete_words WORD... : what the completion offers for the last word
  PATH="$prefix/bin:$PATH" bash -c 'source "$1"; shift; COMP_WORDS=("$@"); COMP_CWORD=$(($# - 1)); _coilspin;
    printf "%s\n" "${COMPREPLY[@]}"' _ "$prefix/share/bash-completion/completions/coilspin" "$@"
}
check "completion offers the commands" grep -qx export <(complete_words coilspin ex)
check "completion offers a command's options" grep -qx -- --format <(complete_words coilspin export --fo)
check "completion offers an option's values" grep -qx state-space <(complete_words coilspin export r.json --format st)

(cd "$work" && "$cpack" -G DEB --config "$build/CPackConfig.cmake" -B "$work/deb" >"$work/cpack.log" 2>&1) ||
  cat "$work/cpack.log"
deb=$(ls "$work"/deb/*.deb 2>/dev/null | head -n 1)
check "cpack made a .deb" test -n "$deb"
if [ -n "$deb" ]; then
  dpkg-deb -c "$deb" >"$work/contents.txt"
  for f in ./usr/bin/coilspin ./usr/share/coilspin/demo/session.toml ./usr/share/man/man1/coilspin.1 \
           ./usr/share/bash-completion/completions/coilspin; do
    check ".deb holds $f" grep -q " $f\$" "$work/contents.txt"
  done
  check ".deb names its library dependencies (dpkg-shlibdeps)" grep -q 'libstdc++6' <(dpkg-deb -f "$deb" Depends)
fi
echo "install check: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
