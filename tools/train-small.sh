#!/usr/bin/env bash
# Recipe for the smaller, faster bundled model (models/small.hlm; the default until the eighth session), in four
# stages. Every step is resumable: rerun the script after an interruption and it picks up where it stopped
# (existing synthetic sets are kept; training resumes from its checkpoint). Usage: tools/train-small.sh [STAGE1_MINUTES] [STAGE2_MINUTES] [STAGE3_MINUTES] [STAGE4_MINUTES]
# A stage's minutes are its total training time over all its sessions (preparing the lines not counted): the
# committed model's stage 2 ran 75 minutes in one session and was resumed with 185 in the next; its stage 3 was
# stopped after 5 epochs (79 minutes), its stage 4 likewise (the state after 77 minutes).
# START_AT=N skips stages 1 to N-1 and copies the committed models/small.hlm in as stage N-1's result: .cache
# does not survive a fresh checkout, and without this a new session would retrain hours of earlier stages. That
# file is the last stage's result, so this suits a stage added after it (the fifth session ran START_AT=4 at the
# commit whose file was stage 3's); to redo an earlier stage, check out the commit that holds its predecessor.
set -euo pipefail
cd "$(dirname "$0")/.."
stage1_minutes="${1:-105}"
stage2_minutes="${2:-185}"
stage3_minutes="${3:-80}"
stage4_minutes="${4:-78}"
work=.cache
first="${START_AT:-1}"
stage_out() { if (( $1 == 1 )); then echo "$work/default.hlm"; else echo "$work/default$1.hlm"; fi; }
runs() { (( first <= $1 )); } # STAGE: whether this run includes it
hl() { "$work/bin/handline" "$@"; } # the copy tools/make-sets.sh made

# Training sets (tools/make-sets.sh renders them with the held-out sets): ledger and register phrases in the
# training fonts, real MNIST digit lines. Stage 4 (fifth session, whose fresh checkout had lost .cache) has new
# lines rather than a second render of the same ones (new seeds: 100,000 font lines, 50,000 digit lines, so
# digits, furthest from their target, make a third of the lines).
sets=()
runs 3 && sets+=(train:60000:11 train2:140000:13 mnist-train:30000:21)
runs 4 && sets+=(train3:100000:15 mnist-train2:50000:25)
bash tools/make-sets.sh "${sets[@]}"
s=$work/synth

if (( first > 1 )) && [ ! -s "$(stage_out $((first - 1)))" ]; then cp models/small.hlm "$(stage_out $((first - 1)))"; fi

# Stage 1: a new network on the first 60,000 font lines, without augmentation (the code had none then).
runs 1 && hl train --train "$s/train/lines.tsv" --valid "$s/valid/lines.tsv" --out "$work/default.hlm" \
  --line-height 32 --frame-stride 3 --hidden 128 --layers 2 --no-augment \
  --seed 1 --threads 2 --batch 32 --epochs 30 --max-minutes "$stage1_minutes" --resume

# Stages 2 to 4 continue from the stage before, with fresh distortions each time a line is seen, validating every
# 25,000 lines on font and digit lines together.
continue_on() { # FROM OUT STEP_SIZE SEED MINUTES MANIFEST...
  local from=$1 out=$2 step=$3 seed=$4 minutes=$5; shift 5
  hl train --from "$from" --train "$@" \
    --valid "$s/valid-mixed.tsv" --out "$out" --learning-rate "$step" --epoch-lines 25000 \
    --seed "$seed" --threads 2 --batch 32 --epochs 40 --max-minutes "$minutes" --resume --keep-prepared
}
first_sets=("$s/train/lines.tsv" "$s/train2/lines.tsv" "$s/mnist-train/lines.tsv")
runs 2 && continue_on "$work/default.hlm" "$work/default2.hlm" 0.0005 2 "$stage2_minutes" "${first_sets[@]}"
# Stage 3: half the step size (stage 2's validation CER was still falling when it stopped, and a smaller step at
# the end of a limited budget usually gains more than the same time at the old one: common practice, no source).
runs 3 && continue_on "$work/default2.hlm" "$work/default3.hlm" 0.00025 3 "$stage3_minutes" "${first_sets[@]}"
# Stage 4: the new lines above, same step size.
runs 4 && continue_on "$work/default3.hlm" "$work/default4.hlm" 0.00025 4 "$stage4_minutes" "$s/train3/lines.tsv" "$s/mnist-train2/lines.tsv"
cp "$work/default4.hlm" models/small.hlm
