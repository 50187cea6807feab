#!/usr/bin/env bash
# Gathers the handwriting-style fonts used to synthesise training lines into $1 (default .cache/fonts).
# Debian packages (installed with apt-get) and npm @fontsource packages (WOFF files). Idempotent.
set -euo pipefail
dest="${1:-.cache/fonts}"
mkdir -p "$dest/debian" "$dest/npm"
debs=(fonts-dkg-handwriting fonts-breip fonts-humor-sans fonts-dancingscript fonts-rufscript
      fonts-kaushanscript fonts-comic-neue fonts-havana fonts-levien-typoscript)
missing=()
for p in "${debs[@]}"; do dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "ok installed" || missing+=("$p"); done
if [ ${#missing[@]} -gt 0 ]; then
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "${missing[@]}" >/dev/null
fi
for p in "${debs[@]}"; do
  dpkg -L "$p" | grep -iE '\.(ttf|otf)$' | while read -r f; do cp -n "$f" "$dest/debian/"; done
done
npms=(caveat indie-flower patrick-hand shadows-into-light homemade-apple gloria-hallelujah reenie-beanie
      kalam architects-daughter nanum-pen-script cedarville-cursive covered-by-your-grace rock-salt
      handlee gochi-hand delius itim neucha marck-script satisfy allura great-vibes sacramento parisienne
      yellowtail cookie courgette damion annie-use-your-telescope the-girl-next-door schoolbell
      short-stack sue-ellen-francisco swanky-and-moo-moo mansalva herr-von-muellerhoff italianno
      pinyon-script alex-brush rochester tangerine caveat-brush)
tmp=$(mktemp -d)
for n in "${npms[@]}"; do
  if ls "$dest/npm/$n-"* >/dev/null 2>&1; then continue; fi
  ( cd "$tmp" && npm pack --silent "@fontsource/$n@5.3.0" >/dev/null 2>&1 ) || { echo "skip $n" >&2; continue; }
  tgz=$(ls "$tmp"/fontsource-"$n"-*.tgz | head -1)
  mkdir -p "$tmp/$n" && tar -xzf "$tgz" -C "$tmp/$n"
  # Latin subset, normal style, regular weight (400); fall back to any latin woff.
  f=$(ls "$tmp/$n"/package/files/*-latin-400-normal.woff 2>/dev/null | head -1 || true)
  [ -n "$f" ] || f=$(ls "$tmp/$n"/package/files/*-latin-*-normal.woff 2>/dev/null | head -1 || true)
  [ -n "$f" ] && cp "$f" "$dest/npm/$n-$(basename "$f")"
done
rm -rf "$tmp"
ls "$dest"/debian "$dest"/npm | grep -ciE '\.(ttf|otf|woff)$' | xargs echo "fonts:"
