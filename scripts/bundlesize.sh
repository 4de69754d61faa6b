#!/usr/bin/env bash
# Prints bundle size against the size of the text DRAT proof it holds, for the
# cases quoted in the README: K7 exact 4, the Petersen graph exact 3, and a
# 116-vertex Kleetope at least 3 without --subgraph (so the proof is large).
# Each proof is cadical's text DRAT (--no-binary) of spinecert's CNF, given to
# bundle with --from-proof. Usage: scripts/bundlesize.sh [SPINECERT]
set -euo pipefail
cd "$(dirname "$0")/.."
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
q=${1:-}
if [ -z "$q" ]; then
  go build -o "$work/spinecert" ./cmd/spinecert
  q="$work/spinecert"
fi
go run ./internal/kleetopegen -t 40 -o "$work/kleetope.edges" 2>/dev/null
printf '%-10s %-10s %12s %12s %8s\n' graph claim "text proof" bundle ratio
one() { # name graph bound k
  local name=$1 g=$2 bound=$3 k=$4
  "$q" encode "$g" --pages $((k - 1)) -o "$work/$name.cnf" 2>/dev/null
  cadical -q --no-binary "$work/$name.cnf" "$work/$name.drat" >/dev/null || [ $? -eq 20 ]
  "$q" bundle "$g" --"$bound" "$k" --name "$name" --subgraph off --solvers cadical,gini \
    --from-proof "$work/$name.drat" -o "$work/$name.b" >/dev/null
  local p b
  p=$(stat -c %s "$work/$name.drat")
  b=$(stat -c %s "$work/$name.b")
  printf '%-10s %-10s %12d %12d %7.1f%%\n' "$name" "$bound $k" "$p" "$b" "$(echo "100*$b/$p" | bc -l)"
}
one K7 testdata/bundles/k7.txt exact 4
one petersen testdata/bundles/petersen.txt exact 3
one kleetope "$work/kleetope.edges" at-least 3
