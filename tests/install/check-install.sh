#!/usr/bin/env bash
# Installs HandLine the ways docs/install.md documents and checks each copy from outside the checkout:
#   1. the .NET tool package: pack, install into a temporary tool path, check that the installed
#      libLibTorchSharp.so carries the GLIBCXX weak flag, transcribe the demo from another working folder and
#      compare every line's text with a run of the build; `handline --version` must name the model the run used;
#   2. the published folder, framework-dependent (the one the package was packed from) and self-contained
#      (linux-x64): --version and the demo again;
#   3. the Dockerfile (it cannot be built here: no image registry): every path it copies must exist in the build
#      context (and not be left out by .dockerignore), and every path it names inside the image must exist in the
#      self-contained published folder it copies.
# Prints what it measured (package size, times). Slow (a few minutes: two publishes of ~550 MB); .ci/run calls it.
#
# Usage: tests/install/check-install.sh [REFERENCE_RUN]
#   REFERENCE_RUN: a folder where the build transcribed fixtures/demo/lines.tsv (.ci/run passes out/demo); made
#   here with `dotnet run` when not given.
# tests/install/check-install.sh --dockerfile CONTEXT: the Dockerfile check alone (seconds), CONTEXT (relative to
#   the repository) holding publish/linux-x64 as the Dockerfile's publish command makes it.
set -euo pipefail
repo=$(cd "$(dirname "$0")/../.." && pwd)
cd "$repo"
export DOTNET_CLI_TELEMETRY_OPTOUT=1 DOTNET_NOLOGO=1

tmp=$(mktemp -d /tmp/hl-install-check.XXXXXX)
trap 'rm -rf "$tmp"' EXIT
fail() { echo "check-install: FAILED: $*" >&2; exit 1; }
step() { echo "check-install: $*"; }
seconds_since() { echo $(( $(date +%s) - $1 )); }

# The text of every line, by source and line number, in file order (the JSON field order is the writer's).
line_texts() { grep -oE '"source":"([^"\\]|\\.)*","line":[0-9]+,"text":"([^"\\]|\\.)*"' "$1/lines.jsonl"; }
model_id_of_run() { grep -oE '"model_id": *"[0-9a-f]+"' "$1/summary.json" | grep -oE '[0-9a-f]{12,}'; }

# The patched-ness check: the project's own ELF reader, and readelf as a second opinion where binutils is installed.
check_patched() {
  local so=$1
  [ -f "$so" ] || fail "no libLibTorchSharp.so at $so"
  dotnet msbuild build/CheckElfVersionNeed.proj -t:Check -p:Files="$so" -nologo -v:m || fail "$so is not patched"
  if command -v readelf > /dev/null; then
    readelf -V "$so" > "$tmp/readelf.txt"  # not piped into grep -q: under pipefail its early exit fails the pipe
    grep -q 'Name: GLIBCXX_3.4.32  Flags: WEAK' "$tmp/readelf.txt" || fail "readelf: GLIBCXX_3.4.32 is not WEAK in $so"
    step "readelf -V: GLIBCXX_3.4.32 Flags: WEAK"
  fi
}

