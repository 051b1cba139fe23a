#!/usr/bin/env bash
# Everything the tests need besides npm packages, on a fresh machine: a Redis server answering
# on 127.0.0.1:6379 (started, or installed from the OS packages) and the OS's Chromium for the
# web page's browser tests (playwright-core drives it; no browser download), and the Python
# environment of the Python client's tests (scripts/ensure-python-venv.sh).
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/ensure-redis.sh
if [ ! -x /usr/bin/chromium ]; then
  echo "chromium not found: installing it from the OS packages" >&2
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
fi
bash scripts/ensure-python-venv.sh
