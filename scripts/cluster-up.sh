#!/usr/bin/env bash
# Brings up a single-node Slurm cluster on this machine, for tests and for
# trying job arrays by hand: munged, slurmctld and slurmd, one node (this host)
# in one partition, "spine". Run it as root; it is idempotent (a second run
# finds the daemons healthy, leaves them alone and only re-runs the smoke test).
# No systemd is needed: the daemons are started directly and tracked by their
# pid files. Stop everything with scripts/cluster-down.sh.
#
# Usage: scripts/cluster-up.sh [--install] [--restart] [--no-test]
#   --install   apt-get install slurm-wlm and munge first, if missing
#   --restart   restart the three daemons even if they look healthy
#   --no-test   skip the smoke test (a 2-task job array)
#
# Written for Debian's slurm-wlm 22.05 (bookworm), which reads
# /etc/slurm/slurm.conf. Daemon logs go to /var/log/slurm/ and
# /var/log/munge/. Finished jobs stay visible to `squeue -t all` and
# `scontrol show job` for MinJobAge (300 s); there is no accounting database,
# so sacct does not work.
set -euo pipefail

# shellcheck source=scripts/cluster-lib.sh
. "$(dirname "$0")/cluster-lib.sh"
marker="# Written by cluster-up.sh"

say() { echo "cluster-up: $*"; }
die() { echo "cluster-up: $*" >&2; exit 1; }

install=0 restart=0 smoke=1
for arg in "$@"; do
	case $arg in
	--install) install=1 ;;
	--restart) restart=1 ;;
	--no-test) smoke=0 ;;
	-h | --help) sed -n '2,/^set -euo/{/^#/s/^# \{0,1\}//p}' "$0"; exit 0 ;;
	*) die "unknown argument $arg (try --help)" ;;
	esac
done

[ "$(id -u)" -eq 0 ] || die "run me as root"

# ---------------------------------------------------------------- packages
need=(slurmctld slurmd sbatch squeue sinfo scontrol munged munge unmunge)
missing() {
	local b p
	for b in "${need[@]}"; do
		p=$(command -v "$b" 2>/dev/null) || return 0
		[ -f "$p" ] && [ -x "$p" ] || return 0
	done
	return 1
}
if missing && [ "$install" -eq 1 ]; then
	say "installing slurm-wlm and munge"
	export DEBIAN_FRONTEND=noninteractive
	apt-get install -y slurm-wlm munge ||
		{ apt-get update && apt-get install -y slurm-wlm munge; }
fi
if missing; then
	echo "cluster-up: install Debian's slurm-wlm (apt-get install slurm-wlm)" >&2
	exit 1
fi

# ------------------------------------------------------------- processes
# alive PIDFILE NAME: the pid file names a live (not zombie) process called
# NAME. Without systemd, pid 1 here may reap orphans late, so a stopped daemon
# can linger as a zombie for a few seconds; it does not count.
alive() {
	local pid state
	[ -s "$1" ] || return 1
	pid=$(<"$1")
	case $pid in '' | *[!0-9]*) return 1 ;; esac
	[ "$(cat "/proc/$pid/comm" 2>/dev/null)" = "$2" ] || return 1
	state=$(sed 's/^.*) //' "/proc/$pid/stat" 2>/dev/null | cut -c1)
	[ -n "$state" ] && [ "$state" != Z ]
}

logs() {
	local f
	for f in "$log_dir/slurmctld.log" "$log_dir/slurmd.log" /var/log/munge/munged.log; do
		[ -f "$f" ] || continue
		echo "----- last lines of $f" >&2
		tail -n 25 "$f" >&2
	done
}
fail() {
	echo "cluster-up: FAILED: $*" >&2
	logs
	exit 1
}

# ----------------------------------------------------------------- munge
# Directories and key as Debian's munge package lays them out; munged checks
# their owners and modes and refuses to start if they are too open.
id munge >/dev/null 2>&1 || die "no munge user; reinstall munge (apt-get install --reinstall munge)"
install -d -o munge -g munge -m 0700 /etc/munge /var/log/munge
install -d -o munge -g munge -m 0711 /var/lib/munge
install -d -o munge -g munge -m 0755 /run/munge
if [ ! -s "$munge_key" ]; then
	say "creating $munge_key"
	mungekey --create --keyfile="$munge_key" 2>/dev/null ||
		dd if=/dev/urandom of="$munge_key" bs=1024 count=1 status=none
	restart_munge=1 # a running munged still holds the old key
fi
chown munge:munge "$munge_key"
chmod 0400 "$munge_key"

