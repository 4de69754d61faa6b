# shellcheck shell=bash disable=SC2034 # the paths are used by the scripts that source this one
# Shared by scripts/cluster-up.sh and scripts/cluster-down.sh (sourced, not
# run): the paths of the single-node cluster and how a daemon is found and
# stopped. The caller defines say.

# The daemons live in /usr/sbin, which a non-login root shell may lack.
PATH=/usr/local/sbin:/usr/local/bin:/usr/sbin:/usr/bin:/sbin:/bin
export PATH

partition=spine
conf=/etc/slurm/slurm.conf
run_dir=/run/slurm
log_dir=/var/log/slurm
ctld_state=/var/spool/slurmctld
slurmd_spool=/var/spool/slurmd
ctld_pid=$run_dir/slurmctld.pid
slurmd_pid=$run_dir/slurmd.pid
munge_key=/etc/munge/munge.key
munge_pid=/run/munge/munged.pid

# live_pids NAME: pids of live (not zombie) processes whose command name is
# exactly NAME. Without systemd, pid 1 here may reap orphans late, so a
# stopped daemon can linger as a zombie for a few seconds; it does not count.
live_pids() {
	local pid state
	for pid in $(pgrep -x "$1" || true); do
		state=$(sed 's/^.*) //' "/proc/$pid/stat" 2>/dev/null | cut -c1)
		if [ -n "$state" ] && [ "$state" != Z ]; then echo "$pid"; fi
	done
	return 0
}

# stop NAME PIDFILE [quiet]: stop the daemon of that name (the one in its pid
# file and any stray copy whose pid file was lost, each by its pid): SIGTERM,
# up to 15 s, then SIGKILL. Says so, and says when it was not running unless
# quiet is given.
stop() {
	local name=$1 pidfile=$2 quiet=${3:-} pids pid i
	pids=$(live_pids "$name")
	if [ -z "$pids" ]; then
		rm -f "$pidfile"
		[ -n "$quiet" ] || say "$name is not running"
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
	sleep 0.2
	rm -f "$pidfile"
}
