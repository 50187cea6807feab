#!/usr/bin/env bash
# Fonts, MNIST digits and the held-out sets that every training recipe and tools/measure-default.sh use:
# fetches the fonts and digits, splits the fonts into training and held-out styles, and renders the validation
# and test sets (about a minute), then the training sets a recipe names. Idempotent: existing sets are kept.
# Usage: tools/make-sets.sh [NAME:LINES:SEED]... (from any folder; works in the checkout's .cache). Each argument
# is a training set: LINES ledger and register phrases in the training fonts; for names starting "mixed", the
# text mixture (synth --words with Debian's British English word list: phrases under half, the rest words,
# capitals, random characters, dates and amounts); for names starting "mnist", lines of real MNIST digits
# (training split, samples 0-499) with separators in the training fonts.
set -euo pipefail
cd "$(dirname "$0")/.."
work=.cache
hl() { dotnet run --project src/HandLine.Cli -c Release --no-build -- "$@"; }

bash tools/fetch-fonts.sh "$work/fonts"
bash tools/fetch-mnist.sh "$work/mnist"
# The general word list behind the "mixed" sets (Debian package wbritish).
words=/usr/share/dict/british-english
if [ ! -s "$words" ]; then
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq wbritish >/dev/null
fi
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

s=$work/synth
[ -s "$s/valid/lines.tsv" ] || hl synth --fonts "$work/fonts/valid" --count 1000 --seed 12 --out "$s/valid"
[ -s "$s/mnist-valid/lines.tsv" ] || hl synth --fonts "$work/fonts/valid" --mnist "$work/mnist" --mnist-split Validation --count 1000 --seed 22 --out "$s/mnist-valid"
# Test sets for the card (tools/measure-default.sh): fresh lines from the same held-out fonts and digit samples,
# never used to choose a model.
[ -s "$s/test-fonts/lines.tsv" ] || hl synth --fonts "$work/fonts/valid" --count 1000 --seed 14 --out "$s/test-fonts"
[ -s "$s/test-mnist/lines.tsv" ] || hl synth --fonts "$work/fonts/valid" --mnist "$work/mnist" --mnist-split Validation --count 1000 --seed 23 --out "$s/test-mnist"
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
  [ -s "$s/$name/lines.tsv" ] || hl synth --fonts "$work/fonts/train" "${extra[@]}" --count "$lines" --seed "$seed" --out "$s/$name"
done
