#!/usr/bin/env bash
# Gathers the handwriting font pool listed in tools/fonts.tsv into $1 (default .cache/fonts), laid out as
# DEST/SPLIT/GROUP/FAMILY-SLUG/<font file>, so a font's family and style group are its two parent folders.
# Debian packages are installed with apt-get; npm @fontsource packages are fetched with `npm pack` at the pinned
# version and their Latin, weight-400, normal-style WOFF is kept. Idempotent: families already present are not
# fetched again, and anything under DEST/{train,valid,test} that the catalogue does not name is removed (so a
# family moved to another split cannot stay behind in the old one).
#
# Reserved fonts: the families and packages in the reserved list (HANDLINE_RESERVED_FONTS, default
# REPO/../shared/reserved-fonts.txt) are kept for an independent evaluation. Before downloading anything the
# whole catalogue is checked against that list and the script stops if any row matches one; it also stops if
# the list is missing. Family names are compared without regard to case, spaces, hyphens, underscores or
# weight/style suffixes ("Klee One SemiBold" is "Klee One"); packages by name (npm without the @version).
# HANDLINE_FONT_CATALOGUE overrides the catalogue's path (used to test the refusal).
set -euo pipefail
repo=$(cd "$(dirname "$0")/.." && pwd)
dest="${1:-.cache/fonts}"
catalogue="${HANDLINE_FONT_CATALOGUE:-$repo/tools/fonts.tsv}"
reserved="${HANDLINE_RESERVED_FONTS:-$repo/../shared/reserved-fonts.txt}"
jobs="${HANDLINE_FETCH_JOBS:-4}"

die() { echo "fetch-fonts: $*" >&2; exit 2; }
[ -f "$reserved" ] || die "reserved-font list not found: $reserved (set HANDLINE_RESERVED_FONTS); refusing to fetch any font"
[ -f "$catalogue" ] || die "font catalogue not found: $catalogue"

# Weight and style words dropped from the end of a family name before comparing (the reserved list's rule).
style_words=" thin hairline extralight ultralight light regular normal book roman medium semibold demibold bold extrabold ultrabold black heavy italic oblique semi demi extra ultra "
norm_family() {
  local words w out
  words=$(printf '%s' "$1" | tr '[:upper:]' '[:lower:]' | sed -E 's/([a-z])(thin|light|regular|medium|semibold|demibold|bold|black|heavy|italic|oblique)$/\1 \2/; s/[-_]+/ /g')
  read -r -a w <<< "$words"
  while [ ${#w[@]} -gt 1 ] && [[ "$style_words" == *" ${w[-1]} "* ]]; do unset 'w[-1]'; done
  out=$(printf '%s' "${w[@]}")
  printf '%s' "$out"
}
# A family's folder name, in REPLY: lowercase, runs of other characters as one hyphen (no subprocess: it runs
# once a family on every fetch).
slug() {
  local s="${1,,}"
  s="${s//[^a-z0-9]/-}"
  while [[ "$s" == *--* ]]; do s="${s//--/-}"; done
  s="${s#-}"; REPLY="${s%-}"
}

# The reserved list.
declare -A res_family=() res_debian=() res_npm=()
while IFS= read -r line || [ -n "$line" ]; do
  line="${line%%#*}"; [[ "$line" =~ ^[[:space:]]*$ ]] && continue
  kind="${line%%:*}"; value=$(printf '%s' "${line#*:}" | sed -E 's/^[[:space:]]+//; s/[[:space:]]+$//')
  case "$kind" in
    family) res_family[$(norm_family "$value")]="$value" ;;
    debian) res_debian[${value,,}]="$value" ;;
    npm) res_npm[${value,,}]="$value" ;;
    *) die "$reserved: unknown entry kind '$kind' in: $line" ;;
  esac
done < "$reserved"
[ ${#res_family[@]} -gt 0 ] || die "$reserved lists no reserved family; refusing to trust it"

# Read and check the whole catalogue before fetching anything.
rows=(); refused=(); declare -A seen=()
while IFS=$'\t' read -r family source group split licence file notes || [ -n "$family" ]; do
  [[ -z "$family" || "$family" == \#* ]] && continue
  [ -n "${source:-}" ] && [ -n "${group:-}" ] && [ -n "${split:-}" ] && [ -n "${licence:-}" ] \
    || die "$catalogue: incomplete row for '$family'"
  case "$split" in train|valid|test) ;; *) die "$catalogue: '$family' has unknown split '$split'" ;; esac
  nf=$(norm_family "$family")
  [ -z "${seen[$nf]:-}" ] || die "$catalogue: family '$family' listed twice"
  seen[$nf]=1
  [ -n "${res_family[$nf]:-}" ] && refused+=("$family: reserved family '${res_family[$nf]}'")
  case "$source" in
    debian:*) pkg="${source#debian:}"
      [ -n "${res_debian[${pkg,,}]:-}" ] && refused+=("$family: reserved Debian package $pkg")
      [ -n "${file:-}" ] && [ "$file" != "-" ] || die "$catalogue: Debian row '$family' names no file" ;;
    npm:*) spec="${source#npm:}"; pkg="${spec%@*}"
      [[ "$spec" == @*/*@* ]] || die "$catalogue: '$family' npm source must be @scope/name@version: $source"
      [ -n "${res_npm[${pkg,,}]:-}" ] && refused+=("$family: reserved npm package $pkg")
      pf=$(norm_family "${pkg##*/}")
      [ -n "${res_family[$pf]:-}" ] && refused+=("$family: npm package $pkg is reserved family '${res_family[$pf]}'") ;;
    *) die "$catalogue: '$family' has unknown source '$source'" ;;
  esac
  rows+=("$family"$'\t'"$source"$'\t'"$group"$'\t'"$split"$'\t'"${file:--}")
