#!/usr/bin/env bash
# Cube and conquer against the monolithic solve, side by side in one run.
# A benchmark, not a test: run it on a quiet machine (2 cores were assumed
# when the defaults were chosen; every figure is wall or CPU seconds).
#
#  1. per claim: the monolithic CPU time of cadical alone and of the pair of
#     backends a cube runs (cadical then cryptominisat, one after another),
#     then for every cube count and split rule: the split's wall time, the
#     sum of cpu_seconds over results/*.json, that sum over the monolithic
#     pair (the overhead ratio), the largest single cube, the cubes done and
#     the cubes unit propagation already refuted at split time;
#  2. conquer --local --jobs 2 against --jobs 1 on fresh copies of one work
#     directory (SPEEDUP_CLAIM, 64 cubes, lookahead);
#  3. what gather and verify spend per cube besides checking proofs, on a job
#     of many tiny cubes (TINY_CUBES cubes of K8 at 3 pages, --no-twins).
#
# Claims (CLAIMS, space separated):
#   kT     the Kleetope of a random stacked triangulation of T vertices
#          (internal/kleetopegen, 3T-4 vertices, seed 1) at 2 pages, with
#          --subgraph off; it needs 3 pages (Bernhart and Kainen 1979)
#   KnPpT  the complete graph K_n at p pages with --no-twins; K_n needs
#          ceil(n/2) pages for n >= 4 (Bernhart and Kainen 1979)
#   KnPp   the same without --no-twins
#
# Usage: scripts/cubes.sh
# Environment: CLAIMS (default "k70 k135 K9P4T"), CUBES (default
#              "16 64 256"), RULES (default "occurrence lookahead"),
#              JOBS (conquer --jobs of the table, default 2),
#              SPEEDUP_CLAIM (default: the first claim), TINY_CUBES (default 240),
#              LIMIT (seconds per command, default 900), MEM_KB (ulimit -v,
#              default 16 GiB). A run that hits a limit is reported as such.
set -euo pipefail
cd "$(dirname "$0")/.."
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
go build -o "$work/spinecert" ./cmd/spinecert
go build -o "$work/kgen" ./internal/kleetopegen
sc=$work/spinecert
limit=${LIMIT:-900}
mem=${MEM_KB:-16777216}
read -r -a claims <<<"${CLAIMS:-k70 k135 K9P4T}"
read -r -a cubes <<<"${CUBES:-16 64 256}"
read -r -a rules <<<"${RULES:-occurrence lookahead}"
jobs=${JOBS:-2}
speedup=${SPEEDUP_CLAIM:-${claims[0]}}
tiny=${TINY_CUBES:-240}
solvers=(--solvers cadical,cryptominisat)
for tool in cadical cryptominisat5 python3; do
  command -v "$tool" >/dev/null || { echo "cubes.sh: $tool is not on PATH" >&2; exit 2; }
done

# timed OUT CMD...: runs CMD under the limits with its output in OUT.log;
# sets rc, wall and cpu (user+system seconds of CMD and its children).
timed() {
  local out=$1
  shift
  rc=0
  (ulimit -v "$mem" && exec /usr/bin/time -f 'TIME %e %U %S %M' -o "$out.time" timeout "$limit" "$@") >"$out.log" 2>&1 || rc=$?
  wall=$(awk '/^TIME/{print $2}' "$out.time")
  cpu=$(awk '/^TIME/{printf "%.2f", $3 + $4}' "$out.time")
  peak=$(awk '/^TIME/{printf "%d", $5 / 1024}' "$out.time")
}

# why: a note for a run that did not end as expected (rc codes of timeout,
# the solvers' 20 for UNSAT, spinecert's 0).
why() {
  case $rc in
  124) echo "time limit (${limit}s)" ;;
  *) echo "exit $rc$(grep -q -i -E 'memory|alloc' "$1.log" && echo ', out of memory' || true)" ;;
  esac
}

# claim LABEL: sets graph, pages, flags (split options) and encflags
# (encode options) of a claim.
claim() {
  local l=$1
  case $l in
  k[0-9]*)
    graph=$work/$l.edges pages=2 flags=(--subgraph off) encflags=()
    [ -f "$graph" ] || "$work/kgen" -t "${l#k}" -o "$graph" 2>/dev/null
    ;;
  K[0-9]*P[0-9]*)
    local n=${l#K}
    n=${n%%P*}
    pages=${l#*P}
    flags=() encflags=()
    case $pages in *T) pages=${pages%T} flags=(--no-twins) encflags=(--no-twins) ;; esac
    graph=$work/K$n.edges
    [ -f "$graph" ] || python3 -c "import sys; n=int(sys.argv[1]); print('\n'.join(f'{i} {j}' for i in range(n) for j in range(i+1, n)))" "$n" >"$graph"
    ;;
  *) echo "cubes.sh: unknown claim $l (kT, KnPp or KnPpT)" >&2; exit 2 ;;
  esac
}

