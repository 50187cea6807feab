#!/usr/bin/env bash
# The architecture comparison in models/README.md: six settings trained on the same lines (the seed-11 set
# made by tools/make-sets.sh, in the same shuffled order), with the same seed and the same budget
# (MAX_LINES lines seen, default 30,000, in epochs of 10,000), validated after each epoch on the 1,000
# unseen-font validation lines. Each run uses one thread; JOBS (default 2, one per core) run at a time, longest
# first, so no run competes with more than one other. Rerunning resumes interrupted runs from their checkpoints
# (stop them with SIGTERM: each validates and saves first). HANDLINE may name an already built `handline`, e.g.
# the build whose kept prepared lines (`lines.tsv.prepared`, made with --keep-prepared) should be reused;
# otherwise the script builds one. ONLY (e.g. ONLY=F) runs just the settings whose names start with it.
set -euo pipefail
cd "$(dirname "$0")/.."
s=.cache/synth
budget="${MAX_LINES:-30000}"
jobs_at_once="${JOBS:-2}"
out=".cache/compare-$budget"
if [[ -z "${HANDLINE:-}" ]]; then
  dotnet build src/HandLine.Cli -c Release -v q -o .cache/compare-bin
  HANDLINE=.cache/compare-bin/handline
fi
mkdir -p "$out"
run() {
  local name=$1; shift
  "$HANDLINE" train --train "$s/train/lines.tsv" --valid "$s/valid/lines.tsv" --out "$out/$name.hlm" \
    --seed 1 --threads 1 --batch 32 --epoch-lines 10000 --epochs $(( budget / 10000 )) \
    --no-augment --resume --keep-prepared --line-height 32 --frame-stride 3 "$@" \
    >> "$out/$name.log" 2>&1
}
# Longest first (per-line cost measured earlier: (c) 1.8x, (d) 1.6x, (e) about 1.1x of (a)). (f), the wider
# network with the convolutional front end, was added in the fifth session.
settings=(
  "F-conv-h192x2 --hidden 192 --layers 2 --convolution"
  "C-pix-h192x2 --hidden 192 --layers 2"
  "D-pix-h128x3 --hidden 128 --layers 3"
  "E-conv-h128x2 --hidden 128 --layers 2 --convolution"
  "B-geo-h128x2 --hidden 128 --layers 2 --geometric"
  "A-pix-h128x2 --hidden 128 --layers 2"
)
for setting in "${settings[@]}"; do
  [[ "$setting" == "${ONLY:-}"* ]] || continue
  while (( $(jobs -rp | wc -l) >= jobs_at_once )); do wait -n || true; done
  # shellcheck disable=SC2086 # the setting's words are the name and its options
  run $setting &
done
wait
for log in "$out"/*.hlm.log.csv; do echo "== $log"; cat "$log"; done
