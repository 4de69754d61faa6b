#!/usr/bin/env bash
# Lower bounds at scale: "solve --pages 2" on Kleetopes of random stacked
# triangulations (internal/kleetopegen; maximal planar, not Hamiltonian, so
# 3 pages are needed), side by side in one run: the subgraph search, the
# whole default encoding, the on-demand formulation, and both levers. Each run is bounded in time and memory (a full encoding of a
# large graph can exceed the machine). A benchmark, not a test.
#
# Usage: scripts/scale.sh [SIZES...]   (triangulation sizes t; the Kleetope has 3t-4 vertices)
# Environment: LIMIT (seconds per run, default 600; LIMIT_OD for the on-demand
#              runs, default 120), MEM_KB (default 16 GiB),
#              SOLVERS (default: spinecert's default, auto).
set -euo pipefail
cd "$(dirname "$0")/.."
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
go build -o "$work/spinecert" ./cmd/spinecert
go build -o "$work/kgen" ./internal/kleetopegen
limit=${LIMIT:-600}
mem=${MEM_KB:-16777216}
solvers=()
[ -n "${SOLVERS:-}" ] && solvers=(--solvers "$SOLVERS")
sizes=("$@")
[ ${#sizes[@]} -gt 0 ] || sizes=(20 40 70 135 335 1335)

run() { # label, args...
  local label=$1; shift
  local out rc
  set +e
  out=$( (ulimit -v "$mem"; /usr/bin/time -f "TIME %e %M" timeout "$limit" "$work/spinecert" "$@") 2>&1)
  rc=$?
  set -e
  local t kb verdict sub
  t=$(echo "$out" | awk '/^TIME/{print $2}')
  kb=$(echo "$out" | awk '/^TIME/{print $3}')
  verdict=$(echo "$out" | grep -m1 -E '^(no |undecided|SOLVERS|[0-9]+-page)' || echo "no verdict (exit $rc)")
  sub=$(echo "$out" | grep -o -m1 'subgraph of this one ([0-9]* of [0-9]* vertices, [0-9]* of [0-9]* edges' | sed 's/subgraph of this one (//' || true)
  enc=$(echo "$out" | grep -m1 -o 'encoding: [0-9]* variables, [0-9]* clauses' | sed 's/encoding: //' || true)
  printf '  %-9s exit %-3s %8s s %8s MB  %s | %s | %s\n' "$label" "$rc" "${t:--}" "$(( ${kb:-0} / 1024 ))" "$verdict" "${enc:-}" "${sub:-whole graph}"
}

for t in "${sizes[@]}"; do
  g="$work/k$t.edges"
  "$work/kgen" -t "$t" -o "$g" -count 2>&1 | sed 's/^/  /'
  echo "== Kleetope from t=$t: $(( 3 * t - 4 )) vertices"
  run subgraph solve --quiet "$g" --pages 2 --subgraph on "${solvers[@]}"
  run full solve --quiet "$g" --pages 2 --subgraph off "${solvers[@]}"
  LIMIT_SAVE=$limit; limit=${LIMIT_OD:-120}
  run on-demand solve --quiet "$g" --pages 2 --subgraph off --formula on-demand "${solvers[@]}"
  run both solve --quiet "$g" --pages 2 --subgraph on --formula on-demand "${solvers[@]}"
  limit=$LIMIT_SAVE
done
