#!/usr/bin/env bash
# Stops the single-node Slurm cluster that scripts/cluster-up.sh started:
# slurmd, slurmctld, then munged. Idempotent: daemons that are not running are
# skipped. Run it as root.
#
# Usage: scripts/cluster-down.sh [--purge]
#   --purge   first cancel every job, then, once stopped, delete slurmctld's
#             saved state, so that the next cluster-up starts with an empty
#             queue and job ids from 1
#
# Without --purge, queued jobs are kept in slurmctld's saved state and come
# back with the next cluster-up; tasks already running keep running under
# their slurmstepd and are picked up again by the next slurmd.
set -euo pipefail

# shellcheck source=scripts/cluster-lib.sh
. "$(dirname "$0")/cluster-lib.sh"

say() { echo "cluster-down: $*"; }
die() { echo "cluster-down: $*" >&2; exit 1; }

purge=0
for arg in "$@"; do
	case $arg in
	--purge) purge=1 ;;
	-h | --help) sed -n '2,/^set -euo/{/^#/s/^# \{0,1\}//p}' "$0"; exit 0 ;;
	*) die "unknown argument $arg (try --help)" ;;
	esac
done

[ "$(id -u)" -eq 0 ] || die "run me as root"

if [ "$purge" -eq 1 ] && [ -n "$(live_pids slurmctld)" ] && command -v squeue >/dev/null; then
	jobs=$(timeout 10 squeue -h -o %F 2>/dev/null | sort -u | tr '\n' ' ' || true)
	if [ -n "${jobs// /}" ]; then
		say "cancelling jobs $jobs"
		# shellcheck disable=SC2086 # one argument per job id
		scancel $jobs 2>/dev/null || true
		# Give slurmd a few seconds to kill the tasks.
		for ((i = 0; i < 50; i++)); do
			[ -z "$(timeout 10 squeue -h -o %F 2>/dev/null || true)" ] && break
			sleep 0.2
		done
	fi
fi

stop slurmd "$slurmd_pid"
stop slurmctld "$ctld_pid"
stop munged "$munge_pid"

if [ "$purge" -eq 1 ]; then
	say "removing the saved state in $ctld_state"
	find "$ctld_state" -mindepth 1 -delete 2>/dev/null || true
fi
say "stopped"
