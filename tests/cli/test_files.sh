#!/usr/bin/env bash
# Files are never lost or damaged and garbage is never presented as a result (docs/hardening.md,
# "Files"): no command writes over one of its inputs (by identity: hard and symbolic links count),
# whatever --force says; a command that writes several files writes all or none; outputs respect
# the umask; an interrupted run leaves no temporary file; non-regular inputs are refused at once;
# every numeric option is range-checked; a failed batch file makes the exit status non-zero; a
# write error on stdout is an error. Invented data only (the shipped demo set and fits of it).
set -u
pw=$(realpath "$1"); src=$(realpath "$2")
shim=$(dirname "$pw")/tests/libpw_slow_fsync.so
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
cd "$tmp" || exit 1
n=0; failed=0
bad() { echo "FAIL: $*"; failed=$((failed + 1)); }
ok() { n=$((n + 1)); }
sum() { sha256sum "$1" | cut -d' ' -f1; }
demo=$src/datasets/demo_acetone_water.csv
cp "$demo" data.csv
cp "$src/datasets/components.csv" comps.csv
"$pw" fit data.csv --model nrtl --out fit.json > /dev/null 2>&1 || { echo "FAIL: base fit"; exit 1; }
col=(--pressure 1atm --xd 0.9 --xb 0.05 --zf 0.4)

# --- 1. No output replaces an input: same name, hard link, symbolic link, with --force --------
ln data.csv hard.json; ln -s data.csv sym.json; ln fit.json fithard.html; ln -s fit.json fitsym.html
before_data=$(sum data.csv); before_comps=$(sum comps.csv); before_fit=$(sum fit.json)
expect_refused() { # what, then the command; exit 2 and a message naming the input
  local what=$1; shift
  "$@" > out.txt 2> err.txt; local rc=$?
  ok
  [ $rc -eq 2 ] || bad "$what: exit $rc, expected 2: $(cat err.txt)"
  grep -q "refusing to write over an input" err.txt || bad "$what: message: $(cat err.txt)"
  [ -s out.txt ] && bad "$what: stdout not empty"
}
expect_refused "fit --out DATA --force" "$pw" fit data.csv --model wilson --out data.csv --force
expect_refused "fit --out hard link" "$pw" fit data.csv --model wilson --out hard.json --force
expect_refused "fit --out symlink" "$pw" fit data.csv --model wilson --out sym.json --force
expect_refused "fit --out components" "$pw" fit data.csv --model wilson --components comps.csv \
  --out comps.csv --force
cp "$src/datasets/components.csv" lib.csv; before_lib=$(sum lib.csv)
PINCHWISE_COMPONENTS=$tmp/lib.csv expect_refused "fit --out the component library" \
  "$pw" fit data.csv --model wilson --out lib.csv --force
expect_refused "report --out FIT" "$pw" report fit.json --out fit.json --force
expect_refused "report --out hard link" "$pw" report fit.json --out fithard.html --force
expect_refused "report --out symlink" "$pw" report fit.json --out fitsym.html --force
expect_refused "report --out components" "$pw" report fit.json --components comps.csv \
  --out comps.csv --force
mkdir cmp; cp fit.json cmp/other.json
expect_refused "report --out --compare file" "$pw" report fit.json --compare cmp/other.json \
  --out cmp/other.json --force
