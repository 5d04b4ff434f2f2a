#!/usr/bin/env bash
# SPDX-License-Identifier: GPL-3.0-or-later
# CI extra, run after the tests: make the Debian package, check its contents, lint it, validate the
# desktop files, install it, run the installed program outside the source tree, then remove it.
# Needs root (CI runs as root) or sudo.
set -euo pipefail
cd "$(dirname "$0")/.."
src_dir="$PWD"
build_dir="${AMPWRIGHT_BUILD_DIR:-build}"
sudo=""
[ "$(id -u)" -ne 0 ] && sudo="sudo"
step() { echo "== package: $* ($(( $(date +%s) - t0 )) s)"; }
t0=$(date +%s)

tools=()
command -v lintian >/dev/null || tools+=(lintian)
command -v desktop-file-validate >/dev/null || tools+=(desktop-file-utils)
command -v appstreamcli >/dev/null || tools+=(appstream)
command -v update-mime-database >/dev/null || tools+=(shared-mime-info)
command -v man >/dev/null || tools+=(man-db)
if [ ${#tools[@]} -gt 0 ]; then
    step "installing ${tools[*]}"
    $sudo apt-get update -q
    DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -q --no-install-recommends "${tools[@]}"
fi

step "building the package"
bash packaging/setup.sh package
debs=("$build_dir"/ampwright_*.deb)
[ ${#debs[@]} -eq 1 ] && [ -f "${debs[0]}" ] || { echo "expected one ampwright_*.deb in $build_dir" >&2; exit 1; }
deb="$(cd "$(dirname "${debs[0]}")" && pwd)/$(basename "${debs[0]}")"

step "contents of $(basename "$deb")"
dpkg-deb --info "$deb"
listing="$(dpkg-deb -c "$deb" | awk '{print $6}')"
echo "$listing"
missing=0
for f in ./usr/bin/ampwright ./usr/share/ampwright/demos/garden-cart.ampw ./usr/share/ampwright/resources/ \
         ./usr/share/applications/ampwright.desktop ./usr/share/icons/hicolor/scalable/apps/ampwright.svg \
         ./usr/share/icons/hicolor/{16x16,32x32,48x48,64x64,128x128,256x256}/apps/ampwright.png \
         ./usr/share/mime/packages/ampwright.xml ./usr/share/metainfo/org.ampwright.Ampwright.metainfo.xml \
         ./usr/share/man/man1/ampwright.1.gz ./usr/share/doc/ampwright/copyright \
         ./usr/share/doc/ampwright/changelog.Debian.gz; do
    grep -qxF "$f" <<<"$listing" || { echo "missing from the package: $f" >&2; missing=1; }
done
grep -q '^\./usr/share/ampwright/parts/.*\.json$' <<<"$listing" || { echo "no parts in the package" >&2; missing=1; }
if grep -v '^\./usr/' <<<"$listing" | grep -vqx '\./'; then
    echo "files outside /usr in the package" >&2; missing=1
fi
[ $missing -eq 0 ]
for field in Depends Section Maintainer; do
    [ -n "$(dpkg-deb -f "$deb" "$field")" ] || { echo "the package has no $field" >&2; exit 1; }
done
[ "$(dpkg-deb -f "$deb" Section)" = electronics ]
grep -q 'libqt6core6' <<<"$(dpkg-deb -f "$deb" Depends)" || { echo "Depends lacks Qt 6" >&2; exit 1; }

step "lintian"
lintian --allow-root --fail-on error --display-info "$deb" | tee "$build_dir/lintian.txt"
echo "lintian: $(grep -c '^E: ' "$build_dir/lintian.txt" || true) errors," \
     "$(grep -c '^W: ' "$build_dir/lintian.txt" || true) warnings"

step "desktop entry, AppStream metadata, MIME type, manual page"
work="$(mktemp -d)"
installed=0
cleanup() {
    if [ $installed -eq 1 ]; then $sudo dpkg -r ampwright >/dev/null || true; fi
    rm -rf "$work"
}
trap cleanup EXIT
dpkg-deb -x "$deb" "$work/root"
desktop-file-validate "$work/root/usr/share/applications/ampwright.desktop"
appstreamcli validate --no-net "$work/root/usr/share/metainfo/org.ampwright.Ampwright.metainfo.xml"
mkdir -p "$work/mime/packages"
cp "$work/root/usr/share/mime/packages/ampwright.xml" "$work/mime/packages/"
mime_log="$(update-mime-database "$work/mime" 2>&1)"
if ! grep -qx '[0-9]*:application/x-ampwright-design:\*\.ampw' "$work/mime/globs2" ||
   ! grep -qx 'application/x-ampwright-design application/json' "$work/mime/subclasses"; then
    echo "the MIME XML does not register *.ampw as a sub-class of application/json: $mime_log" >&2
    exit 1
fi
warnings="$(MANWIDTH=80 LC_ALL=C.UTF-8 man --warnings -l "$work/root/usr/share/man/man1/ampwright.1.gz" 2>&1 >/dev/null)"
[ -z "$warnings" ] || { echo "man warns: $warnings" >&2; exit 1; }

step "installing"
installed=1
if ! $sudo dpkg -i "$deb"; then
    $sudo apt-get update -q
    DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -q -f
fi
[ "$(dpkg-query -W -f='${Status}' ampwright)" = "install ok installed" ]

step "running the installed program from $work"
cd "$work"
run() { env -u AMPWRIGHT_SOURCE_DIR -u DISPLAY -u WAYLAND_DISPLAY -u QT_QPA_PLATFORM "$@"; }
[ "$(command -v ampwright)" = /usr/bin/ampwright ]
run ampwright --help
run ampwright --version
run ampwright evaluate /usr/share/ampwright/demos/garden-cart.ampw --json "$work/x.json"
grep -q '"operatingPoints"' "$work/x.json"
# Without a design and a display the program evaluates its demo: it must be the installed one.
run ampwright | tee "$work/headless.txt"
grep -qF "/usr/share/ampwright/demos/garden-cart.ampw" "$work/headless.txt"
[ -s "$work/garden-cart-results.json" ]
if [ -f /usr/share/man/man1/ampwright.1.gz ]; then
    MANWIDTH=80 man -P cat ampwright | grep 'evaluate' >/dev/null
fi
grep -q ':application/x-ampwright-design:\*\.ampw$' /usr/share/mime/globs2
if [ -f /usr/share/applications/mimeinfo.cache ]; then
    grep -q '^application/x-ampwright-design=.*ampwright\.desktop' /usr/share/applications/mimeinfo.cache
fi
cd "$src_dir"

step "removing"
$sudo dpkg -r ampwright
installed=0
if [ -e /usr/bin/ampwright ] || [ -e /usr/share/ampwright/demos ]; then
    echo "files left after dpkg -r" >&2; exit 1
fi
if grep -q 'x-ampwright-design' /usr/share/mime/globs2; then
    echo "the MIME type is still registered after dpkg -r" >&2; exit 1
fi
step "done"
