#!/usr/bin/env bash
# Makes sure Debian's chromium is at /usr/bin/chromium for the Playwright tests.
# Installs it with apt-get when it is missing and we may (root, or password-less sudo);
# otherwise stops with a message that says how to install it. Playwright never downloads a browser here.
set -euo pipefail

CHROMIUM=/usr/bin/chromium

if [ -x "$CHROMIUM" ]; then
  exit 0
fi

SUDO=""
if [ "$(id -u)" -ne 0 ]; then
  if command -v sudo >/dev/null 2>&1 && sudo -n true 2>/dev/null; then
    SUDO="sudo -n"
  else
    SUDO="unavailable"
  fi
fi

if [ "$SUDO" != "unavailable" ] && command -v apt-get >/dev/null 2>&1; then
  echo "ensureChromium: $CHROMIUM is missing; installing Debian's chromium package with apt-get..."
  export DEBIAN_FRONTEND=noninteractive
  $SUDO apt-get update
  $SUDO apt-get install -y chromium
  if [ -x "$CHROMIUM" ]; then
    echo "ensureChromium: installed $CHROMIUM"
    exit 0
  fi
  echo "ensureChromium: apt-get finished but $CHROMIUM is still missing." >&2
fi

cat >&2 <<MSG
The browser tests need Debian's chromium at $CHROMIUM, and it is not installed.
Install it, then run the tests again:

    sudo apt-get update && sudo apt-get install -y chromium

(Run as root without sudo if you are root. Crestline's tests do not download a browser.)
MSG
exit 1
