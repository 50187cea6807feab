#!/usr/bin/env bash
# Input size and capacity by measurement (models/README.md, "Line height and width"): settings warm-started from
# the same model (BASE, default models/broad.hlm) and trained on the same lines with the same seed, step size and
# time budget, then read on the 13 leave-style-out validation families, by family. A setting of another line
# height or LSTM width starts from BASE reshaped (`train --from BASE --line-height H --frame-stride S` or
# `--hidden N`: filters copied, first-layer input weights resampled over the rows; a wider LSTM keeps every old
# weight and gives its new units no say until trained), so the comparison asks which shape pays off from here,
# per hour of training on this machine, not which shape learns fastest from new weights (models/README.md,
# "Choosing the architecture", compared that). The time budget is MINUTES per setting (default 45), with THREADS
# threads each (default 2), JOBS settings at a time (default 1; JOBS=3 THREADS=1 runs all three side by side, so
# they share the machine alike when other work runs on it too). Rerunning resumes unfinished
# settings from their checkpoints; ONLY (e.g. ONLY=B) runs just the settings whose names start with it.
# The lines: part 4's sets (mixed-1, mnist-train4; BASE = part 5's result had seen a third of a pass of them).
# Needs those sets of tools/make-sets.sh, the validation sets and .cache/bin.
set -euo pipefail
cd "$(dirname "$0")/.."
s=.cache/synth
minutes="${MINUTES:-45}"
base="${BASE:-models/broad.hlm}"
out=.cache/compare-inputs
mkdir -p "$out"
hl() { .cache/bin/handline "$@"; }

# Each line height prepares the lines afresh: copies of the manifests (beside the originals, so their relative
# paths still hold) keep each height's prepared lines in a file of their own.
manifest() { # SET HEIGHT -> path of the set's manifest for that height
  local src=$s/$1 copy
  [[ -d $src ]] && src=$src/lines.tsv
  copy="${src%.tsv}-h$2.tsv"
  [[ $2 == 32 ]] && copy=$src
  [[ -s $copy ]] || cp "$src" "$copy"
  echo "$copy"
}
run() {
  local name=$1 height=$2; shift 2
  hl train --from "$base" --train "$(manifest mixed-1 "$height")" "$(manifest mnist-train4 "$height")" \
    --valid "$(manifest valid-mixed.tsv "$height")" --out "$out/$name.hlm" --learning-rate 0.0005 --seed 7 \
    --threads "${THREADS:-2}" --batch 32 --epoch-lines 10000 --epochs 100 --max-minutes "$minutes" --resume \
    --keep-prepared "$@" >> "$out/$name.log" 2>&1
  hl transcribe "$s/valid/lines.tsv" --model "$out/$name.hlm" --out "$out/$name-valid" --threads "${THREADS:-2}" > /dev/null || true
  hl score --truth "$s/valid/lines.tsv" --run "$out/$name-valid" --by family > "$out/$name-valid.txt"
}
settings=(
  "A-h32-s3-w192 32"                                       # BASE as it is: the control
  "B-h48-s4-w192 48 --line-height 48 --frame-stride 4"     # taller input, about 1.1 times the frames
  "C-h32-s3-w256 32 --hidden 256"                          # wider LSTM, same input
)
for setting in "${settings[@]}"; do
  [[ "$setting" == "${ONLY:-}"* ]] || continue
  while (( $(jobs -rp | wc -l) >= ${JOBS:-1} )); do wait -n || true; done
  # shellcheck disable=SC2086 # the setting's words are the name, the height and its options
  run $setting &
done
wait
for setting in "${settings[@]}"; do
  name=${setting%% *}
  [[ -s $out/$name.hlm.log.csv ]] || continue
  echo "== $name"; cat "$out/$name.hlm.log.csv"; cat "$out/$name-valid.txt"
done