# an --svg/--csv file may not be an input either (the fit file named as a plot file)
mkdir plots; cp fit.json plots/xy.svg
"$pw" report plots/xy.svg --out r0.html --svg plots --force > /dev/null 2> err.txt
rc=$?; ok; [ $rc -ne 0 ] || bad "report --svg over its input: exit 0"
[ -e r0.html ] && bad "report --svg over its input: left the page behind"
[ "$(sum data.csv)" = "$before_data" ] || bad "the dataset changed"
[ "$(sum comps.csv)" = "$before_comps" ] || bad "the component file changed"
[ "$(sum lib.csv)" = "$before_lib" ] || bad "the component library changed"
[ "$(sum fit.json)" = "$before_fit" ] || bad "the fit file changed"
[ -L sym.json ] && [ -L fitsym.html ] || bad "a symbolic link was replaced"
[ "$(stat -c %h data.csv)" = 2 ] || bad "the hard link to the dataset was broken"
# without --force an existing output is refused before the work, and left alone
cp fit.json existing.json; e=$(sum existing.json)
"$pw" fit data.csv --model wilson --out existing.json > /dev/null 2> err.txt; rc=$?; ok
[ $rc -eq 4 ] && grep -q "file exists" err.txt || bad "existing --out: exit $rc: $(cat err.txt)"
[ "$(sum existing.json)" = "$e" ] || bad "existing --out changed without --force"
# --force replaces an output that is not an input
"$pw" fit data.csv --model wilson --out existing.json --force > /dev/null 2>&1 || bad "--force refused"
ok; [ "$(sum existing.json)" != "$e" ] || bad "--force did not replace"

# --- 2. Several files: all or none ------------------------------------------------------------
echo "not a folder" > afile
"$pw" report fit.json --out r1.html --svg afile > /dev/null 2> err.txt; rc=$?; ok
[ $rc -ne 0 ] || bad "report --svg onto a file: exit 0"
[ -e r1.html ] && bad "report --svg failed but left r1.html"
"$pw" report fit.json --out r2.html --svg s2 --csv afile/sub > /dev/null 2> err.txt; rc=$?; ok
[ $rc -ne 0 ] || bad "report --csv under a file: exit 0"
[ -e r2.html ] && bad "report --csv failed but left r2.html"
[ -e s2 ] && bad "report --csv failed but left the --svg folder s2"
# an existing plot file without --force: nothing at all is written (checked before the work)
"$pw" report fit.json --out r3.html --svg s3 > /dev/null 2>&1 || bad "report --svg s3"
rm r3.html; s3=$(sum s3/$(ls s3 | head -1))
"$pw" report fit.json --out r3.html --svg s3 --csv c3 > /dev/null 2> err.txt; rc=$?; ok
[ $rc -eq 4 ] || bad "report over existing plots: exit $rc"
[ -e r3.html ] || [ -e c3 ] && bad "report over existing plots left r3.html or c3"
# with --force, a failing part leaves the old files as they were
"$pw" report fit.json --out r3.html --svg s3 --csv afile/x --force > /dev/null 2>&1 && bad "exit 0"
ok; [ "$(sum s3/$(ls s3 | head -1))" = "$s3" ] || bad "a failed --force run changed s3"
[ -e r3.html ] && bad "a failed --force run left r3.html"
# and a good run writes all of them
"$pw" report fit.json --out r4.html --svg s4 --csv c4 --json > r4.json || bad "report all three"
ok; [ -s r4.html ] && [ -n "$(ls s4)" ] && [ -n "$(ls c4)" ] || bad "report: a part is missing"

# a tie-line file given to fit --lle is an input too (1-butanol/water, datasets/lle)
cp "$src/datasets/lle/butanol_water_25C_ties.csv" ties.csv; ties=$(sum ties.csv)
"$pw" fit "$src/datasets/butanol_water_1atm.csv" --model nrtl --lle ties.csv --out ties.csv --force \
  > /dev/null 2> err.txt; rc=$?; ok
[ $rc -eq 2 ] || bad "fit --out over its --lle file: exit $rc"
[ "$(sum ties.csv)" = "$ties" ] || bad "fit --out replaced its --lle file"
grep -q "refusing to write over an input" err.txt || bad "fit over --lle: $(cat err.txt)"

# --- 3. The umask -----------------------------------------------------------------------------
(umask 077 && "$pw" fit data.csv --model wilson --out m077.json > /dev/null 2>&1 &&
  "$pw" report fit.json --out m077.html --svg m077s > /dev/null 2>&1)
