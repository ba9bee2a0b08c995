#!/usr/bin/env bash
# The installed library: `cmake --install` into a temporary prefix, then the example program of
# examples/ built against that tree with pkg-config and with find_package(pinchwise) (shared and
# static), run, and compared with the command line's own answer on the same split.
set -u
pw=$1; src=$2
build=$(cd "$(dirname "$pw")" && pwd)
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
command -v pkg-config >/dev/null || { echo "pkg-config not installed"; exit 77; }
prefix=$tmp/prefix
cmake --install "$build" --prefix "$prefix" > "$tmp/install.log" 2>&1 || { cat "$tmp/install.log"; fail "cmake --install"; }

# 1. What the tree holds: versioned shared library, static library, headers, package files, data.
libdir=$(dirname "$(find "$prefix" -name 'libpinchwise.so.*.*.*' | head -1)")
[ -d "$libdir" ] || fail "no versioned shared library installed"
soname=$(readelf -d "$libdir"/libpinchwise.so.*.*.* | sed -n 's/.*Library soname: \[\(.*\)\]/\1/p')
[[ "$soname" == libpinchwise.so.* ]] || fail "SONAME is '$soname'"
[ -L "$libdir/$soname" ] && [ -L "$libdir/libpinchwise.so" ] || fail "SONAME and development links"
[ -f "$libdir/libpinchwise.a" ] || fail "static library"
for h in api commands fit column azeotrope status; do
  [ -f "$prefix/include/pinchwise/$h.h" ] || fail "header $h.h"
done
[ -f "$libdir/pkgconfig/pinchwise.pc" ] || fail "pinchwise.pc"
[ -f "$libdir/cmake/pinchwise/pinchwiseConfig.cmake" ] || fail "CMake package"
[ -f "$prefix/share/pinchwise/components.csv" ] || fail "component library"

# 2. The command line's answer (invented demo data).
cd "$tmp"
"$pw" fit "$src/datasets/demo_acetone_water.csv" --model nrtl --out demo.json >/dev/null 2>&1 || fail "CLI fit"
"$pw" reflux demo.json --pressure 101.325kPa --xd 0.95 --xb 0.02 --zf 0.10 --json > cli.json 2>/dev/null || fail "CLI reflux"

check_run() { # $1 program, $2 label, $3 "installed" when it must use the installed components
  "$1" "$src/datasets/demo_acetone_water.csv" 101.325kPa 0.95 0.02 0.10 > "$2.out" 2> "$2.err" || { cat "$2.err"; fail "$2 run"; }
  if [ "${3:-}" = installed ]; then
    grep -q "^component library: $prefix/share/pinchwise/components.csv$" "$2.out" || { head -1 "$2.out"; fail "$2 does not use the installed component library"; }
  fi
  python3 - "$2.out" <<'PY' || fail "$2 differs from the command line"
import json, sys
text = open(sys.argv[1]).read()
doc = json.loads(text[text.index("\n{") + 1:])
cli = json.load(open("cli.json"))
assert doc == cli, (doc, cli)
PY
}

# 3. pkg-config, shared library (run path into the temporary prefix).
export PKG_CONFIG_PATH=$libdir/pkgconfig
cc -std=c17 -Wall -Werror "$src/examples/fit_and_reflux.c" $(pkg-config --cflags --libs pinchwise) \
   -Wl,-rpath,"$libdir" -o ex_pc 2> pc.err || { cat pc.err; fail "build with pkg-config"; }
ldd ex_pc | grep -q "$libdir/$soname" || fail "example not linked to the installed $soname"
# Every installed header stands alone with the installed tree's flags, and none exposes the
# library's internals (GSL's random generators, samplers: src/analysis/*_internal.h).
for h in "$prefix"/include/pinchwise/*.h; do
  printf '#include <pinchwise/%s>\n' "$(basename "$h")" > hdr.c
  cc -std=c17 -Wall -Werror -fsyntax-only hdr.c $(pkg-config --cflags pinchwise) 2> hdr.err \
    || { cat hdr.err; fail "installed header $(basename "$h") does not compile alone"; }
  ! grep -q '#include <gsl/' "$h" || fail "installed header $(basename "$h") includes GSL"
done
! grep -q "pw_unc_sampler\|gsl_rng\|pw_status_exit_code" "$prefix"/include/pinchwise/*.h \
  || fail "an installed header exposes the sampler, a random generator or exit codes"
check_run ./ex_pc pkgconfig installed

# 4. find_package(pinchwise): pinchwise::pinchwise (shared) and pinchwise::pinchwise_static.
cmake -S "$src/examples" -B exbuild -DCMAKE_PREFIX_PATH="$prefix" -DCMAKE_BUILD_RPATH="$libdir" \
      > cmake.log 2>&1 || { cat cmake.log; fail "configure the examples with find_package"; }
cmake --build exbuild > build.log 2>&1 || { cat build.log; fail "build the examples"; }
check_run exbuild/fit_and_reflux cmake installed
check_run exbuild/fit_and_reflux_static cmake_static
ldd exbuild/fit_and_reflux_static | grep -q libpinchwise && fail "static example links the shared library"

# 5. The installed program finds the installed component library when the source tree's is gone
#    from its reach (PINCHWISE_COMPONENTS unset; run from elsewhere).
unset PINCHWISE_COMPONENTS
"$prefix/bin/pinchwise" check "$src/datasets/demo_acetone_water.csv" --json > inst_check.json 2>/dev/null || fail "installed program"

# 6. The installed Python module loads the installed library by itself.
PYTHONPATH=$libdir/python3/dist-packages env -u PINCHWISE_LIBRARY python3 - "$libdir" "$src" <<'PY' || fail "installed Python module"
import json, os, sys
import pinchwise
libdir, src = sys.argv[1:]
assert pinchwise.library_path().startswith(os.path.realpath(libdir)), pinchwise.library_path()
assert pinchwise.__file__.startswith(libdir), pinchwise.__file__
got = pinchwise.reflux("demo.json", "101.325kPa", 0.95, 0.02, 0.10)
assert got == json.load(open("cli.json"))
PY
echo "install tree, pkg-config, CMake package and Python module work"