munge_ok() { munge -n 2>/dev/null | unmunge >/dev/null 2>&1; }
if [ "$restart" -eq 1 ] || [ -n "${restart_munge:-}" ] || ! alive "$munge_pid" munged || ! munge_ok; then
	stop munged "$munge_pid" quiet
	say "starting munged"
	# munged refuses to run as root without --force; run it as its own user.
	runuser -u munge -- munged || fail "munged did not start"
	for ((i = 0; i < 50; i++)); do munge_ok && break; sleep 0.1; done
fi
munge_ok || fail "munge -n | unmunge does not work"

# ----------------------------------------------------------- slurm.conf
host=$(hostname -s)
cpus=$(nproc)
mem_mb=$(awk '/^MemTotal:/ {print int($2 / 1024)}' /proc/meminfo)
# Leave a little memory to the system: 5 %, at least 256 MB.
reserve=$((mem_mb / 20 > 256 ? mem_mb / 20 : 256))
real_mem=$((mem_mb > reserve ? mem_mb - reserve : 1))

install -d -m 0755 /etc/slurm "$run_dir" "$log_dir" "$ctld_state" "$slurmd_spool"

new_conf=$(mktemp)
smoke_dir=
cleanup() { rm -f "$new_conf"; [ -z "$smoke_dir" ] || rm -rf "$smoke_dir"; }
trap cleanup EXIT

cat >"$new_conf" <<EOF
$marker for a single-node test cluster; each run
# rewrites this file (and restarts the daemons) if it differs.
ClusterName=spine
# Everything talks over the loopback address, whatever the host name resolves to.
SlurmctldHost=$host(127.0.0.1)
SlurmUser=root
SlurmdUser=root
AuthType=auth/munge
CredType=cred/munge
StateSaveLocation=$ctld_state
SlurmdSpoolDir=$slurmd_spool
SlurmctldPidFile=$ctld_pid
SlurmdPidFile=$slurmd_pid
SlurmctldLogFile=$log_dir/slurmctld.log
SlurmdLogFile=$log_dir/slurmd.log
SlurmctldDebug=info
SlurmdDebug=info
# No cgroups: track processes by parentage, bind nothing.
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
MpiDefault=none
SwitchType=switch/none
# Every CPU is a schedulable core: N one-CPU tasks run at once on N CPUs.
SelectType=select/cons_tres
SelectTypeParameters=CR_Core
SchedulerType=sched/backfill
# Schedule at once on submit and re-run the schedulers every second or two.
SchedulerParameters=batch_sched_delay=0,sched_interval=2,bf_interval=1
JobAcctGatherType=jobacct_gather/none
AccountingStorageType=accounting_storage/none
JobCompType=jobcomp/none
# No mail; the default mail program is not installed.
MailProg=/bin/true
# A node that was down comes back by itself once slurmd registers again.
ReturnToService=2
KillWait=2
# Finished jobs stay visible (squeue -t all, scontrol show job) for 300 s.
MinJobAge=300
MaxArraySize=100001
MaxJobCount=1000000
# Trust the node line below rather than what slurmd detects (no drain on a
# mismatch, e.g. hyperthreads).
SlurmdParameters=config_overrides
NodeName=$host NodeAddr=127.0.0.1 CPUs=$cpus Sockets=1 CoresPerSocket=$cpus ThreadsPerCore=1 RealMemory=$real_mem State=UNKNOWN
PartitionName=$partition Nodes=$host Default=YES MaxTime=INFINITE State=UP
EOF

conf_changed=0
if ! cmp -s "$new_conf" "$conf"; then
	# Keep a copy of a configuration someone else wrote.
	if [ -f "$conf" ] && ! grep -qF "$marker" "$conf"; then
		cp -p "$conf" "$conf.before-cluster-up"
		say "saved the existing $conf as $conf.before-cluster-up"
	fi
	install -m 0644 "$new_conf" "$conf"
	say "wrote $conf ($host, $cpus CPUs, RealMemory=$real_mem MB)"
	conf_changed=1
fi

# --------------------------------------------------------- slurm daemons
# Restart both daemons when the configuration or the munge key changed, or
# when asked to. (A restarted munged with the same key needs nothing more.)
if [ "$conf_changed" -eq 1 ] || [ -n "${restart_munge:-}" ] || [ "$restart" -eq 1 ]; then
	stop slurmd "$slurmd_pid" quiet
	stop slurmctld "$ctld_pid" quiet
fi

ctld_ok() { alive "$ctld_pid" slurmctld && timeout 10 scontrol ping 2>/dev/null | grep -q 'is UP'; }
if ! ctld_ok; then
	stop slurmctld "$ctld_pid" quiet
	say "starting slurmctld"
	# -i: a test cluster would rather lose unreadable state than not start.
	slurmctld -i || fail "slurmctld did not start"
	for ((i = 0; i < 100; i++)); do ctld_ok && break; sleep 0.2; done
	ctld_ok || fail "slurmctld does not answer scontrol ping"
	# A running slurmd would only re-register after a few seconds; a fresh one
	# registers at once. Running tasks survive this (they belong to slurmstepd).
	stop slurmd "$slurmd_pid" quiet