(umask 022 && "$pw" fit data.csv --model wilson --out m022.json > /dev/null 2>&1)
# (one --model: a repeated option is refused since the option tables, cli_options.h)
(umask 027 && "$pw" fit data.csv --out-dir m027d --model all > /dev/null 2>&1)
ok
[ "$(stat -c %a m077.json)" = 600 ] || bad "umask 077: fit file mode $(stat -c %a m077.json)"
[ "$(stat -c %a m077.html)" = 600 ] || bad "umask 077: report mode $(stat -c %a m077.html)"
[ "$(stat -c %a m077s)" = 700 ] || bad "umask 077: --svg folder mode $(stat -c %a m077s)"
[ "$(stat -c %a m022.json)" = 644 ] || bad "umask 022: fit file mode $(stat -c %a m022.json)"
[ "$(stat -c %a m027d/data.nrtl.json)" = 640 ] || bad "umask 027: --model all file mode"
[ -z "$(find . -name '*.tmp??????')" ] || bad "temporary files left: $(find . -name '*.tmp??????')"

# --- 4. Interrupted runs leave no temporary file ----------------------------------------------
if [ -f "$shim" ]; then
  set -m # background jobs in their own process group, SIGINT not ignored
  for sig in INT TERM HUP; do
    for what in fit report; do
      mkdir -p "int_$sig$what"; rm -f marker
      if [ $what = fit ]; then
        args=(fit "$tmp/data.csv" --model wilson --out out.json); skip=0
      else # interrupted while writing the second plot: page and one plot staged, svg/ made
        args=(report "$tmp/fit.json" --out out.html --svg svg --csv csv "${col[@]}"); skip=2
      fi
      (cd "int_$sig$what" && ASAN_OPTIONS=verify_asan_link_order=0 LD_PRELOAD="$shim" \
        PW_TEST_FSYNC_MARKER="$tmp/marker" PW_TEST_FSYNC_DELAY_MS=3000 PW_TEST_FSYNC_SKIP=$skip \
        exec "$pw" "${args[@]}" > /dev/null 2>&1) &
      pid=$!
      for _ in $(seq 1200); do [ -e marker ] && break; sleep 0.05; done # up to 60 s (sanitizers)
      ok
      [ -e marker ] || { bad "$sig $what: never reached fsync"; kill -KILL $pid; wait $pid; continue; }
      [ -n "$(find "int_$sig$what" -name '*.tmp??????')" ] || bad "$sig $what: no temporary file to remove"
      [ $what = report ] && { [ -d "int_$sig$what/svg" ] || bad "$sig report: svg/ not made yet"; }
      kill -$sig $pid; { wait $pid; } 2> /dev/null; rc=$?
      want=$((128 + $(kill -l $sig)))
      [ $rc -eq $want ] || bad "$sig $what: exit $rc, expected $want (ended by the signal)"
      left=$(cd "int_$sig$what" && find . -mindepth 1 ! -name fits | head -5)
      [ -z "$left" ] || bad "$sig $what: left behind: $left"
    done
  done
  set +m
else
  echo "note: $shim not built; interruption cases skipped"
fi

