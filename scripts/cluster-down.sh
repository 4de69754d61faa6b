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

PATH=/usr/local/sbin:/usr/local/bin:/usr/sbin:/usr/bin:/sbin:/bin
export PATH

# The same paths as in cluster-up.sh.
ctld_state=/var/spool/slurmctld
ctld_pid=/run/slurm/slurmctld.pid
slurmd_pid=/run/slurm/slurmd.pid
munge_pid=/run/munge/munged.pid

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

# live_pids NAME: pids of live (not zombie) processes whose command name is
# exactly NAME. Without systemd, pid 1 may reap orphans late.
live_pids() {
	local pid state
	for pid in $(pgrep -x "$1" || true); do
		state=$(sed 's/^.*) //' "/proc/$pid/stat" 2>/dev/null | cut -c1)
		if [ -n "$state" ] && [ "$state" != Z ]; then echo "$pid"; fi
	done
	return 0
}

# stop NAME PIDFILE: stop the daemon of that name (normally the one in its pid
# file; also a copy whose pid file was lost), each by its pid: SIGTERM, up to
# 15 s, then SIGKILL.
stop() {
	local name=$1 pidfile=$2 pids pid i
	pids=$(live_pids "$name")
	if [ -z "$pids" ]; then
		rm -f "$pidfile"
		say "$name is not running"
		return 0
	fi
	say "stopping $name (pid $(echo "$pids" | tr '\n' ' ' | sed 's/ $//'))"
	# SIGCONT too, in case a daemon was stopped (SIGSTOP) and hangs.
	for pid in $pids; do { kill -TERM "$pid"; kill -CONT "$pid"; } 2>/dev/null || true; done
	for ((i = 0; i < 75; i++)); do
		[ -n "$(live_pids "$name")" ] || break
		sleep 0.2
	done
	for pid in $(live_pids "$name"); do
		say "$name (pid $pid) ignored SIGTERM, killing it"
		kill -KILL "$pid" 2>/dev/null || true
	done
	rm -f "$pidfile"
}

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