done < "$catalogue"
if [ ${#refused[@]} -gt 0 ]; then
  printf 'fetch-fonts: REFUSED, the catalogue names reserved fonts (%s):\n' "$reserved" >&2
  printf '  %s\n' "${refused[@]}" >&2
  exit 3
fi
echo "fetch-fonts: ${#rows[@]} families in $catalogue, none reserved"

mkdir -p "$dest"
# Remove what the catalogue does not name (older layouts, families moved or dropped).
rm -rf "$dest/debian" "$dest/npm"
declare -A wanted=()
for r in "${rows[@]}"; do
  IFS=$'\t' read -r family source group split file <<< "$r"
  slug "$family"; wanted["$split"]=1; wanted["$split/$group"]=1; wanted["$split/$group/$REPLY"]=1
done
for s in train valid test; do
  [ -d "$dest/$s" ] || continue
  while IFS= read -r p; do
    rel="${p#"$dest"/}"
    [ -n "${wanted[$rel]:-}" ] || { rm -rf "$p"; }
  done < <(find "$dest/$s" -mindepth 1 -maxdepth 2 | sort -r) # GROUP and GROUP/SLUG; a family's files stay
done

# Debian packages first (one apt-get run for all that are missing).
missing=()
for r in "${rows[@]}"; do
  IFS=$'\t' read -r family source group split file <<< "$r"
  [[ "$source" == debian:* ]] || continue
  p="${source#debian:}"
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "ok installed" || missing+=("$p")
done
if [ ${#missing[@]} -gt 0 ]; then
  mapfile -t missing < <(printf '%s\n' "${missing[@]}" | sort -u)
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "${missing[@]}" >/dev/null
fi

tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
has_font() { compgen -G "$1/*.[ot]tf" >/dev/null || compgen -G "$1/*.woff" >/dev/null; }
fetch_one() { # family source group split file -> copies one font, or prints "FAILED family: reason"
  local family=$1 source=$2 group=$3 split=$4 file=$5 dir f spec name work
  slug "$family"; dir="$dest/$split/$group/$REPLY"
  case "$source" in
    debian:*)
      f=$(dpkg -L "${source#debian:}" | grep -E "/$file\$" | head -1 || true)
      [ -n "$f" ] && [ -f "$f" ] || { echo "FAILED $family: ${source#debian:} has no $file"; return 0; } ;;
    npm:*)
      spec="${source#npm:}"; name="${spec%@*}"; name="${name##*/}"; work="$tmp/$name"
      mkdir -p "$work"
      ( cd "$work" && npm pack --silent "$spec" >/dev/null 2>&1 ) || { echo "FAILED $family: npm pack $spec"; return 0; }
      tar -xzf "$work"/*.tgz -C "$work" || { echo "FAILED $family: bad archive"; return 0; }
      f="$work/package/files/$name-latin-400-normal.woff"
      [ -f "$f" ] || { echo "FAILED $family: $spec has no $name-latin-400-normal.woff"; return 0; } ;;
  esac
  rm -rf "$dir" "$dir.part" && mkdir -p "$dir.part" && cp "$f" "$dir.part/" && mv "$dir.part" "$dir"
  [ "${source%%:*}" = npm ] && rm -rf "$work"
  return 0
}
failures="$tmp/failures"; : > "$failures"
running=0
for r in "${rows[@]}"; do
  IFS=$'\t' read -r family source group split file <<< "$r"
  slug "$family"; has_font "$dest/$split/$group/$REPLY" && continue
  fetch_one "$family" "$source" "$group" "$split" "$file" >> "$failures" &
  running=$((running + 1))
  if [ "$running" -ge "$jobs" ]; then wait -n || true; running=$((running - 1)); fi
done
wait
find "$dest" -maxdepth 4 -name '*.part' -type d -exec rm -rf {} +
if [ -s "$failures" ]; then cat "$failures" >&2; die "$(wc -l < "$failures") families could not be fetched"; fi

for s in train valid test; do
  n=$(find "$dest/$s" -mindepth 2 -maxdepth 2 -type d 2>/dev/null | wc -l)
  printf 'fonts %-5s %3d families:' "$s" "$n"
  for g in "$dest/$s"/*/; do [ -d "$g" ] && printf ' %s %d' "$(basename "$g")" "$(find "$g" -mindepth 1 -maxdepth 1 -type d | wc -l)"; done
  echo
done