# --- 5. Non-regular inputs are refused at once (timeout: a FIFO would block) ------------------
mkfifo pipe.csv pipe.json
run_nonregular() { # what, then the command
  local what=$1; shift
  timeout 20 "$@" > out.txt 2> err.txt; local rc=$?
  ok
  [ $rc -eq 124 ] && { bad "$what: blocked"; return; }
  [ $rc -eq 4 ] || bad "$what: exit $rc, expected 4: $(cat err.txt)"
  grep -q "is not a regular file" err.txt || bad "$what: message: $(cat err.txt)"
}
run_nonregular "fit FIFO" "$pw" fit pipe.csv --model nrtl
run_nonregular "check FIFO" "$pw" check pipe.csv
run_nonregular "--components FIFO" "$pw" fit data.csv --model nrtl --components pipe.csv --out x.json
run_nonregular "reflux FIFO" "$pw" reflux pipe.json "${col[@]}"
run_nonregular "azeotrope FIFO" "$pw" azeotrope pipe.json --pressure 1atm
run_nonregular "screen FIFO" "$pw" screen pipe.json --pressure 1atm --xd 0.9 --xb 0.05
run_nonregular "report FIFO" "$pw" report pipe.json --out y.html
# a --compare file that cannot be read is left out with a warning (docs/report.md), at once
timeout 20 "$pw" report fit.json --compare pipe.json --out z.html > /dev/null 2> err.txt; rc=$?; ok
[ $rc -eq 0 ] && grep -q "pipe.json: is not a regular file" err.txt || bad "report --compare FIFO: exit $rc: $(cat err.txt)"
rm -f z.html
run_nonregular "reflux /dev/zero" "$pw" reflux /dev/zero "${col[@]}"
PINCHWISE_COMPONENTS=$tmp/pipe.csv run_nonregular "library FIFO" "$pw" fit data.csv --model nrtl --out w.json
[ -e x.json ] || [ -e y.html ] || [ -e z.html ] || [ -e w.json ] && bad "a refused run wrote a file"
# a folder holding a FIFO named *.csv: that file fails, the others are fitted, exit non-zero
mkdir batch; cp data.csv batch/a.csv; mkfifo batch/b.csv
timeout 60 "$pw" fit batch --model wilson --out-dir bout --json > batch.json 2> err.txt; rc=$?; ok
[ $rc -ne 0 ] && [ $rc -ne 124 ] || bad "batch with a FIFO: exit $rc"
[ -s bout/a.wilson.json ] || bad "batch: the good file was not written"
python3 -c 'import json,sys; d=json.load(open("batch.json")); assert [f["dataset"] for f in d["failed"]] == ["b.csv"]' \
  || bad "batch JSON does not list b.csv as failed"
grep -q "1 of 2 datasets failed" err.txt || bad "batch --json: no failure line on stderr: $(cat err.txt)"
# a batch in which every file fails writes nothing, not even its --out-dir
mkdir allbad; cp "$src/tests/bad-inputs/files/nan_T.csv" allbad/x.csv
"$pw" fit allbad --model wilson --out-dir allbad_out > /dev/null 2>&1 && bad "all-failed batch: exit 0"
ok; [ -e allbad_out ] && bad "all-failed batch left its --out-dir"

# --- 6. Numeric options: range-checked, whole numbers as whole numbers ------------------------
expect_usage() { # what, fragment, then the command: exit 2, the fragment on stderr, nothing written
  local what=$1 frag=$2; shift 2
  "$@" > out.txt 2> err.txt; local rc=$?
  ok
  [ $rc -eq 2 ] || bad "$what: exit $rc, expected 2: $(head -c 300 err.txt)"
  grep -qF -- "$frag" err.txt || bad "$what: stderr lacks '$frag': $(head -c 300 err.txt)"
  [ -s out.txt ] && bad "$what: stdout not empty"
  [ "$(grep -c . err.txt)" -eq 1 ] || bad "$what: more than one line on stderr"
}
fitx=("$pw" fit data.csv --model nrtl --out opt.json)
for v in 0 0.5 1e300 1e9 -1 10001 abc 3x nan inf ""; do
  expect_usage "--starts '$v'" "--starts $v: expected a whole number from 1 to 10000" "${fitx[@]}" --starts "$v"
done
for v in 1e300 -1 0.5 4294967296 nan 0x10 " 5"; do
  expect_usage "fit --seed '$v'" "--seed $v: expected a whole number from 0 to 4294967295" "${fitx[@]}" --seed "$v"
done
for v in 99999999999999999999 1-99999999999999999999 0 -3 5-2 1-1000000 2,x 1e3; do
  expect_usage "--exclude '$v'" "--exclude" "${fitx[@]}" --exclude "$v"
