#!/usr/bin/env bash
# Prints the speed and size figures quoted in spinecert's notes. Benchmarks, not
# tests: run it on a quiet machine. Usage: scripts/bench.sh [quick]
set -euo pipefail
cd "$(dirname "$0")/.."
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
go build -o "$work/spinecert" ./cmd/spinecert
q="$work/spinecert"
# checkit EDGES GRAPH LAYOUT: the best of three runs of spinecert check, with
# the edges checked per second of wall time
checkit() {
  local m=$1 best=""
  shift
  for _ in 1 2 3; do
    t=$( { /usr/bin/time -f "%e %U %S %M" "$q" check "$@" >/dev/null; } 2>&1 | tail -1)
    if [ -z "$best" ] || awk -v a="${t%% *}" -v b="${best%% *}" 'BEGIN { exit !(a < b) }'; then best=$t; fi
  done
  echo "$best" | awk -v m="$m" '{ printf "  %.2f s wall (best of 3), %.1f M edges/s; %s s user, %s s sys, %s KB peak\n", $1, m / $1 / 1e6, $2, $3, $4 }'
}

echo "== check on K_4473 (10,001,628 edges, 2237 pages)"
go run ./internal/benchgen -n 4473 -graph "$work/kn.edges" -layout "$work/kn.layout.json"
ls -l "$work/kn.edges" "$work/kn.layout.json" | awk '{print "  " $5 " bytes " $9}'
echo "  spinecert check (read both files, match, validate):"
checkit 10001628 "$work/kn.edges" "$work/kn.layout.json"
echo "  reading only (go benchmark of the readers):"
go test ./cert -run XXX -bench 'ReadLayoutJSON|ValidateComplete|CheckRaw' -benchtime 5x | grep Benchmark

echo "== check on the fan plus a path (500,000 vertices, 999,997 edges, 1 page)"
go run ./internal/benchgen -fan -n 500000 -graph "$work/fan.edges" -layout "$work/fan.layout.json"
ls -l "$work/fan.edges" "$work/fan.layout.json" | awk '{print "  " $5 " bytes " $9}'
echo "  spinecert check (read both files, match, validate):"
checkit 999997 "$work/fan.edges" "$work/fan.layout.json"
echo "  the same work in one process (go benchmark):"
go test ./cert -run XXX -bench 'CheckFan' -benchtime 5x | grep Benchmark

if [ "${1:-}" = quick ]; then exit 0; fi

echo "== package benchmarks"
for p in cert heuristic dimacs verify archive; do
  [ -d "$p" ] || continue
  echo "-- $p"
  go test "./$p" -run XXX -bench . -benchtime 1x 2>/dev/null | grep -E '^Benchmark' || true
done
echo "-- pagenumber: the toughness bound on Kleetopes"
go test ./pagenumber -run XXX -bench Toughness 2>/dev/null | grep -E '^Benchmark' || true
