#!/usr/bin/env bash
# Installs what the end-to-end tests need, when it is missing: Debian's chromium (the browser),
# libkrb5-dev (a native module of code-server builds against it) and ripgrep (code-server's search
# binary is taken from it), then code-server in test/e2e/code-server/ with its own lockfile.
# Exit 0: ready. Exit 3: impossible on this machine, with one line saying why.
set -uo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
cs_dir="$here/code-server"
cs_version=4.100.3
rg_version=v13.0.0-10          # the ripgrep release that @vscode/ripgrep 1.15.11 expects
rg_cache=vscode-ripgrep-cache-1.15.11

fail() { echo "e2e: cannot install chromium/code-server here: $*"; exit 3; }
log() { echo "e2e install: $*" >&2; }

# --- Debian packages ------------------------------------------------------------------------
have_debs() {
  [ -x /usr/bin/chromium ] && [ -x /usr/bin/rg ] && dpkg-query -W -f='${Status}' libkrb5-dev 2>/dev/null | grep -q 'install ok installed'
}
if ! have_debs; then
  command -v apt-get >/dev/null || fail "apt-get not found (chromium, libkrb5-dev and ripgrep are Debian packages)"
  [ "$(id -u)" = 0 ] || command -v sudo >/dev/null || fail "apt-get needs root"
  sudo_=(); [ "$(id -u)" = 0 ] || sudo_=(sudo -n)
  export DEBIAN_FRONTEND=noninteractive
  # Wait for another apt-get holding the lock rather than failing at once.
  apt=("${sudo_[@]}" apt-get -o DPkg::Lock::Timeout=240 -q)
  log "apt-get install chromium libkrb5-dev ripgrep"
  if ! timeout 420 "${apt[@]}" install -y chromium libkrb5-dev ripgrep >&2; then
    log "apt-get update, then install again"
    timeout 180 "${apt[@]}" update >&2 || fail "apt-get update failed"
    timeout 420 "${apt[@]}" install -y chromium libkrb5-dev ripgrep >&2 || fail "apt-get install chromium libkrb5-dev ripgrep failed"
  fi
  have_debs || fail "chromium, ripgrep or libkrb5-dev still missing after apt-get"
fi

# --- code-server ------------------------------------------------------------------------------
installed_version() {
  node -p "require('$cs_dir/node_modules/code-server/package.json').version" 2>/dev/null
}
cs_ready() {
  [ "$(installed_version)" = "$cs_version" ] &&
    [ -x "$cs_dir/node_modules/code-server/lib/vscode/node_modules/@vscode/ripgrep/bin/rg" ]
}
if cs_ready; then
  log "code-server $cs_version already installed"
  exit 0
fi

command -v npm >/dev/null || fail "npm not found"
tmp="$(mktemp -d)" || fail "mktemp failed"
trap 'rm -rf "$tmp"' EXIT
# @vscode/ripgrep's postinstall downloads rg unless it finds this tarball in TMPDIR: give it
# Debian's rg, so that the install needs no host other than the npm registry.
mkdir -p "$tmp/$rg_cache"
tar -czf "$tmp/$rg_cache/ripgrep-$rg_version-x86_64-unknown-linux-musl.tar.gz" -C /usr/bin rg ||
  fail "could not pack /usr/bin/rg for the ripgrep postinstall"

# npm ci when the lockfile exists (the pinned tree), npm install to write it the first time.
npm_cmd=(install)
[ -f "$cs_dir/package-lock.json" ] && npm_cmd=(ci)
log "npm ${npm_cmd[*]} in test/e2e/code-server (about 2 minutes)"
(
  cd "$cs_dir" &&
    TMPDIR="$tmp" npm_config_unsafe_perm=true npm_config_yes=true \
      timeout 600 npm "${npm_cmd[@]}" --no-audit --no-fund --loglevel=error >&2
) || fail "npm ${npm_cmd[*]} of code-server $cs_version failed (see the npm output above)"
cs_ready || fail "code-server $cs_version installed without its ripgrep binary"
log "code-server $cs_version ready"
exit 0