done
for v in 0 -0.3 1.5 nan 1e300; do expect_usage "--alpha $v" "--alpha $v: expected" "${fitx[@]}" --alpha "$v"; done
for v in 0 1 -0.1 1e-300; do expect_usage "--sigma-y $v" "--sigma-y $v: expected" "${fitx[@]}" --sigma-y "$v"; done
for v in 0 1e300 -5; do expect_usage "--sigma-P $v" "--sigma-P $v: expected" "${fitx[@]}" --sigma-P "$v"; done
for v in 0K 1e300K 1e-300K -1K 0x1K; do expect_usage "--sigma-T $v" "--sigma-T $v: expected" "${fitx[@]}" --sigma-T "$v"; done
[ -e opt.json ] && bad "a refused option wrote the fit file"
for v in 2.5 -3 1e300 100001 12x; do
  expect_usage "reflux --samples $v" "--samples $v" "$pw" reflux fit.json "${col[@]}" --samples "$v"
  expect_usage "azeotrope --samples $v" "--samples $v" "$pw" azeotrope fit.json --pressure 1atm --samples "$v"
  expect_usage "report --samples $v" "--samples $v" "$pw" report fit.json --out o.html --samples "$v"
  expect_usage "screen --samples $v" "--samples $v" "$pw" screen fit.json --pressure 1atm --xd 0.9 --xb 0.05 --samples "$v"
done
for v in 1e300 0.5 -1 4294967296; do
  expect_usage "reflux --seed $v" "--seed $v" "$pw" reflux fit.json "${col[@]}" --seed "$v"
  expect_usage "azeotrope --seed $v" "--seed $v" "$pw" azeotrope fit.json --pressure 1atm --seed "$v"
  expect_usage "report --seed $v" "--seed $v" "$pw" report fit.json --out o.html --seed "$v"
done
for v in 1 0.5 1e300 101 nan 1.2,x 0x2; do
  expect_usage "reflux --factors $v" "--factors" "$pw" reflux fit.json "${col[@]}" --factors "$v"
done
for v in 1 1e9 nan; do
  expect_usage "report --operating-factor $v" "--operating-factor $v" "$pw" report fit.json --out o.html "${col[@]}" --operating-factor "$v"
done
for v in 1kPa:2kPa:1 1kPa:2kPa:2.5 1kPa:2kPa:1e9 1kPa:2kPa:nan; do
  expect_usage "azeotrope --scan $v" "--scan" "$pw" azeotrope fit.json --pressure 1atm --scan "$v"
done
for v in 1.5 -0.1 nan 1e300 0x0.8; do
  expect_usage "reflux --xd $v" "--xd $v" "$pw" reflux fit.json --pressure 1atm --xd "$v" --xb 0.05 --zf 0.4
done
for v in 1e300 -1e300 11 nan; do
  expect_usage "reflux --q $v" "--q $v: expected the feed's liquid fraction q from -10 to 10" \
    "$pw" reflux fit.json "${col[@]}" --q "$v"
  expect_usage "report --q $v" "--q $v: expected" "$pw" report fit.json --out o.html "${col[@]}" --q "$v"
done
for v in 1e-300Pa 1e300Pa 1e11Pa; do
  expect_usage "reflux --pressure $v" "--pressure $v: outside the plausible range 1e-06 to 1e+10 Pa" \
    "$pw" reflux fit.json --pressure "$v" --xd 0.9 --xb 0.05 --zf 0.4
  expect_usage "screen --swing-range $v" "--swing-range" \
    "$pw" screen fit.json --pressure 1atm --xd 0.9 --xb 0.05 --swing-range "1kPa:$v"
done
for v in 0.5K 1e6K; do
  expect_usage "azeotrope --temperature $v" "--temperature $v: outside the plausible range 1 to 5000 K" \
    "$pw" azeotrope fit.json --temperature "$v"
done
[ -e o.html ] && bad "a refused option wrote the report"
# the limits themselves are accepted
"$pw" fit data.csv --model wilson --out lim1.json --starts 1 --seed 4294967295 --exclude 8-9 > /dev/null 2>&1 \
  || bad "--starts 1 --seed 4294967295 refused"
ok

