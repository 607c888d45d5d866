#!/usr/bin/env bash
# Headless Neovim end-to-end test: usage: test/run.sh [PATH_TO_HMB]
# Without an argument, builds hmb from the repository into a temporary directory.
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
nvimdir="$(dirname "$here")"
repo="$(cd "$nvimdir/../.." && pwd)"
if [ $# -ge 1 ]; then
  hmb="$1"
else
  tmp="$(mktemp -d)"
  trap 'rm -rf "$tmp"' EXIT
  (cd "$repo" && go build -o "$tmp/hmb" ./cmd/hmb)
  hmb="$tmp/hmb"
fi
command -v nvim >/dev/null || { echo "nvim not installed" >&2; exit 2; }
HMB="$hmb" timeout 90 nvim --headless --clean -n -i NONE \
  --cmd "set runtimepath^=$nvimdir" \
  -c "luafile $here/e2e.lua" 2>&1
