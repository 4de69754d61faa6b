#!/usr/bin/env bash
# Prints the wall time and peak memory of every SAT backend on the 2-page
# claims for the Kleetopes of random stacked triangulations with 56, 116 and
# 206 vertices (all UNSAT: see BenchmarkBackendsKleetope in verify), and the
# time spinecert's checker takes for cadical's DRAT proof. Benchmarks, not
# tests: run it on a quiet machine.
#
# Usage: scripts/backends.sh [SIZE ...]   (default: 56 116 206)
# Each run is limited to BACKENDS_TIMEOUT seconds (default 600) and
# BACKENDS_MEM_KB of address space (ulimit -v, default 8 GiB); a run that
# hits a limit is reported as such, not timed.
set -euo pipefail
cd "$(dirname "$0")/.."
timeout_s=${BACKENDS_TIMEOUT:-600}
mem_kb=${BACKENDS_MEM_KB:-8388608}
sizes=("$@")
[ ${#sizes[@]} -gt 0 ] || sizes=(56 116 206)

work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
go build -o "$work/spinecert" ./cmd/spinecert
go test -c -o "$work/verify.test" ./verify
SPINECERT_BENCH_DIR=$work "$work/verify.test" -test.run '^TestWriteBenchKleetopes$' >/dev/null
export SPINECERT_BENCH_DIR=$work SPINECERT_BENCH_LIMIT=${timeout_s}s

# measure LABEL CMD...: one row, from /usr/bin/time -v, under the limits.
measure() {
  local label=$1
  shift
  local t="$work/time.txt" rc=0
  (ulimit -v "$mem_kb" && exec /usr/bin/time -v -o "$t" timeout "$timeout_s" "$@") >"$work/out.txt" 2>"$work/err.txt" || rc=$?
  local wall rss
  wall=$(sed -n 's/.*Elapsed (wall clock) time (h:mm:ss or m:ss): //p' "$t")
  rss=$(sed -n 's/.*Maximum resident set size (kbytes): //p' "$t")
  local note=""
  case $rc in
  0 | 10 | 20) grep -q -- '--- SKIP' "$work/out.txt" && note="no answer: $(grep -m1 -o 'gave no answer.*' "$work/out.txt")" ;;
  124) note="time limit (${timeout_s}s)" ;;
  *) note="exit status $rc$(grep -q -i -E 'memory|alloc' "$work/err.txt" && echo ', out of memory')" ;;
  esac
  printf '%-6s %-16s %12s %10s MB  %s\n' "$v" "$label" "$wall" "$((rss / 1024))" "$note"
}

printf '%-6s %-16s %12s %13s  %s\n' vertices backend wall peak-RSS note
for v in "${sizes[@]}"; do
  g="$work/kleetope-$v.edges"
  cnf="$work/kleetope-$v.cnf"
  if [ ! -f "$g" ]; then
    echo "no benchmark graph with $v vertices (sizes: 56 116 206)" >&2
    exit 2
  fi
  "$work/spinecert" encode "$g" --pages 2 -o "$cnf" 2>/dev/null
  echo "# $v vertices: $(grep -m1 '^p cnf' "$cnf")"
  # The outside programs run with the arguments spinecert gives them
  # (verify/solver_known.go); the in-process ones inside the test binary.
  command -v cadical >/dev/null && measure cadical cadical -q "$cnf" "$work/cadical.drat"
  command -v cryptominisat5 >/dev/null && measure cryptominisat cryptominisat5 --verb 0 --threads 1 "$cnf"
  command -v minisat >/dev/null && measure minisat minisat -verb=0 "$cnf" "$work/minisat.txt"
  command -v kissat >/dev/null && measure kissat kissat -q "$cnf" "$work/kissat.drat"
  for b in gini gophersat; do
    measure "$b" "$work/verify.test" -test.run '^$' -test.bench "^BenchmarkBackendsKleetope/v=$v/$b\$" -test.benchtime 1x
  done
  if [ -s "$work/cadical.drat" ]; then
    measure "check(cadical)" "$work/spinecert" proof --quiet "$cnf" "$work/cadical.drat" --lrat "$work/cadical.lrat"
    grep -q '^DRAT proof accepted' "$work/out.txt" || echo "#   cadical's proof was NOT accepted: $(head -c 300 "$work/out.txt")"
    rm -f "$work/cadical.drat" "$work/cadical.lrat"
  fi
done
