#!/usr/bin/env bash
# The architecture comparison in models/README.md: four settings, the same 12,000 training lines (the first of the
# seed-11 set) and 500 unseen-font validation lines, the same seed, one thread each, all four side by side so each
# has the same share of the machine. Needs the sets made by tools/train-default.sh. Stop the runs at the budget
# you choose with SIGTERM (each validates and saves), or give them --max-lines.
set -euo pipefail
cd "$(dirname "$0")/.."
s=.cache/synth
{ echo "# first 12000 lines (architecture comparison)"; grep -v '^#' "$s/train/lines.tsv" | head -12000; } > "$s/train/compare12k.tsv"
{ echo "# first 500 lines (architecture comparison)"; grep -v '^#' "$s/valid/lines.tsv" | head -500; } > "$s/valid/compare500.tsv"
dotnet build src/HandLine.Cli -c Release -v q
mkdir -p .cache/compare
run() { name=$1; shift; dotnet run --project src/HandLine.Cli -c Release --no-build -- train --train "$s/train/compare12k.tsv" \
  --valid "$s/valid/compare500.tsv" --out ".cache/compare/$name.hlm" --seed 1 --threads 1 --batch 32 --epochs 5 \
  --max-lines "${MAX_LINES:-16000}" --no-augment --resume "$@" > ".cache/compare/$name.log" 2>&1; }
run A-pix-h128x2 --line-height 32 --frame-stride 3 --hidden 128 --layers 2 &
run B-geo-h128x2 --line-height 32 --frame-stride 3 --hidden 128 --layers 2 --geometric &
run C-pix-h192x2 --line-height 32 --frame-stride 3 --hidden 192 --layers 2 &
run D-pix-h128x3 --line-height 32 --frame-stride 3 --hidden 128 --layers 3 &
wait
tail -n 3 .cache/compare/*.log