fi

start_slurmd() {
	stop slurmd "$slurmd_pid" quiet
	say "starting slurmd"
	slurmd -N "$host" || fail "slurmd did not start"
	for ((i = 0; i < 50; i++)); do alive "$slurmd_pid" slurmd && return 0; sleep 0.2; done
	fail "slurmd did not stay up"
}
alive "$slurmd_pid" slurmd || start_slurmd

# ------------------------------------------------------- wait for the node
# sinfo's %T is the long state; a trailing "*" means slurmd is not responding.
node_state() { timeout 10 sinfo -h -N -n "$host" -o %T 2>/dev/null | head -n 1; }
state=
slurmd_restarts=0
for ((t = 0; t < 60; t++)); do
	state=$(node_state)
	case $state in
	idle | mixed | allocated | completing) break ;;
	down | drained | draining | fail | failing)
		# Left down or drained by an earlier run (e.g. "Kill task failed").
		say "node $host is $state, resuming it"
		scontrol update nodename="$host" state=resume 2>/dev/null || true
		;;
	*)
		# Not (yet) registered: give slurmd time, restart it if it died.
		if ! alive "$slurmd_pid" slurmd || { [ "$t" -eq 30 ] && [ "$slurmd_restarts" -eq 0 ]; }; then
			slurmd_restarts=$((slurmd_restarts + 1))
			[ "$slurmd_restarts" -le 2 ] || fail "slurmd keeps dying"
			start_slurmd
		fi
		;;
	esac
	sleep 1
done
case $state in
idle | mixed | allocated | completing) ;;
*) fail "node $host is still '${state:-unknown}' after 60 s" ;;
esac

# ------------------------------------------------------------ smoke test
# A 2-task array; each task records when it started and ended. With 2 or more
# CPUs the two must run at the same time: each task waits (up to 15 s) for the
# other to start, and their time spans must overlap. sbatch --wait polls the
# job after 2 s, 10 s, 42 s, then every 32 s, so a quick job returns in ~2 s.
if [ "$smoke" -eq 1 ]; then
	wait_peer=$((cpus >= 2 ? 150 : 0))
	smoke_dir=$(mktemp -d /tmp/cluster-up.XXXXXX)
	chmod 0755 "$smoke_dir"
	cat >"$smoke_dir/task.sh" <<EOF
#!/bin/sh
i=\$SLURM_ARRAY_TASK_ID
start=\$(date +%s.%N)
: >"start.\$i"
n=0
while [ ! -e "start.\$((1 - i))" ] && [ \$n -lt $wait_peer ]; do sleep 0.1; n=\$((n + 1)); done
sleep 0.2
echo "\$start \$(date +%s.%N) \$(hostname -s)" >"task.\$i"
EOF
	say "smoke test: a 2-task job array"
	if ! timeout 120 sbatch --wait --parsable --array=0-1 --partition="$partition" \
		--job-name=cluster-up-smoke --chdir="$smoke_dir" \
		--output="$smoke_dir/slurm-%A_%a.out" "$smoke_dir/task.sh" \
		>"$smoke_dir/sbatch.out" 2>&1; then
		job=$(grep -m 1 -o '^[0-9][0-9]*' "$smoke_dir/sbatch.out" || true)
		cat "$smoke_dir/sbatch.out" >&2
		[ -z "$job" ] || scancel "$job" 2>/dev/null || true
		fail "smoke job ${job:-?} failed or did not finish within 120 s"
	fi
	for i in 0 1; do
		[ -s "$smoke_dir/task.$i" ] || {
			cat "$smoke_dir"/slurm-*.out >&2 2>/dev/null || true
			fail "smoke task $i wrote no output"
		}
	done
	if [ "$cpus" -ge 2 ] && ! awk 'NR == 1 {s0 = $1; e0 = $2} NR == 2 {s1 = $1; e1 = $2}
		END {exit !(s0 < e1 && s1 < e0)}' "$smoke_dir/task.0" "$smoke_dir/task.1"; then
		fail "the two smoke tasks did not run at the same time on $cpus CPUs"
	fi
fi

# The smoke tasks may leave the node "completing" for a moment.
for ((i = 0; i < 25; i++)); do
	state=$(node_state)
	[ "$state" = completing ] || break
	sleep 0.2
done
say "node $host $state, partition $partition, $cpus CPUs"