# The Dockerfile, read (it cannot be built here): the build context is the repository root with only the published
# folder let in (.dockerignore). CONTEXT holds publish/linux-x64 as the Dockerfile expects it.
check_dockerfile() {
  local context=$1 copies=0 instruction rest w src dest inside entry
  local -a words sources
  while read -r instruction rest; do
    read -r -a words <<< "$rest"
    sources=()
    for w in "${words[@]}"; do [[ $w == --* ]] || sources+=("$w"); done
    dest=${sources[-1]}; unset 'sources[-1]'
    for src in "${sources[@]}"; do
      [ -e "$context/$src" ] || fail "Dockerfile copies $src, which is not in the build context"
      grep -qx "!$src" .dockerignore || fail ".dockerignore does not let $src into the build context"
      copies=$((copies + 1))
      # Every path the Dockerfile names under the copy's destination must exist in what it copies.
      for inside in $(grep -v '^#' Dockerfile | grep -oE "${dest%/}/[A-Za-z0-9._/-]+" | sort -u); do
        [ -e "$context/$src/${inside#"${dest%/}"/}" ] || fail "Dockerfile names $inside, which $src lacks"
      done
      entry=$(grep -oE '^ENTRYPOINT \["[^"]+"' Dockerfile | grep -oE '"[^"]+"' | tr -d '"') || fail "the Dockerfile has no ENTRYPOINT"
      [[ $entry == "${dest%/}"/* ]] || fail "the entry point $entry is not in the copied folder ${dest%/}"
      [ -x "$context/$src/${entry#"${dest%/}"/}" ] || fail "the entry point $entry is not an executable of $src"
    done
  done < <(grep -E '^COPY ' Dockerfile)
  [ "$copies" -gt 0 ] || fail "no COPY found in the Dockerfile"
  grep -qE '^FROM debian:12-slim' Dockerfile || fail "the Dockerfile is not based on debian:12-slim"
  grep -qE '^USER [1-9][0-9]*' Dockerfile || fail "the Dockerfile does not run as a numeric non-root user"
  step "Dockerfile: $copies copied path(s) and every path it names in the image exist in the published folder"
}

# Runs an installed handline from a folder outside the checkout on a copy of the demo; checks the texts and that
# --version names the model the run used.
check_copy() {
  local name=$1 exe=$2 work="$tmp/work-$1"
  mkdir -p "$work"
  cp -r fixtures/demo "$work/demo"
  (cd "$work" && "$exe" --version) > "$work/version.txt" || fail "$name: handline --version failed"
  sed 's/^/    /' "$work/version.txt"
  local start
  start=$(date +%s)
  (cd "$work" && "$exe" transcribe demo/lines.tsv --out out --quiet) || fail "$name: transcribe failed"
  step "$name: demo transcribed from $work in $(seconds_since "$start") s"
  diff <(line_texts "$reference") <(line_texts "$work/out") || fail "$name: lines.jsonl texts differ from the build's run"
  [ "$(line_texts "$work/out" | wc -l)" -eq "$(line_texts "$reference" | wc -l)" ] || fail "$name: line count differs"
  local id
  id=$(model_id_of_run "$work/out")
  grep -qx "model $id (bundled default.hlm)" "$work/version.txt" || fail "$name: --version does not name the model $id the run used"
  grep -qE '^commit ([0-9a-f]{40}|unknown)$' "$work/version.txt" || fail "$name: --version prints no commit line"
  step "$name: same $(line_texts "$reference" | wc -l) line texts as the build's run; --version names model $id"
}

# tests/install/check-install.sh --dockerfile CONTEXT: only the Dockerfile check, against a folder already
# published into CONTEXT/publish/linux-x64 (the repository root, after the publish command in docs/install.md).
if [ "${1:-}" = --dockerfile ]; then
  check_dockerfile "$(cd "${2:?give the build context folder}" && pwd)"
  exit 0
fi

reference=${1:-}
if [ -z "$reference" ]; then
  reference="$tmp/build-run"
  dotnet run --project src/HandLine.Cli -- transcribe fixtures/demo/lines.tsv --out "$reference" --quiet
fi
[ -s "$reference/lines.jsonl" ] || fail "no lines.jsonl in the reference run $reference"
[ "$(line_texts "$reference" | wc -l)" -gt 0 ] || fail "no line texts found in $reference/lines.jsonl"

# 1. The tool package. The package is made from the publish folder as it stands, so publish into a fresh one:
#    files left in the default folder by an older publish would be packed too.
start=$(date +%s)
dotnet pack src/HandLine.Cli -c Release -o "$tmp/nupkg" -p:PublishDir="$tmp/publish/" -v:m -nologo
nupkg=$(ls "$tmp"/nupkg/HandLine.*.nupkg)
version=$(basename "$nupkg" .nupkg); version=${version#HandLine.}
step "pack: $(basename "$nupkg"), $(( $(stat -c %s "$nupkg") / 1000000 )) MB, in $(seconds_since "$start") s"

start=$(date +%s)
# The version pinned: a package of the same name on another configured source must not be taken instead.
dotnet tool install HandLine --version "$version" --tool-path "$tmp/tools" --add-source "$tmp/nupkg"
step "tool install: $(seconds_since "$start") s, $(du -sm "$tmp/tools" | cut -f1) MB on disk"
installed=$(dirname "$(find "$tmp/tools/.store" -name handline.dll)")
step "installed files: $(du -sm "$installed" | cut -f1) MB in $installed"
for model in models/*.hlm; do
  [ -f "$installed/models/$(basename "$model")" ] || fail "the installed tool lacks $model"
done
check_patched "$installed/runtimes/linux-x64/native/libLibTorchSharp.so"
check_copy tool "$tmp/tools/handline"

# 2. Published folders: the framework-dependent one the package was made from, and a self-contained one.
check_patched "$tmp/publish/runtimes/linux-x64/native/libLibTorchSharp.so"
check_copy published "$tmp/publish/handline"
start=$(date +%s)
selfcontained="$tmp/context/publish/linux-x64"
dotnet publish src/HandLine.Cli -c Release -r linux-x64 --self-contained -o "$selfcontained" -v:m -nologo
step "self-contained publish: $(du -sm "$selfcontained" | cut -f1) MB in $(seconds_since "$start") s"
check_patched "$selfcontained/libLibTorchSharp.so"
check_copy self-contained "$selfcontained/handline"

# 3. The Dockerfile, read against the self-contained folder just published.
check_dockerfile "$tmp/context"
step "all install checks passed (version $version)"
