#!/usr/bin/env bash
# The figures in models/README.md's "Measured" table, for a model (default: models/default.hlm): CER and WER with
# the default decoder (beam 8) and greedy on the held-out sets, the test's 50 MNIST lines, and the demo.
# For the font sets (held-out families) it also prints CER per family and per style group with the worst family:
# a mean alone hides the hands a model cannot read.
# Needs the sets made by tools/make-sets.sh. Usage: tools/measure-default.sh [MODEL] [OUT]
set -euo pipefail
cd "$(dirname "$0")/.."
model="${1:-models/default.hlm}"
out="${2:-.cache/measure}"
s=.cache/synth
hl() { .cache/bin/handline "$@"; } # the copy tools/make-sets.sh made, untouched by rebuilds during training
rm -rf "$out" && mkdir -p "$out"
figures() { # NAME TRUTH RUN
  hl score --truth "$2" --run "$3" --json | python3 -c "import json,sys; r=json.load(sys.stdin); print(f\"$1: CER {100*r['cer']:.2f} %  WER {100*r['wer']:.2f} %\")"
}
for set in valid test-fonts mnist-valid test-mnist; do
  hl transcribe "$s/$set/lines.tsv" --model "$model" --out "$out/$set" > /dev/null
  hl transcribe "$s/$set/lines.tsv" --model "$model" --beam 1 --out "$out/$set-greedy" > /dev/null
  figures "$set (beam 8)" "$s/$set/lines.tsv" "$out/$set"
  figures "$set (greedy)" "$s/$set/lines.tsv" "$out/$set-greedy"
  if [[ "$set" != *mnist* ]]; then
    hl score --truth "$s/$set/lines.tsv" --run "$out/$set" --by group --by family --rows 0 | sed -n '/^By /,$p'
  fi
done
hl synth --fonts fixtures/fonts --mnist fixtures/mnist --mnist-split Validation --count 50 --seed 50 --out "$out/mnist50" > /dev/null
hl transcribe "$out/mnist50/lines.tsv" --model "$model" --out "$out/mnist50-run" > /dev/null
figures "test's 50 MNIST lines (beam 8)" "$out/mnist50/lines.tsv" "$out/mnist50-run"
hl transcribe fixtures/demo/lines.tsv --model "$model" --out "$out/demo" > /dev/null
figures "demo (beam 8)" fixtures/demo/lines.tsv "$out/demo"
hl calibrate --truth "$s/valid/lines.tsv" --run "$out/valid" | tail -n 5
