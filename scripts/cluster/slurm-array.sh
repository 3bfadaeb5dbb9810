#!/usr/bin/env bash
# Sharded low-weight word search on a Slurm cluster: one shard per array task, then a merge job that waits
# for the whole array. Submit from a checkout where `npm ci` has been run:
#
#   SPEC="bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2" SHARDS=16 ITERATIONS=200000 scripts/cluster/slurm-array.sh
#
# Every shard runs the same command with --shard I/N, so together they do exactly the chunks of one run with
# the same seed and --iterations; `overcheck merge` checks that the shards belong together and recomputes the
# counts and miss probabilities. Each shard also streams its words to its own --out file: a shard that was
# killed (time limit, pre-emption) can be rerun with --resume shard-I.jsonl (without --shard) to finish it.
#
# Environment (all optional except SPEC):
#   SPEC        family spec of the code (or set CODE_ARGS="--hx hx.mtx --hz hz.mtx")
#   SIDE        x, z or both (default both)
#   MAXW        --max-weight (default: the code's row weight)
#   SHARDS      number of array tasks (default 8)
#   ITERATIONS  total information sets for the whole array (default: enough for --target-miss)
#   TARGET      --target-miss when ITERATIONS is not set (default 1e-6)
#   SEED        seed shared by every shard (default 1)
#   OUTDIR      where shard and merged results go (default ./overcheck-shards)
#   CPUS        cores per task, also --workers (default 2)
#   TIME        Slurm time limit per task (default 02:00:00)
set -euo pipefail

: "${SHARDS:=8}" "${SIDE:=both}" "${SEED:=1}" "${OUTDIR:=./overcheck-shards}" "${CPUS:=2}" "${TIME:=02:00:00}" "${TARGET:=1e-6}"
if [ -z "${CODE_ARGS:-}" ]; then
  : "${SPEC:?set SPEC to a family spec or CODE_ARGS to --hx/--hz options}"
  CODE_ARGS="--family '${SPEC}'"
fi
WORK=("--side" "$SIDE" "--seed" "$SEED" "--workers" "$CPUS")
[ -n "${MAXW:-}" ] && WORK+=("--max-weight" "$MAXW")
if [ -n "${ITERATIONS:-}" ]; then WORK+=("--method" "isd" "--iterations" "$ITERATIONS"); else WORK+=("--target-miss" "$TARGET"); fi
HERE="$(cd "$(dirname "$0")/../.." && pwd)"
mkdir -p "$OUTDIR"

array_id=$(sbatch --parsable --array="0-$((SHARDS - 1))" --cpus-per-task="$CPUS" --time="$TIME" \
  --job-name=overcheck-search --output="$OUTDIR/shard-%a.log" --wrap="cd '$HERE' && \
  node bin/overcheck.js search $CODE_ARGS ${WORK[*]} --shard \$SLURM_ARRAY_TASK_ID/$SHARDS \
    --out '$OUTDIR'/shard-\$SLURM_ARRAY_TASK_ID.jsonl --json > '$OUTDIR'/shard-\$SLURM_ARRAY_TASK_ID.json")

merge_id=$(sbatch --parsable --dependency="afterok:${array_id}" --cpus-per-task=1 --time=00:30:00 \
  --job-name=overcheck-merge --output="$OUTDIR/merge.log" --wrap="cd '$HERE' && \
  node bin/overcheck.js merge $CODE_ARGS '$OUTDIR'/shard-*.json --out '$OUTDIR'/merged.json")

echo "submitted array job $array_id ($SHARDS shards) and merge job $merge_id; results in $OUTDIR/merged.json"