# sums DIR: "sum max done" of cpu_seconds over DIR/results/*.json.
sums() {
  python3 - "$1" <<'EOF'
import glob, json, sys
cpu = [json.load(open(f))["cpu_seconds"] for f in glob.glob(sys.argv[1] + "/results/[0-9]*.json")]
print(f"{sum(cpu):.2f} {max(cpu, default=0):.2f} {len(cpu)}")
EOF
}

ratio() { awk -v a="$1" -v b="$2" 'BEGIN { if (b > 0) printf "%.2f", a / b; else print "-" }'; }

echo "# machine: $(nproc) CPUs, load $(cut -d' ' -f1-3 /proc/loadavg) at start; cadical $(cadical --version), cryptominisat $(cryptominisat5 --version | sed -n 's/^c CryptoMiniSat version //p')"
echo "# CPU seconds are user+system; 'pair' is cadical then cryptominisat on the whole CNF (what every cube runs)"
declare -A jobs2wall
for l in "${claims[@]}"; do
  claim "$l"
  cnf=$work/$l.cnf
  timed "$work/$l.enc" "$sc" encode "$graph" --pages "$pages" "${encflags[@]}" -o "$cnf"
  if [ "$rc" -ne 0 ]; then
    echo "== $l: encoding failed: $(why "$work/$l.enc")"
    continue
  fi
  size=$(grep -m1 '^p cnf' "$cnf")
  # Monolithic: the argument lists spinecert gives the two programs
  # (verify/solver_known.go, verify/backend_cryptominisat.go); cadical
  # writes its binary DRAT proof, as it does for every cube.
  timed "$work/$l.cad" cadical -q "$cnf" "$work/$l.drat"
  cad=$cpu cadnote=""
  [ "$rc" -eq 20 ] || cadnote=" ($(why "$work/$l.cad"))"
  rm -f "$work/$l.drat"
  timed "$work/$l.cms" cryptominisat5 --verb 0 --threads 1 "$cnf"
  cms=$cpu cmsnote=""
  [ "$rc" -eq 20 ] || cmsnote=" ($(why "$work/$l.cms"))"
  pair=$(awk -v a="$cad" -v b="$cms" 'BEGIN { printf "%.2f", a + b }')
  rm -f "$cnf"
  echo
  echo "== $l: $(wc -l <"$graph") edges, ${pages} pages ${flags[*]}, $size"
  echo "   monolithic CPU: cadical $cad s$cadnote, cryptominisat $cms s$cmsnote, pair $pair s"
  printf '   %-6s %-10s %8s %10s %8s %8s %9s %10s %9s %7s  %s\n' cubes rule split-s sum-cpu-s /pair /cadical max-cube done up-closed wall-s note
  for n in "${cubes[@]}"; do
    for r in "${rules[@]}"; do
      d=$work/$l-$n-$r
      timed "$d.split" "$sc" split "$graph" --pages "$pages" "${flags[@]}" --cubes "$n" --rule "$r" -o "$d" --quiet
      if [ "$rc" -ne 0 ]; then
        printf '   %-6s %-10s %8s  split: %s\n' "$n" "$r" "$wall" "$(why "$d.split")"
        continue
      fi
      splitwall=$wall
      closed=$(grep -o -m1 '[0-9]* cubes already refuted by unit propagation' "$d.split.log" | cut -d' ' -f1 || true)
      [ "$l" = "$speedup" ] && [ "$n" = 64 ] && [ "$r" = lookahead ] && cp -a "$d" "$work/speedup-fresh"
      timed "$d.conq" "$sc" conquer "$d" --local --jobs "$jobs" "${solvers[@]}" --quiet
      note=""
      [ "$rc" -eq 0 ] || note=$(why "$d.conq")
      [ "$l" = "$speedup" ] && [ "$n" = 64 ] && [ "$r" = lookahead ] && jobs2wall[$l]=$wall
      read -r sum mx done <<<"$(sums "$d")"
      printf '   %-6s %-10s %8s %10s %8s %8s %9s %6s/%-3s %7s %7s  %s\n' "$n" "$r" "$splitwall" "$sum" "$(ratio "$sum" "$pair")" "$(ratio "$sum" "$cad")" "$mx" "$done" "$(grep -c '^a' "$d/cubes.txt")" "${closed:--}" "$wall" "$note"
      rm -rf "$d"
    done
  done
done

echo
echo "== speed-up of conquer --local on $speedup, 64 cubes, lookahead (fresh copies of one split)"
if [ -d "$work/speedup-fresh" ]; then
  if [ "$jobs" = 2 ] && [ -n "${jobs2wall[$speedup]:-}" ]; then
    w2=${jobs2wall[$speedup]} # the table's run above
  else
    cp -a "$work/speedup-fresh" "$work/speedup-2"
    timed "$work/speedup-2" "$sc" conquer "$work/speedup-2" --local --jobs 2 "${solvers[@]}" --quiet
    w2=$wall
  fi
  timed "$work/speedup-1" "$sc" conquer "$work/speedup-fresh" --local --jobs 1 "${solvers[@]}" --quiet
  note=""
  [ "$rc" -eq 0 ] || note=" ($(why "$work/speedup-1"))"
  echo "   --jobs 1: $wall s$note   --jobs 2: $w2 s   speed-up: $(ratio "$wall" "$w2")"
  rm -rf "$work/speedup-fresh" "$work/speedup-2"
