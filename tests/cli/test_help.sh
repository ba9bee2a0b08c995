#!/usr/bin/env bash
# Every command's --help is made from its option tables (src/cli/cli_options.c): it lists every
# option the command had before the tables (the list below, from the hand-written help texts and
# ../shared/CONTRACT.md), every option it lists is accepted by the command, and the parser's
# general rules hold on every command (--opt=value, a flag given a value, "--", an unknown option
# with the nearest name suggested, a repeated option). No computation: every run below stops at
# the options.
set -u
pw=$1; src=$2
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cd "$tmp"

declare -A had=(
  [fit]="--model --components --out --out-dir --force --alpha --fit-alpha --vapor --starts --seed --sigma-T --sigma-P --sigma-y --exclude --exclude-reason --lle --json"
  [check]="--components --strict --sigma-y --exit-verdict --json"
  [azeotrope]="--pressure --temperature --sweep --scan --uncertainty --samples --seed --components --minimum --json"
  [reflux]="--pressure --xd --xb --zf --q --factors --operating-factor --energy --uncertainty --samples --seed --compare --components --minimum --exit-verdict --json"
  [screen]="--pressure --xd --xb --zf --q --sweep --swing-range --uncertainty --samples --seed --energy --components --minimum --exit-verdict --json"
  [report]="--out --pressure --xd --xb --zf --q --factors --operating-factor --energy --uncertainty --samples --seed --svg --csv --components --minimum --compare --force --json"
  [lle]="--temperature --scan --components --minimum --json"
  [decanter]="--pressure --zf --x1-rich --x1-lean --q --factors --components --minimum --json"
  [rate]="--pressure --stages --feed-stage --reflux --zf --distillate --q --energy --components --minimum --json"
  [study]="--pressure --xd --xb --zf --q --model --out-dir --factors --uncertainty --samples --seed --force --components --exit-verdict --json"
)

for c in fit check azeotrope reflux screen report lle decanter rate study; do
  "$pw" $c --help > h.txt 2> e.txt || fail "$c --help: status $?"
  [ -s e.txt ] && fail "$c --help wrote to stderr: $(cat e.txt)"
  grep -q "^usage: pinchwise $c" h.txt || fail "$c --help: no usage line"
  grep -q "^options:" h.txt || fail "$c --help: no option list"
  "$pw" $c -h | cmp -s - h.txt || fail "$c -h differs from --help"
  # every option it had is listed
  for o in ${had[$c]}; do
    grep -q -- "$o\b" h.txt || fail "$c --help does not list $o"
  done
  # every option listed (at the start of an entry, or as an alias) is accepted
  listed=$( (grep -oE '^  --[a-zA-Z0-9-]+' h.txt; grep -oE 'also spelt --[a-zA-Z0-9-]+' h.txt) \
            | grep -oE -- '--[a-zA-Z0-9-]+' | sort -u)
  [ -n "$listed" ] || fail "$c: no options found in the help"
  for o in $listed; do
    [ "$o" = "--help" ] && continue
    "$pw" $c "$o" 1 > /dev/null 2> e.txt
    grep -q "unknown option" e.txt && fail "$c lists $o but refuses it: $(cat e.txt)"
  done
  # unknown options: refused with the nearest name suggested; one line on stderr, status 2
  "$pw" $c --jsn > o.txt 2> e.txt; rc=$?
  [ $rc -eq 2 ] || fail "$c --jsn: status $rc"
  grep -q "unknown option --jsn (did you mean --json?" e.txt || fail "$c --jsn: $(cat e.txt)"
  [ "$(wc -l < e.txt)" -eq 1 ] && [ ! -s o.txt ] || fail "$c --jsn: not one line on stderr only"
  # a flag given a value, a flag given twice
  "$pw" $c --json=yes 2> e.txt >/dev/null && fail "$c --json=yes accepted"
  grep -q -- "--json takes no value" e.txt || fail "$c --json=yes: $(cat e.txt)"
  "$pw" $c --json --json 2> e.txt >/dev/null && fail "$c --json twice accepted"
  grep -q -- "--json given more than once" e.txt || fail "$c --json twice: $(cat e.txt)"
  # --components needs its value, with either spelling
  "$pw" $c x --components 2> e.txt >/dev/null && fail "$c --components without a value accepted"
  grep -q -- "--components needs a value (FILE)" e.txt || fail "$c --components: $(cat e.txt)"
done

# "--" ends the options: a file whose name starts with '-' is read as a file
cp "$src/datasets/demo_acetone_water.csv" ./-odd.csv
"$pw" check --json -- -odd.csv > c.json 2>/dev/null || fail "check -- -odd.csv"
python3 -c 'import json; assert "consistent" in json.load(open("c.json"))' || fail "check -- output"
"$pw" check --json -odd.csv 2> e.txt >/dev/null && fail "-odd.csv without -- taken as a file"
grep -q "unknown option -odd.csv" e.txt || fail "message: $(cat e.txt)"

# a value may start with '-' (a superheated feed); a typo near a real option is named
"$pw" reflux f.json --pressure 1atm --xd 0.9 --xb 0.1 --zf 0.5 --q=-0.5 --factor 1.2 2> e.txt && fail "--factor accepted"
grep -q "did you mean --factors?" e.txt || fail "--factor: $(cat e.txt)"
"$pw" reflux f.json --pressure 1atm --pressure 2atm 2> e.txt && fail "--pressure twice accepted"
grep -q -- "--pressure given more than once" e.txt || fail "--pressure twice: $(cat e.txt)"
"$pw" reflux f.json --operating-factor 1.2 --factors 1.3 2> e.txt && fail "both spellings accepted"
grep -q -- "--factors given more than once" e.txt || fail "two spellings: $(cat e.txt)"
# model names in any case, with either form of the option
"$pw" fit "$src/datasets/demo_acetone_water.csv" --model=MARGULES --out=m.json > /dev/null 2>&1 || fail "--model=MARGULES"
"$pw" fit "$src/datasets/demo_acetone_water.csv" --model VanLaar --out v.json > /dev/null 2>&1 || fail "--model VanLaar"
# a repeatable option keeps every occurrence: --exclude adds lines (ethanol/water set, shipped)
"$pw" fit "$src/datasets/ethanol_water_1atm.csv" --model wilson --exclude 8 --exclude=10-11 --out ex.json > /dev/null 2>&1 || fail "--exclude twice"
python3 -c 'import json; d=json.load(open("ex.json")); assert d["excluded"]["lines"] == [8, 10, 11], d["excluded"]' || fail "--exclude twice: lines"
echo "help and option tests passed"