# --- 7. A write error on stdout is an error (a full disk) -------------------------------------
if [ -w /dev/full ]; then
  full() { # what, then the command
    local what=$1; shift
    "$@" > /dev/full 2> err.txt; local rc=$?
    ok
    [ $rc -ne 0 ] || bad "$what > /dev/full: exit 0"
    grep -q "cannot write to standard output" err.txt || bad "$what > /dev/full: $(cat err.txt)"
  }
  full "fit --json" "$pw" fit data.csv --model wilson --out full1.json --json
  full "fit (table)" "$pw" fit data.csv --model wilson --out full2.json
  full "check" "$pw" check data.csv
  full "check --json" "$pw" check data.csv --json
  full "reflux" "$pw" reflux fit.json "${col[@]}"
  full "reflux --json" "$pw" reflux fit.json "${col[@]}" --json
  full "azeotrope" "$pw" azeotrope fit.json --pressure 1atm
  full "screen --json" "$pw" screen fit.json --pressure 1atm --xd 0.9 --xb 0.05 --json
  full "report --json" "$pw" report fit.json --out full.html --json
  full "--help" "$pw" --help
  full "--version" "$pw" --version
fi

# --- 8. Memory runs out while the JSON result is built: no JSON that lacks keys --------------
# tests/tools/fail_malloc.c makes every allocation fail from the Kth one after the fit file was
# written (or only the Kth: later ones succeed, so a half-built object could still be printed);
# for every K the run either prints the complete object or prints nothing and fails.
failer=$(dirname "$pw")/tests/libpw_fail_malloc.so
if [ -f "$failer" ] && ! ldd "$pw" 2>/dev/null | grep -q 'libasan\|libtsan'; then
  mkdir oom; mode=all
  for k in $(seq 0 29 1300) one $(seq 0 7 1300); do
    [ "$k" = one ] && { export PW_TEST_MALLOC_ONLY_ONE=1; mode=one; continue; }
    PW_TEST_MALLOC_GRACE=$k LD_PRELOAD="$failer" "$pw" fit data.csv --model wilson \
      --out "oom/$mode$k.json" --json > "oom/$mode$k.out" 2> "oom/$mode$k.err"
    echo "$mode$k $?" >> oom/runs.txt
  done
  # one checker for every run (python start-up is the slow part)
  python3 - oom > oom/checker.txt <<'PY'
import json, os, sys
d = sys.argv[1]
keys = ("model", "converged", "components", "parameters", "stderr", "ln_gamma_inf", "T_ref_K",
        "aad_y", "aad_T_K", "aad_P_kPa", "fit_file")
bad = 0
for line in open(os.path.join(d, "runs.txt")):
    run, rc = line.split()
    out = open(os.path.join(d, run + ".out")).read()
    err = open(os.path.join(d, run + ".err")).read()
    problem = None
    if rc == "0":
        try:
            o = json.loads(out)
            missing = [k for k in keys if k not in o]
            if missing:
                problem = "exit 0 with a JSON object that lacks " + ", ".join(missing)
        except ValueError:
            problem = "exit 0 without one JSON object on stdout"
    elif rc != "5" or out or "out of memory" not in err:
        problem = "exit %s, stdout %d bytes, stderr %r" % (rc, len(out), err[-200:])
    try:  # the fit file was committed before the JSON was built: complete in every run
        json.load(open(os.path.join(d, run + ".json")))
    except (OSError, ValueError) as e:
        problem = (problem or "") + " fit file not complete: %s" % e
    if problem:
        bad += 1
        print("FAIL: out of memory (%s): %s" % (run, problem))
print(bad)
PY
  [ $? -eq 0 ] || bad "the out-of-memory checker failed"
  grep '^FAIL' oom/checker.txt
  n=$((n + $(wc -l < oom/runs.txt)))
  failed=$((failed + $(tail -1 oom/checker.txt)))
  unset PW_TEST_MALLOC_ONLY_ONE
else
  echo "note: $failer not built or a sanitizer build; out-of-memory cases skipped"
fi

echo "$n file-safety checks, $failed failures"
[ $failed -eq 0 ]
