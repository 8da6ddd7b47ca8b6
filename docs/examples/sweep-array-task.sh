#!/bin/sh
# One task of a sweep spread over a batch scheduler's array job (or a CI matrix).
# Every task runs the same command with its own shard index; afterwards one job runs
#   fray merge "$OUT_DIR"/part-*.csv --out sweep.csv
# The index comes from the scheduler: SLURM_ARRAY_TASK_ID, PBS_ARRAY_INDEX, SGE_TASK_ID
# (1-based there: subtract 1), LSB_JOBINDEX (1-based), or I for a CI matrix or by hand.
# N is the number of tasks. A task that is killed and started again continues (--resume).
set -eu
FRAY=${FRAY:-fray}
N=${N:?set N, the number of array tasks}
OUT_DIR=${OUT_DIR:-.}
if [ -n "${SLURM_ARRAY_TASK_ID:-}" ]; then I=$SLURM_ARRAY_TASK_ID
elif [ -n "${PBS_ARRAY_INDEX:-}" ]; then I=$PBS_ARRAY_INDEX
elif [ -n "${SGE_TASK_ID:-}" ]; then I=$((SGE_TASK_ID - 1))
elif [ -n "${LSB_JOBINDEX:-}" ]; then I=$((LSB_JOBINDEX - 1))
else I=${I:?set I, the index of this task from 0 to N-1}
fi
CIRCUIT=${CIRCUIT:-circuits/variants/ghz5-left.yaml}
VARY=${VARY:-gates.cx.error=0.001..0.03:log:12}
# One worker thread per task: the scheduler gives each task its own core.
$FRAY sweep "$CIRCUIT" --vary "$VARY" --shard "$I/$N" --out "$OUT_DIR/part-$I.csv" --resume --jobs 1 --quiet
