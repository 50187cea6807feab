#!/usr/bin/env bash
# Fonts, MNIST digits and the held-out sets that every training recipe and tools/measure-default.sh use:
# fetches the fonts (split by tools/fonts.tsv into training, validation and test families) and digits, renders the validation
# and test sets (about a minute), then the training sets a recipe names. Idempotent: existing sets are kept.
# Usage: tools/make-sets.sh [NAME:LINES:SEED]... (from any folder; works in the checkout's .cache). Each argument
# is a training set: LINES ledger and register phrases in the training fonts; for names starting "mixed", the
# text mixture (synth --words with Debian's British English word list: phrases under half, the rest words,
# capitals, random characters, dates and amounts); for names starting "mnist", lines of real MNIST digits
# (training split, samples 0-499) with separators in the training fonts.
set -euo pipefail
cd "$(dirname "$0")/.."
work=.cache
# Runs a private copy of the Release build (.cache/bin), so that rebuilding the checkout while a long render or
# training runs cannot replace the files under it.
hl() { "$work/bin/handline" "$@"; }

bash tools/fetch-fonts.sh "$work/fonts"
bash tools/fetch-mnist.sh "$work/mnist"
# The general word list behind the "mixed" sets (Debian package wbritish).
words=/usr/share/dict/british-english
if [ ! -s "$words" ]; then
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq wbritish >/dev/null
fi
# Single-stroke Hershey faces (Debian hershey-fonts-data), drawn as pen paths: training only, one family per
# Latin face in the group "single-stroke" (laid out as fonts/strokes/GROUP/FAMILY/ like the outline fonts).
if [ ! -d /usr/share/hershey-fonts ]; then
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq hershey-fonts-data >/dev/null
fi
for face in cursive futural futuram rowmand rowmans rowmant scriptc scripts timesi timesib timesr timesrb; do
  mkdir -p "$work/fonts/strokes/single-stroke/hershey-$face"
  ln -sf "/usr/share/hershey-fonts/$face.jhf" "$work/fonts/strokes/single-stroke/hershey-$face/$face.jhf"
done
dotnet build src/HandLine.Cli -c Release -v q
rm -rf "$work/bin" && cp -r src/HandLine.Cli/bin/Release/net10.0 "$work/bin"

# tools/fonts.tsv holds whole font families out: fonts/valid for validation (hands the model never saw while
# training) and fonts/test for the card's test sets only; training renders from fonts/train.
echo "fonts: $(find "$work/fonts/train" -mindepth 2 -maxdepth 2 -type d | wc -l) families for training," \
  "$(find "$work/fonts/valid" -mindepth 2 -maxdepth 2 -type d | wc -l) for validation, $(find "$work/fonts/test" -mindepth 2 -maxdepth 2 -type d | wc -l) for testing"

s=$work/synth
# Sets rendered from another font catalogue may hold fonts that are now held out: render everything again.
stamp=$(sha256sum tools/fonts.tsv | cut -c1-16)
if [ -d "$s" ] && [ "$(cat "$s/fonts-catalogue" 2>/dev/null || true)" != "$stamp" ]; then
  echo "tools/fonts.tsv changed since $s was rendered: removing its sets"; rm -rf "$s"
fi
mkdir -p "$s" && echo "$stamp" > "$s/fonts-catalogue"
# Font lines carry the text mixture (--words) in validation and test too, so the figures do not reward a
# memorised phrase grammar.
[ -s "$s/valid/lines.tsv" ] || hl synth --fonts "$work/fonts/valid" --words "$words" --count 1000 --seed 12 --out "$s/valid"
[ -s "$s/mnist-valid/lines.tsv" ] || hl synth --fonts "$work/fonts/valid" --mnist "$work/mnist" --mnist-split Validation --count 1000 --seed 22 --out "$s/mnist-valid"
# Test sets for the card (tools/measure-default.sh): lines in the test fonts, held out from both training and
# validation, and the validation digit samples with separators in those fonts; never used to choose a model.
[ -s "$s/test-fonts/lines.tsv" ] || hl synth --fonts "$work/fonts/test" --words "$words" --count 1000 --seed 14 --out "$s/test-fonts"
[ -s "$s/test-mnist/lines.tsv" ] || hl synth --fonts "$work/fonts/test" --mnist "$work/mnist" --mnist-split Validation --count 1000 --seed 23 --out "$s/test-mnist"
# One validation manifest for both kinds of line (paths must stay inside the manifest's folder).
# Both sets carry the same #columns header (path, text, family, group); it is kept once, before the entries.
{ echo "# validation: 1,000 font lines (held-out fonts) + 1,000 MNIST digit lines (samples 500-559)"
  grep -m1 '^#columns' "$s/valid/lines.tsv" || true
  grep -v '^#' "$s/valid/lines.tsv" | sed 's#^#valid/#'
  grep -v '^#' "$s/mnist-valid/lines.tsv" | sed 's#^#mnist-valid/#'; } > "$s/valid-mixed.tsv"

for set in "$@"; do
  IFS=: read -r name lines seed <<< "$set"
  extra=()
  [[ "$name" == mnist* ]] && extra=(--mnist "$work/mnist" --mnist-split Training)
  [[ "$name" == mixed* ]] && extra=(--words "$words")
  [ -s "$s/$name/lines.tsv" ] || hl synth --fonts "$work/fonts/train" "$work/fonts/strokes" "${extra[@]}" --count "$lines" --seed "$seed" --out "$s/$name"
done
