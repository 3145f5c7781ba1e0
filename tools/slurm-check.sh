#!/usr/bin/env bash
# Outside CI: `terayee sweep --submit slurm` against a real single-node Slurm from Debian's
# packages (slurm-wlm, with munge for its authentication). Installs them when missing,
# writes a minimal slurm.conf for this one host (CPUs from nproc, memory from
# /proc/meminfo) and a munge key into a scratch folder, starts munged, slurmctld and slurmd
# there (as root, through sudo when not root), submits a three-point sweep of a tiny scene
# (the Airy slab, 20 ps) as a job array, waits for the array, runs `terayee sweep --collect`
# and checks that results.csv has every point, done. Stops the daemons and removes the
# scratch folder on exit (KEEP=1 keeps it, with the daemons' logs).
#   tools/slurm-check.sh            (TERAYEE_BIN picks another terayee program)
set -euo pipefail
root="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
bin="$(readlink -f "${TERAYEE_BIN:-$root/build/terayee}")"
[ -x "$bin" ] || { echo "build terayee first: $root/tools/setup.sh" >&2; exit 1; }
as_root=()
[ "$(id -u)" -eq 0 ] || as_root=(sudo)
need=()
command -v slurmctld > /dev/null || need+=(slurm-wlm)
command -v munged > /dev/null || need+=(munge)
if [ ${#need[@]} -gt 0 ]; then
  echo "installing ${need[*]}"
  "${as_root[@]}" env DEBIAN_FRONTEND=noninteractive apt-get install -y --no-install-recommends "${need[@]}" > /dev/null
fi

work="$(mktemp -d /tmp/terayee-slurm.XXXXXX)"
chmod 755 "$work"
pids=()
cleanup() {
  for p in "${pids[@]}"; do "${as_root[@]}" kill "$p" 2> /dev/null || true; done
  sleep 1
  if [ "${KEEP:-0}" = 1 ]; then echo "kept $work"; else "${as_root[@]}" rm -rf "$work"; fi
}
trap cleanup EXIT
fail() {
  echo "slurm-check: FAILED: $*" >&2
  for l in munged slurmctld slurmd; do
    [ -f "$work/$l.log" ] && { echo "--- $l.log (last lines)" >&2; tail -n 15 "$work/$l.log" >&2; }
  done
  exit 1
}

# munge: its own key, socket and files in the scratch folder (the system's munge untouched)
mkdir -p "$work/munge"
chmod 700 "$work/munge"
dd if=/dev/urandom of="$work/munge/munge.key" bs=1024 count=1 status=none
chmod 400 "$work/munge/munge.key"
"${as_root[@]}" chown -R root:root "$work/munge"
socket="$work/munge/munge.socket"
"${as_root[@]}" munged --foreground --force --key-file "$work/munge/munge.key" --socket "$socket" \
  --pid-file "$work/munge/munged.pid" --seed-file "$work/munge/munged.seed" --log-file "$work/munged.log" > /dev/null 2>&1 &
pids+=($!)
for _ in $(seq 50); do [ -S "$socket" ] && break; sleep 0.1; done
[ -S "$socket" ] || fail "munged did not start"

host="$(hostname -s)"
cpus="$(nproc)"
mem_mb=$(awk '/^MemTotal:/ { printf "%d", $2 / 1024 * 0.9 }' /proc/meminfo)
mkdir -p "$work/state" "$work/spool"
export SLURM_CONF="$work/slurm.conf"
cat > "$SLURM_CONF" << EOF
# a single-node Slurm for terayee's check (tools/slurm-check.sh)
ClusterName=terayee-check
SlurmctldHost=$host(127.0.0.1)
SlurmUser=root
SlurmdUser=root
SlurmctldPort=16817
SlurmdPort=16818
AuthType=auth/munge
CredType=cred/munge
AuthInfo=socket=$socket
StateSaveLocation=$work/state
SlurmdSpoolDir=$work/spool
SlurmctldPidFile=$work/slurmctld.pid
SlurmdPidFile=$work/slurmd.pid
SlurmctldLogFile=$work/slurmctld.log
SlurmdLogFile=$work/slurmd.log
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
JobAcctGatherType=jobacct_gather/none
AccountingStorageType=accounting_storage/none
SchedulerType=sched/backfill
SelectType=select/cons_tres
SelectTypeParameters=CR_CPU
ReturnToService=2
MpiDefault=none
NodeName=$host NodeAddr=127.0.0.1 CPUs=$cpus RealMemory=$mem_mb State=UNKNOWN
PartitionName=check Nodes=$host Default=YES MaxTime=INFINITE State=UP
EOF
"${as_root[@]}" env SLURM_CONF="$SLURM_CONF" slurmctld -D -i -f "$SLURM_CONF" > /dev/null 2>&1 &
pids+=($!)
"${as_root[@]}" env SLURM_CONF="$SLURM_CONF" slurmd -D -f "$SLURM_CONF" > /dev/null 2>&1 &
pids+=($!)
echo "slurm-check: $(slurmctld -V), one node '$host' with $cpus CPUs and $mem_mb MB"
for _ in $(seq 60); do
  state="$(sinfo -h -n "$host" -o %t 2> /dev/null || true)"
  [ "$state" = idle ] && break
  sleep 1
done
[ "$state" = idle ] || fail "the node did not come up idle (sinfo says '${state:-nothing}')"

dir="$work/sweep"
start=$(date +%s)
"${as_root[@]}" env SLURM_CONF="$SLURM_CONF" "$bin" sweep "$root/tests/data/slab-airy.yaml" -o "$dir" \
  --vary 'media.slab.permittivity=2:4:3' --set 'time.stop=20 ps' --measure 'spectrum --reference auto' \
  --threads 1 --time-limit 00:10:00 --submit slurm | tee "$work/submit.txt" || fail "terayee sweep --submit slurm"
job="$(grep -o 'Submitted batch job [0-9]*' "$work/submit.txt" | awk '{ print $4 }')"
[ -n "$job" ] || fail "no job id from sbatch"
echo "slurm-check: job array $job submitted; waiting for it"
for _ in $(seq 600); do
  [ -z "$(squeue -h -j "$job" 2> /dev/null)" ] && break
  sleep 1
done
[ -z "$(squeue -h -j "$job" 2> /dev/null)" ] || fail "the array $job still runs after 10 minutes"
tasks=$(ls "$dir"/slurm-"${job}"_*.out 2> /dev/null | wc -l)
echo "slurm-check: array $job ended after $(( $(date +%s) - start )) s ($tasks task outputs)"
"${as_root[@]}" "$bin" sweep --collect "$dir" 2> "$work/collect.txt" || { cat "$work/collect.txt" >&2; fail "--collect"; }
rows=$(tail -n +2 "$dir/results.csv" | wc -l)
done_rows=$(tail -n +2 "$dir/results.csv" | cut -d, -f2 | grep -c -x done || true)
[ "$tasks" -eq 3 ] || fail "expected 3 array task outputs, found $tasks"
[ "$rows" -eq 3 ] && [ "$done_rows" -eq 3 ] || { cat "$dir/results.csv" >&2; fail "results.csv: $done_rows of $rows rows done, 3 expected"; }
echo "slurm-check: passed: job $job, 3 of 3 points done in results.csv, $(( $(date +%s) - start )) s from submit to table"
