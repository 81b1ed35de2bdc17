#!/usr/bin/env bash
# Makes sure the Debian packages the tests need are here: PostgreSQL's server binaries and
# Chromium (for the end-to-end tests) and poppler-utils (pdftoppm, to read back label PDFs). As root it installs what is missing with apt-get;
# otherwise it says what to install. Runs before `npm test` (the `pretest` script).
set -euo pipefail

missing=()
compgen -G '/usr/lib/postgresql/*/bin/initdb' >/dev/null || command -v initdb >/dev/null || missing+=(postgresql)
[ -x "${CHROMIUM_PATH:-/usr/bin/chromium}" ] || missing+=(chromium)
command -v pdftoppm >/dev/null || missing+=(poppler-utils)

[ ${#missing[@]} -eq 0 ] && exit 0

if [ "$(id -u)" -eq 0 ]; then
  echo "Installing Debian packages the tests need: ${missing[*]}"
  export DEBIAN_FRONTEND=noninteractive
  apt-get update -q
  apt-get install -y -q --no-install-recommends "${missing[@]}"
  exit 0
fi

echo "The tests need these Debian packages: ${missing[*]}" >&2
echo "Install them with:  sudo apt-get install -y ${missing[*]}" >&2
if [[ " ${missing[*]} " == *" postgresql "* ]] || [ "${CI:-}" = "true" ]; then exit 1; fi
echo "(Continuing: the end-to-end tests will be skipped.)" >&2
