#!/bin/bash
# Installs the Debian package (scripts/package) into a minimal Debian 12 root made with
# debootstrap, as on a fresh machine, and tries it as a new user would: `tailwise-cli var` on the
# installed sample, `tailwise --screenshot` under Xvfb, and the MIME association of .tailwise
# files with the program (xdg-mime, from the freedesktop.org shared-mime-info database).
#
# Opt-in (it downloads a base system and Qt's runtime, minutes of work): runs when
# TAILWISE_TEST_PACKAGE=1, as root, with debootstrap available; otherwise it says why and exits
# 77, which ctest reports as skipped. The base root is kept in $FRESH_CACHE (default
# ~/.cache/fresh-debian/base, the same cache as ../shared/fresh-machine-test) and copied per try.
#   TAILWISE_TEST_PACKAGE=1 tests/package/test_package_install.sh [PACKAGE.deb]
set -u
skip() { echo "SKIPPED: $*"; exit 77; }
[[ ${TAILWISE_TEST_PACKAGE:-0} == 1 ]] || skip "set TAILWISE_TEST_PACKAGE=1 to install the package into a debootstrap root (takes minutes)"
[[ $(id -u) -eq 0 ]] || skip "needs root (debootstrap, chroot)"
top=$(cd "$(dirname "$0")/../.." && pwd)
deb=${1:-$(ls "$top"/build-package/tailwise_*.deb 2>/dev/null | head -1)}
[[ -n $deb && -f $deb ]] || skip "no package: run scripts/package first (or pass the .deb)"
command -v debootstrap >/dev/null || apt-get install -y -qq debootstrap >/dev/null 2>&1 \
  || skip "debootstrap is not available on this machine"
cache=${FRESH_CACHE:-$HOME/.cache/fresh-debian}
if [[ ! -f $cache/base/.ready ]]; then
  rm -rf "$cache/base"; mkdir -p "$cache/base"
  debootstrap --variant=minbase bookworm "$cache/base" http://deb.debian.org/debian >"$cache/debootstrap.log" 2>&1 \
    || skip "debootstrap could not make a root (no network?): see $cache/debootstrap.log"
  touch "$cache/base/.ready"
fi
root=$(mktemp -d /tmp/tailwise-package-root.XXXXXX)
cleanup() { umount "$root/proc" "$root/dev" 2>/dev/null; rm -rf "$root"; }
trap cleanup EXIT
cp -a "$cache/base/." "$root/"
cp /etc/resolv.conf "$root/etc/resolv.conf"
cp "$deb" "$root/tmp/tailwise.deb"
mount --bind /proc "$root/proc"; mount --bind /dev "$root/dev"
fail() { echo "FAIL: $*"; exit 1; }
in_root() { chroot "$root" /usr/bin/env -i PATH=/usr/bin:/bin HOME=/root LANG=C.UTF-8 /bin/bash -c "$1"; }

echo "Installing $(basename "$deb") and its dependencies into a fresh Debian root…"
in_root 'apt-get update -qq >/dev/null 2>&1 && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends /tmp/tailwise.deb shared-mime-info desktop-file-utils xdg-utils xvfb xauth >/tmp/install.log 2>&1' \
  || { tail -20 "$root/tmp/install.log"; fail "the package did not install with its dependencies"; }

out=$(in_root 'tailwise-cli var --workbook /usr/share/tailwise/samples/larchmere.tailwise' 2>&1) \
  || fail "tailwise-cli var failed: $out"
grep -q "Value-at-Risk" <<<"$out" || fail "tailwise-cli var printed no Value-at-Risk: $out"
echo "tailwise-cli var: ok"

in_root 'cd /tmp && xvfb-run -a -s "-screen 0 1600x1000x24" tailwise --screenshot /tmp/shot.png /usr/share/tailwise/samples/larchmere.tailwise' \
  >/dev/null 2>&1 || fail "tailwise --screenshot failed under Xvfb"
[[ -s $root/tmp/shot.png ]] || fail "tailwise --screenshot wrote no picture"
echo "tailwise --screenshot: ok ($(stat -c %s "$root/tmp/shot.png") bytes)"

type=$(in_root 'touch /tmp/a.tailwise && xdg-mime query filetype /tmp/a.tailwise' 2>&1)
[[ $type == application/x-tailwise-workbook* ]] || fail "a .tailwise file is of type \"$type\", not application/x-tailwise-workbook"
app=$(in_root 'xdg-mime query default application/x-tailwise-workbook' 2>&1)
[[ $app == tailwise.desktop ]] || fail "application/x-tailwise-workbook opens with \"$app\", not tailwise.desktop"
echo "MIME association: ok (.tailwise -> $type -> $app)"
echo "PASS"
