#!/usr/bin/env bash
# Prints the font pool's licences (tools/fonts.tsv) as the model card's appendix: one line per licence, each family
# with its split. Usage: tools/font-licences.sh >> models/README.md (then move it into place).
set -euo pipefail
cd "$(dirname "$0")/.."
awk -F'\t' '!/^#/ && NF >= 5 { n[$5]++; list[$5] = list[$5] (list[$5] == "" ? "" : ", ") $1 ($4 == "train" ? "" : " (" $4 ")") }
  END { for (l in n) printf "- **%s** (%d): %s\n", l, n[l], list[l] }' tools/fonts.tsv | sort
echo "- **Hershey single-stroke faces** (Debian hershey-fonts-data; training only): cursive, futural, futuram, rowmand, rowmans, rowmant, scriptc, scripts, timesi, timesib, timesr, timesrb; the glyph data under the Hershey font licence and GPL-2+ as the package's copyright file states"
