#!/bin/bash
# The cluster recipe of the README, run under a real Slurm: starts a one-node cluster on this
# machine (munged, slurmctld and slurmd on localhost, configured in a temporary folder), runs a
# campaign through resources/cluster/slurm-campaign with one shard made to fail, checks that
# the merge job names that shard and that a resubmission runs it alone, then checks that the
# merged result equals one `disperse` run of the same seed (every case's draws, figures and
# landing point, number for number, and the summary with its landing ellipse byte for byte). The daemons it started
# are stopped by their process ids whatever the outcome.
#
#   test_slurm_campaign.sh DESCENT_SIZER SLURM_CAMPAIGN DESIGN [RUNS] [SHARDS]
#
# Exits 77 (CTest's skip) where Slurm or MUNGE is not installed or the user is not root (slurmd
# runs jobs as their user, so it must be root); with DESCENT_SIZER_REQUIRE_CLUSTER=1 (as CI
# sets it) that is a failure instead.
set -euo pipefail

program=$(realpath "$1")
campaign_script=$(realpath "$2")
design=$(realpath "$3")
runs=${4:-3000}
shards=${5:-8}
seed=19
failing_shard=3
timeout_s=300

skip() {
    if [[ ${DESCENT_SIZER_REQUIRE_CLUSTER:-0} == 1 ]]; then
        echo "FAILED (DESCENT_SIZER_REQUIRE_CLUSTER=1): $*"
        exit 1
    fi
    echo "SKIPPED: $*"
    exit 77
}
for tool in munged slurmctld slurmd sbatch squeue scontrol sinfo scancel; do
    command -v "$tool" >/dev/null 2>&1 || PATH=$PATH:/usr/sbin:/sbin
    command -v "$tool" >/dev/null 2>&1 ||
        skip "$tool not found (Debian 12: apt-get install slurmctld slurmd slurm-client munge)"
done
[[ $(id -u) -eq 0 ]] || skip "the one-node cluster runs slurmd, which needs root"

work=$(mktemp -d /tmp/descent-slurm-test.XXXXXX)
chmod 755 "$work"
pids=()
passed=0

