#!/usr/bin/env bash
# The tests' shared Python environment: a virtual environment at
# ${MEMSWEEP_PY_VENV:-$HOME/.cache/memsweep-test-venv} holding test/python-requirements.txt,
# rebuilt only when that file's hash changed. The requirements come from Debian's python3-*
# packages (the machines reach no Python package index), seen through --system-site-packages.
set -euo pipefail
cd "$(dirname "$0")/.."
VENV=${MEMSWEEP_PY_VENV:-$HOME/.cache/memsweep-test-venv}
REQUIREMENTS=test/python-requirements.txt
PYTHON=/usr/bin/python3
HASH=$(sha256sum "$REQUIREMENTS" | cut -d' ' -f1)

if [ -x "$VENV/bin/python" ] && [ "$(cat "$VENV/.requirements.sha256" 2>/dev/null)" = "$HASH" ]; then
  exit 0
fi

names=$(sed -e 's/#.*//' -e 's/[][<>=!~;, ].*//' "$REQUIREMENTS" | awk 'NF { print tolower($1) }')
missing=""
for package in python3 python3-venv python3-pip $(printf 'python3-%s ' $names); do
  dpkg -s "$package" >/dev/null 2>&1 || missing="$missing $package"
done
if [ -n "$missing" ]; then
  echo "installing from the OS packages:$missing" >&2
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends $missing >/dev/null
fi

rm -rf "$VENV"
mkdir -p "$(dirname "$VENV")"
"$PYTHON" -m venv --system-site-packages --without-pip "$VENV"
# Installs nothing (there is no index): fails if a requirement is not met.
"$VENV/bin/python" -m pip install --no-index --disable-pip-version-check --quiet -r "$REQUIREMENTS"
echo "$HASH" > "$VENV/.requirements.sha256"
echo "Python test environment ready at $VENV" >&2
