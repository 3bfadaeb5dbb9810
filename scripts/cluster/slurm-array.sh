#!/usr/bin/env bash
# Sharded runs on a Slurm cluster: one shard per array task, then a merge job that waits for the whole array.
# Submit from a checkout where `npm ci` has been run:
#
#   SPEC="bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2" SHARDS=16 ITERATIONS=200000 scripts/cluster/slurm-array.sh
#   COMMAND=distance METHOD=isd SPEC=... SHARDS=16 ITERATIONS=2000000 scripts/cluster/slurm-array.sh
#   COMMAND=trial SPEC=... P=0.001,0.002,0.004 SHOTS=10000000 SHARDS=32 scripts/cluster/slurm-array.sh
#
# Every shard runs the same command with --shard I/N, so together they do exactly the work of one run with the
# same seed and options (search: the chunks of one search; trial: the shot batches of every point; distance:
# the chunks of one fixed plan, which `distance --shard 0/1` runs in one process). `overcheck merge` checks that
# the shards belong together and combines them exactly: union of words / lightest word, summed iterations,
# shots and failures, recomputed counts, bounds, miss probabilities, rates and intervals.
# Search shards also stream their words to their own --out file: a search shard that was killed (time limit,
# pre-emption) can be rerun with --resume shard-I.jsonl (without --shard) to finish it. A distance or trial
# shard journals every finished chunk or batch to shard-I.journal.jsonl (--checkpoint), so the same command
# run again (Slurm's --requeue after a pre-emption, or `scontrol requeue`) replays the journal and finishes
# with exactly its uninterrupted result. A shard stopped for good by SIGTERM prints the part it finished
# (exit 130); merge with afterany to see what the finished part proves (the merged result says what is missing).
#
# Environment (all optional except SPEC):
#   COMMAND     search, distance or trial (default search)
#   SPEC        family spec of the code (or set CODE_ARGS="--hx hx.mtx --hz hz.mtx")
#   SHARDS      number of array tasks (default 8)
#   SEED        seed shared by every shard (default 1)
#   OUTDIR      where shard and merged results go (default ./overcheck-shards)
#   CPUS        cores per task, also --workers (default 2)
#   TIME        Slurm time limit per task (default 02:00:00)
#   EXTRA       further options passed to every shard as they are (e.g. "--decoder bp4 --osd cs:7")
# search:
#   SIDE        x, z or both (default both)
#   MAXW        --max-weight (default: the code's row weight)
#   ITERATIONS  total information sets for the whole array (default: enough for --target-miss)
#   TARGET      --target-miss when ITERATIONS is not set (default 1e-6)
# distance:
#   SIDE        x, z or both (default both)
#   METHOD      --method auto, isd, certify or exhaustive (default isd)
#   ITERATIONS  total information sets of the fixed plan (default: enough for --target-miss)
#   TARGET      --target-miss (default: the command's)
# trial:
#   P           --p, comma-separated physical error rates (required)
#   SHOTS       --shots per point for the whole array (default 100000)
#   BATCH       --batch shots per numbered batch (default 256)
#   FAILURES    --failures (split per shard: the merged counts are then not those of one run, marked so)
set -euo pipefail

: "${COMMAND:=search}" "${SHARDS:=8}" "${SIDE:=both}" "${SEED:=1}" "${OUTDIR:=./overcheck-shards}" "${CPUS:=2}" "${TIME:=02:00:00}"
if [ -z "${CODE_ARGS:-}" ]; then
  : "${SPEC:?set SPEC to a family spec or CODE_ARGS to --hx/--hz options}"
  CODE_ARGS="--family '${SPEC}'"
fi
HERE="$(cd "$(dirname "$0")/../.." && pwd)"
# absolute, since the jobs run from the checkout
OUTDIR="$(mkdir -p "$OUTDIR" && cd "$OUTDIR" && pwd)"
WORK=("--seed" "$SEED" "--workers" "$CPUS")
OUT_ARGS=""
MERGE_CODE=""
case "$COMMAND" in
  search)
    WORK+=("--side" "$SIDE")
    [ -n "${MAXW:-}" ] && WORK+=("--max-weight" "$MAXW")
    if [ -n "${ITERATIONS:-}" ]; then WORK+=("--method" "isd" "--iterations" "$ITERATIONS"); else WORK+=("--target-miss" "${TARGET:-1e-6}"); fi
    OUT_ARGS="--out '$OUTDIR'/shard-\$SLURM_ARRAY_TASK_ID.jsonl"
    MERGE_CODE="$CODE_ARGS" # orbit counts are recomputed from the code
    ;;
  distance)
    WORK+=("--side" "$SIDE" "--method" "${METHOD:-isd}")
    [ -n "${ITERATIONS:-}" ] && WORK+=("--iterations" "$ITERATIONS")
    [ -n "${TARGET:-}" ] && WORK+=("--target-miss" "$TARGET")
    # a requeued or rerun shard replays its journal and carries on (exactly where it stopped)
    OUT_ARGS="--checkpoint '$OUTDIR'/shard-\$SLURM_ARRAY_TASK_ID.journal.jsonl"
    ;;
  trial)
    : "${P:?set P to the physical error rates, e.g. P=0.001,0.002}"
    WORK+=("--p" "$P" "--shots" "${SHOTS:-100000}" "--batch" "${BATCH:-256}")
    [ -n "${FAILURES:-}" ] && WORK+=("--failures" "$FAILURES")
    OUT_ARGS="--checkpoint '$OUTDIR'/shard-\$SLURM_ARRAY_TASK_ID.journal.jsonl"
    ;;
  *)
    echo "COMMAND must be search, distance or trial, not '$COMMAND'" >&2
    exit 2
    ;;
esac

# --requeue: a preempted shard runs again and continues from its words file or journal
array_id=$(sbatch --parsable --requeue --array="0-$((SHARDS - 1))" --cpus-per-task="$CPUS" --time="$TIME" \
  --job-name="overcheck-$COMMAND" --output="$OUTDIR/shard-%a.log" --wrap="cd '$HERE' && \
  node bin/overcheck.js $COMMAND $CODE_ARGS ${WORK[*]} ${EXTRA:-} --shard \$SLURM_ARRAY_TASK_ID/$SHARDS \
    $OUT_ARGS --json > '$OUTDIR'/shard-\$SLURM_ARRAY_TASK_ID.json")

merge_id=$(sbatch --parsable --dependency="afterok:${array_id}" --cpus-per-task=1 --time=00:30:00 \
  --job-name=overcheck-merge --output="$OUTDIR/merge.log" --wrap="cd '$HERE' && \
  node bin/overcheck.js merge $MERGE_CODE '$OUTDIR'/shard-*.json --out '$OUTDIR'/merged.json")

echo "submitted array job $array_id ($SHARDS $COMMAND shards) and merge job $merge_id; results in $OUTDIR/merged.json"
