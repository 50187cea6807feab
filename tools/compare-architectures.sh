#!/usr/bin/env bash
# The architecture comparison in models/README.md: five settings, the same training lines (the first TRAIN_LINES of
# the seed-11 set, default 40,000), the same budget (MAX_LINES lines seen, default 40,000) and 500 unseen-font
# validation lines, the same seed, one thread each, all five side by side so each
# has the same share of the machine. Needs the sets made by tools/train-default.sh. Rerunning resumes
# interrupted runs from their checkpoints (stop them with SIGTERM: each validates and saves first).
set -euo pipefail
cd "$(dirname "$0")/.."
s=.cache/synth
n="${TRAIN_LINES:-40000}"
budget="${MAX_LINES:-40000}"
out=".cache/compare-$budget"
{ echo "# first $n lines (architecture comparison)"; grep -v '^#' "$s/train/lines.tsv" | head -"$n"; } > "$s/train/compare$n.tsv"
{ echo "# first 500 lines (architecture comparison)"; grep -v '^#' "$s/valid/lines.tsv" | head -500; } > "$s/valid/compare500.tsv"
dotnet build src/HandLine.Cli -c Release -v q
mkdir -p "$out"
run() { name=$1; shift; dotnet run --project src/HandLine.Cli -c Release --no-build -- train --train "$s/train/compare$n.tsv" \
  --valid "$s/valid/compare500.tsv" --out "$out/$name.hlm" --seed 1 --threads 1 --batch 32 --epochs 5 \
  --max-lines "$budget" --no-augment --resume --keep-prepared "$@" > "$out/$name.log" 2>&1; }
run A-pix-h128x2 --line-height 32 --frame-stride 3 --hidden 128 --layers 2 &
run B-geo-h128x2 --line-height 32 --frame-stride 3 --hidden 128 --layers 2 --geometric &
run C-pix-h192x2 --line-height 32 --frame-stride 3 --hidden 192 --layers 2 &
run D-pix-h128x3 --line-height 32 --frame-stride 3 --hidden 128 --layers 3 &
run E-conv-h128x2 --line-height 32 --frame-stride 3 --hidden 128 --layers 2 --convolution &
wait
tail -n 3 "$out"/*.log
