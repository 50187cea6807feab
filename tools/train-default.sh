#!/usr/bin/env bash
# Recipe for the bundled default model (models/default.hlm). Every step is resumable: rerun the script after an
# interruption and it picks up where it stopped (existing synthetic sets are kept; training resumes from its
# checkpoint). Usage: tools/train-default.sh [TRAIN_LINES] [MAX_MINUTES]
set -euo pipefail
cd "$(dirname "$0")/.."
train_lines="${1:-60000}"
max_minutes="${2:-60}"
work=.cache
hl() { dotnet run --project src/HandLine.Cli -c Release --no-build -- "$@"; }

bash tools/fetch-fonts.sh "$work/fonts"
dotnet build src/HandLine.Cli -c Release -v q

# Styles kept out of training: validation CER is measured on hands the model never saw.
valid_fonts=(kalam patrick-hand shadows-into-light courgette Rufscript010)
rm -rf "$work/fonts/train" "$work/fonts/valid"
mkdir -p "$work/fonts/train" "$work/fonts/valid"
for f in "$work"/fonts/debian/* "$work"/fonts/npm/*; do
  name=$(basename "$f")
  dest=train
  for v in "${valid_fonts[@]}"; do [[ "$name" == "$v"* ]] && dest=valid; done
  ln -s "$(realpath "$f")" "$work/fonts/$dest/$name"
done
echo "fonts: $(ls "$work/fonts/train" | wc -l) for training, $(ls "$work/fonts/valid" | wc -l) held out"

[ -s "$work/synth/train/lines.tsv" ] || hl synth --fonts "$work/fonts/train" --count "$train_lines" --seed 11 --out "$work/synth/train"
[ -s "$work/synth/valid/lines.tsv" ] || hl synth --fonts "$work/fonts/valid" --count 1000 --seed 12 --out "$work/synth/valid"

hl train --train "$work/synth/train/lines.tsv" --valid "$work/synth/valid/lines.tsv" --out "$work/default.hlm" \
  --line-height 32 --frame-stride 3 --hidden 128 --layers 2 \
  --seed 1 --threads 2 --batch 32 --epochs 30 --max-minutes "$max_minutes" --resume
cp "$work/default.hlm" models/default.hlm