stop_all() {
    local pid i
    if ((!passed)) && [[ -n ${folder-} && -f $folder/jobs ]]; then
        awk '{print $2}' "$folder/jobs" | xargs -r scancel 2>/dev/null || true
    fi
    # The daemons, newest first, by the ids recorded when they started.
    for ((i = ${#pids[@]} - 1; i >= 0; --i)); do
        pid=${pids[i]}
        kill -TERM "$pid" 2>/dev/null || continue
        for _ in $(seq 50); do
            kill -0 "$pid" 2>/dev/null || break
            sleep 0.1
        done
        kill -KILL "$pid" 2>/dev/null || true
        wait "$pid" 2>/dev/null || true
    done
    if ((passed)); then
        rm -rf "$work"
    else
        for log in "$work"/log/* "$work"/*/logs/*.log; do
            [[ -f $log ]] && { echo "--- $log"; tail -n 20 "$log"; }
        done
        echo "the test's folder is kept: $work"
    fi
}
trap stop_all EXIT
trap 'exit 1' INT TERM

fail() {
    echo "FAILED: $*"
    exit 1
}

# Waits, at most until the deadline and while every daemon started lives, for a command to
# succeed.
deadline=$((SECONDS + timeout_s))
wait_for() {
    local what=$1 pid
    shift
    until "$@"; do
        ((SECONDS < deadline)) || fail "timed out waiting for $what"
        for pid in "${pids[@]}"; do
            kill -0 "$pid" 2>/dev/null || fail "a daemon (pid $pid) exited while waiting for $what"
        done
        sleep 0.2
    done
}

# A TCP port nothing listens on (bash's /dev/tcp connects when something does).
free_port() {
    local port
    for _ in $(seq 100); do
        port=$((20000 + RANDOM % 12000)) # below Linux's ephemeral ports (32768 up)
        if ! (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then
            echo "$port"
            return
        fi
    done
    fail "no free port found"
}

mkdir -p "$work"/{munge,munge-key,log,spool,state}
chmod 700 "$work/munge-key"

# MUNGE, with its own key (readable by root alone) and socket (in a folder all may enter, as
# munged requires).
dd if=/dev/urandom of="$work/munge-key/munge.key" bs=1024 count=1 status=none
chmod 400 "$work/munge-key/munge.key"
socket=$work/munge/munge.socket
munged --foreground --socket="$socket" --key-file="$work/munge-key/munge.key" \
    --pid-file="$work/munge/munged.pid" --log-file="$work/log/munged.log" \
    --seed-file="$work/munge-key/munged.seed" >>"$work/log/munged.out" 2>&1 &
pids+=($!)
wait_for "munged's socket" test -S "$socket"

ctld_port=$(free_port)
slurmd_port=$(free_port)
while [[ $slurmd_port == "$ctld_port" ]]; do slurmd_port=$(free_port); done
export SLURM_CONF=$work/slurm.conf
cat >"$SLURM_CONF" <<EOF
# A one-node cluster for the test, on this machine (no cgroups: it may run in a container).
ClusterName=descent-test
SlurmctldHost=localhost(127.0.0.1)
SlurmctldPort=$ctld_port
SlurmdPort=$slurmd_port
SlurmUser=root
SlurmdUser=root
AuthType=auth/munge
CredType=cred/munge
AuthInfo=socket=$socket
StateSaveLocation=$work/state
SlurmdSpoolDir=$work/spool
SlurmctldPidFile=$work/slurmctld.pid
SlurmdPidFile=$work/slurmd.pid
SlurmctldLogFile=$work/log/slurmctld.log
SlurmdLogFile=$work/log/slurmd.log
ProctrackType=proctrack/linuxproc
TaskPlugin=task/none
JobAcctGatherType=jobacct_gather/none
AccountingStorageType=accounting_storage/none
JobCompType=jobcomp/none
MpiDefault=none
SchedulerType=sched/builtin
SelectType=select/cons_tres
SelectTypeParameters=CR_CPU
SlurmdParameters=config_overrides
ReturnToService=2
MinJobAge=600
NodeName=localhost NodeAddr=127.0.0.1 CPUs=8 RealMemory=1000 State=UNKNOWN
PartitionName=debug Nodes=localhost Default=YES MaxTime=INFINITE State=UP
EOF

slurmctld -D -f "$SLURM_CONF" >>"$work/log/slurmctld.out" 2>&1 &
pids+=($!)
slurmd -D -N localhost -f "$SLURM_CONF" >>"$work/log/slurmd.out" 2>&1 &
pids+=($!)
node_idle() { [[ $(sinfo --noheader --nodes=localhost --format=%t 2>/dev/null) == idle ]]; }
wait_for "the node to come up idle" node_idle
echo "one-node cluster up: slurmctld on port $ctld_port, slurmd on $slurmd_port"

# The same campaign in one run, to compare with.
"$program" disperse "$design" --runs "$runs" --seed "$seed" --json >"$work/single.json"
"$program" disperse "$design" --runs "$runs" --seed "$seed" >"$work/single.txt"

# The program the shards run: descent-sizer, except that shard $failing_shard fails the first
# time (a node lost, a time limit hit).
cat >"$work/flaky-sizer" <<EOF
#!/bin/bash
if [[ " \$* " == *" --shard $failing_shard/$shards "* && ! -e $work/failed-once ]]; then
    touch $work/failed-once
    echo "shard $failing_shard made to fail by the test" >&2
    exit 1
fi
exec $program "\$@"
EOF
chmod +x "$work/flaky-sizer"

# The campaign's folder, as `start` names it in the current directory.
folder=$work/$(basename "$design" .json)-$runs-runs-seed-$seed
# Waits for the campaign's latest merge job to end; its final state in `state`.
merge_ended() {
    state=$(scontrol --oneliner show job "$merge_job" | grep -o 'JobState=[A-Z_]*' | cut -d= -f2)
    [[ -n $state && $state != PENDING && $state != RUNNING && $state != CONFIGURING &&
        $state != COMPLETING ]]
}
wait_merge() {
    merge_job=$(awk '$1 == "merge" {id = $2} END {print id}' "$folder/jobs")
    wait_for "merge job $merge_job" merge_ended
}

began=$SECONDS
(cd "$work" && "$campaign_script" start "$design" --runs "$runs" --seed "$seed" \
    --shards "$shards" --program "$work/flaky-sizer" -- --time=10)
[[ -f $folder/campaign.conf ]] || fail "no campaign folder $folder"
wait_merge
[[ $state == FAILED ]] || fail "the merge job should fail with shard $failing_shard missing: $state"
[[ $(cat "$folder/missing.txt") == "$failing_shard" ]] ||
    fail "missing.txt should name shard $failing_shard alone: $(cat "$folder/missing.txt")"
grep -q "shards without a part (failed or never run): $failing_shard\$" "$folder"/logs/merge.*.log ||
    fail "the merge job's log should name shard $failing_shard"
[[ ! -e $folder/merged.json ]] || fail "merged.json written with a shard missing"
"$campaign_script" status "$folder" | grep -qx "shards without a part: $failing_shard" ||
    fail "status should name shard $failing_shard: $("$campaign_script" status "$folder")"
echo "the merge job reported shard $failing_shard missing ($((SECONDS - began)) s)"

"$campaign_script" resubmit "$folder"
[[ $(awk '$1 == "shards" {a = $3} END {print a}' "$folder/jobs") == "$failing_shard" ]] ||
    fail "the resubmission should run shard $failing_shard alone"
wait_merge
[[ $state == COMPLETED ]] || fail "the second merge job ended $state"
scontrol --oneliner show job "$merge_job" | grep -q 'TimeLimit=00:10:00' ||
    fail "the resubmission should keep the campaign's sbatch options (--time=10)"
logs=("$folder"/logs/shard-*.log)
((${#logs[@]} == shards + 1)) || fail "expected $((shards + 1)) shard logs, found ${#logs[@]}"
"$campaign_script" status "$folder" | grep -qx "every shard has its part" ||
    fail "status should find every part: $("$campaign_script" status "$folder")"
echo "the resubmitted shard and the merge ran ($((SECONDS - began)) s)"

# merge writes the cases shard by shard (it reads one part after the other, holding none):
# in the order of their index, and but for the digest of the rows as written, merged.json is
# the single run's, number for number.
same_campaign() {
    python3 - "$1" "$2" <<'PYTHON'
import json, sys
single, merged = (json.load(open(path)) for path in sys.argv[1:3])
for document in (single, merged):
    document["campaign"]["cases"].sort(key=lambda case: case["index"])
    del document["campaign"]["cases_digest"]
sys.exit(0 if single == merged else 1)
PYTHON
}
same_campaign "$work/single.json" "$folder/merged.json" ||
    fail "merged.json differs from one disperse run: $(diff <(jq -S . "$work/single.json") \
        <(jq -S . "$folder/merged.json") 2>/dev/null | head -n 20)"
cmp "$work/single.txt" "$folder/summary.txt" ||
    fail "summary.txt differs from one disperse run: $(diff "$work/single.txt" "$folder/summary.txt")"
echo "merged.json's cases and summary.txt equal one disperse run of $runs cases, seed $seed"
passed=1
