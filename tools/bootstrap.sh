#!/usr/bin/env bash
# Entry point of `npm start`, `npm test` and `npm run dev`: checks Node, installs the exact
# dependencies when node_modules is missing or older than package-lock.json, then hands over
# to the TypeScript command in tools/.
set -euo pipefail
cd "$(dirname "$0")/.."
command="${1:?usage: bootstrap.sh start|test|dev [args]}"
shift

major="$(node -p 'process.versions.node.split(".")[0]' 2>/dev/null || echo 0)"
if [ "$major" -lt 20 ]; then
  echo "Beadroll needs Node.js 20 (see .nvmrc); this is $(node -v 2>/dev/null || echo 'no node')." >&2
  exit 1
fi

quick=0
for arg in "$@"; do [ "$arg" = "--quick" ] && quick=1; done

stamp=node_modules/.beadroll-installed
want="$(sha256sum package-lock.json | cut -d' ' -f1)"
if [ ! -d node_modules ] || { [ "$quick" = 0 ] && [ "$(cat "$stamp" 2>/dev/null)" != "$want" ]; }; then
  echo "installing dependencies (npm ci)…"
  npm ci --no-audit --no-fund --loglevel=error
  echo "$want" > "$stamp"
fi

exec node_modules/.bin/tsx "tools/$command.ts" "$@"