else
  echo "   not run: $speedup at 64 cubes with lookahead is not in the table (CLAIMS, CUBES, RULES)"
fi

# 3. Gather and verify beside proof checking. verify --json reports one
# time per bundle, not per cube, so the proof work is measured apart: every
# cube's formula (the CNF with the cube's literals as units, as conquer
# builds it) and proof are checked by "spinecert proof" (the same DRAT
# checker, --lrat writes the LRAT the bundle check re-checks) and the LRAT
# by a second "spinecert proof". Those runs include a process start and a
# CNF parse each; the same two runs with a missing proof (start, parse, an
# error) are timed too and subtracted, which leaves an estimate P of the
# proof work, and (gather - P)/cubes estimates what gather spends per cube
# besides checking proofs; gather/cubes is an upper bound. All at --jobs 1.
echo
echo "== gather and verify per cube beside proof checks: K8 at 3 pages --no-twins, $tiny cubes, --jobs 1"
claim K8P3T
t=$work/tiny
timed "$t.split" "$sc" split "$graph" --pages 3 --no-twins --cubes "$tiny" -o "$t" --quiet
timed "$t.conq" "$sc" conquer "$t" --local --jobs "$jobs" "${solvers[@]}" --quiet
ncubes=$(grep -c '^a' "$t/cubes.txt")
timed "$t.gather" "$sc" gather "$t" -o "$t.spinecert.tar.zst" --jobs 1 "${solvers[@]}" --quiet
gw=$wall
[ "$rc" -eq 0 ] || { echo "   gather: $(why "$t.gather")"; exit 1; }
timed "$t.verify" "$sc" verify "$t.spinecert.tar.zst" --jobs 1 --json --quiet
vw=$wall
if [ "$rc" -ne 0 ]; then
  echo "   verify: $(why "$t.verify"): $(python3 -c 'import json, sys; print("; ".join(c["detail"] for b in json.load(open(sys.argv[1]))["bundles"] for c in b.get("checks", []) if c["status"] != "pass"))' "$t.verify.log" 2>/dev/null || true)"
  exit 1
fi
python3 - "$t" >"$t.list" <<'EOF'
import glob, json, sys
d = sys.argv[1]
cnf = [l for l in open(d + "/formula.cnf") if not l.startswith("c")]
head, body = cnf[0].split(), cnf[1:]
cubes = [l.split()[1:-1] for l in open(d + "/cubes.txt") if l.startswith("a")]
for f in sorted(glob.glob(d + "/results/[0-9]*.json")):
    r = json.load(open(f))
    i = r["cube"]
    c = cubes[i - 1]
    out = f"{d}/cube-{i}.cnf"
    with open(out, "w") as w:
        w.write(f"p cnf {head[2]} {int(head[3]) + len(c)}\n")
        w.writelines(body)
        w.writelines(f"{l} 0\n" for l in c)
    print(out, f"{d}/results/{r['proof']['file']}", f"{d}/cube-{i}.lrat")
EOF
start=$(date +%s.%N)
while read -r f p lr; do
  "$sc" proof "$f" "$p" --lrat "$lr" >/dev/null 2>&1
  "$sc" proof "$f" "$lr" >/dev/null 2>&1
done <"$t.list"
pw=$(awk -v a="$start" -v b="$(date +%s.%N)" 'BEGIN { printf "%.2f", b - a }')
# The same two process starts and CNF parses per cube with a missing proof:
# the part of P that is not proof work.
start=$(date +%s.%N)
while read -r f p lr; do
  "$sc" proof "$f" "$t/missing" >/dev/null 2>&1 || true
  "$sc" proof "$f" "$t/missing" >/dev/null 2>&1 || true
done <"$t.list"
bw=$(awk -v a="$start" -v b="$(date +%s.%N)" 'BEGIN { printf "%.2f", b - a }')
pw=$(awk -v a="$pw" -v b="$bw" 'BEGIN { printf "%.2f", a - b }')
per() { awk -v a="$1" -v b="$2" -v n="$ncubes" 'BEGIN { printf "%.2f", 1000 * (a - b) / n }'; }
echo "   cubes $ncubes; proof checks apart, less $bw s of process starts and parses: P = $pw s, $(per "$pw" 0) ms per cube"
echo "   gather: $gw s = $(per "$gw" 0) ms per cube; beside proof checks about $(per "$gw" "$pw") ms per cube"
echo "   verify: $vw s = $(per "$vw" 0) ms per cube; beside proof checks about $(per "$vw" "$pw") ms per cube"
echo "# load at end: $(cut -d' ' -f1-3 /proc/loadavg)"
