#!/usr/bin/env bash
# Recipe for the bundled default model (models/default.hlm): setting (f) of the architecture comparison in
# models/README.md, the convolutional front end with a 2 x 192 bidirectional LSTM (1.62 M parameters), trained
# from new weights in parts, one or more per working session. .cache does not survive a fresh checkout, so each
# session ends by committing the part's best state as models/default.hlm, and the next part starts from that file
# (--from: the weights carry over, Adam's moment estimates start afresh). Rerunning a part in the same checkout
# resumes it from its checkpoint. HANDLINE_TRAIN_THREADS (default 2) sets the training threads: 1 is faster
# when other work shares the two cores. Usage: tools/train-default.sh PART [MINUTES] (MINUTES: the part's training time
# over all its runs, preparing lines not counted; each part's default is in the table below). To redo a part
# exactly, check out the commit whose models/default.hlm is the previous part's result.
set -euo pipefail
cd "$(dirname "$0")/.."
part="${1:?usage: tools/train-default.sh PART [MINUTES]}"
work=.cache
s=$work/synth
hl() { "$work/bin/handline" "$@"; } # the copy tools/make-sets.sh made

# Each part: its training sets (NAME:LINES:SEED, as tools/make-sets.sh takes them), Adam step size and minutes.
case "$part" in
  # the small model's first font and digit sets; 212.1 reproduces the stop just after epoch 6
  1) sets=(train:60000:11 mnist-train:30000:21); step=0.001; planned=212.1 ;;
  # the small model's stage-4 sets; 121.8: the training time at the stop in epoch 9 (where a time limit stops
  # depends on the host's speed)
  2) sets=(train3:100000:15 mnist-train2:50000:25); step=0.001; planned=121.8 ;;
  # the small model's 140,000-line set of its stages 2-3 and new digit lines: 300,000 distinct font lines over
  # parts 1-3
  3) sets=(train2:140000:13 mnist-train3:50000:27); step=0.001; planned=150 ;;
  # From part 4 on: the broad font pool of tools/fonts.tsv (199 training families in 8 style groups plus 12
  # single-stroke faces, weighted by group), the text mixture (names "mixed"), hand-like variation within lines
  # and pen-drawn separators; validation on 13 held-out families (leave-style-out), reported per family.
  4) sets=(mixed-1:60000:31 mnist-train4:20000:33); step=0.0005; planned=120 ;;
  # fresh lines of the same kinds, from models/broad.hlm (part 4's result)
  5) sets=(mixed-2:50000:35 mnist-train5:15000:37); step=0.0005; planned=110 ;;
  # part 6 is setting B of the input comparison (tools/compare-inputs.sh, models/README.md "Line height and width"):
  # part 5's model reshaped to line height 48, frame stride 4, trained on part 4's sets; it is run by that script
  6) sets=(mixed-1:60000:31 mnist-train4:20000:33); step=0.0005; planned=72 ;;
  *) echo "tools/train-default.sh: part $part is not defined yet" >&2; exit 2 ;;
esac
minutes="${2:-$planned}"

bash tools/make-sets.sh "${sets[@]}" # fonts, digits, the held-out sets and this part's training sets
if (( part == 6 )); then
  # The comparison's settings ran side by side (JOBS=3 THREADS=1); setting B's run was then resumed alone on
  # 2 threads to the end of its second epoch. Its result is the broad model from here on.
  ONLY=B MINUTES="$minutes" THREADS="${HANDLINE_TRAIN_THREADS:-2}" bash tools/compare-inputs.sh
  cp .cache/compare-inputs/B-h48-s4-w192.hlm models/broad.hlm
  hl fit-temperature "$s/valid/lines.tsv" --model models/broad.hlm --out models/broad.hlm --count 1000
  exit 0
fi
manifests=()
for set in "${sets[@]}"; do manifests+=("$s/${set%%:*}/lines.tsv"); done

start=(--line-height 32 --frame-stride 3 --hidden 192 --layers 2 --convolution)
(( part > 1 )) && start=(--from models/default.hlm)
# Parts 4 on train the broad model: it starts from the default and is kept as models/broad.hlm until its card
# shows it meets the leave-style-out targets; only then does it replace models/default.hlm.
result=models/default.hlm
(( part >= 4 )) && result=models/broad.hlm
(( part >= 5 )) && start=(--from models/broad.hlm)
hl train "${start[@]}" --train "${manifests[@]}" --valid "$s/valid-mixed.tsv" --out "$work/default-part$part.hlm" \
  --learning-rate "$step" --epoch-lines 25000 --seed "$part" --threads "${HANDLINE_TRAIN_THREADS:-2}" --batch 32 --epochs 40 \
  --max-minutes "$minutes" --resume --keep-prepared
cp "$work/default-part$part.hlm" "$result"
# Training leaves the temperature at 1; the broad model's is fitted again on the validation families' font lines
# (hands it did not train on), so its confidences hold on new hands (models/README.md, "Confidence").
if (( part >= 4 )); then
  hl fit-temperature "$s/valid/lines.tsv" --model "$result" --out "$result" --count 1000
fi
