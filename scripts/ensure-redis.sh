#!/usr/bin/env bash
# Makes sure a Redis server answers on 127.0.0.1:6379 for the Redis-backed tests:
# starts one when it is installed but down, installs it from the OS packages when missing.
set -euo pipefail
if redis-cli -h 127.0.0.1 -p 6379 ping >/dev/null 2>&1; then exit 0; fi
if ! command -v redis-server >/dev/null 2>&1; then
  echo "redis-server not found: installing it from the OS packages" >&2
  apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq redis-server >/dev/null
fi
mkdir -p /var/lib/redis /var/log/redis
redis-server --daemonize yes --bind 127.0.0.1 --port 6379 --dir /var/lib/redis \
  --logfile /var/log/redis/memsweep-test.log --maxmemory-policy noeviction
for _ in $(seq 1 50); do
  redis-cli -h 127.0.0.1 -p 6379 ping >/dev/null 2>&1 && exit 0
  sleep 0.2
done
echo "Redis did not answer on 127.0.0.1:6379" >&2
exit 1
