#!/usr/bin/env bash
# Takes editors/screenshot.png headless: Neovim with the hmb set-up runs in a detached tmux
# session on tools/demo.hmb, shows the inline diagnostics and a hover window, and the pane is
# captured with its colours and drawn as SVG, then PNG.
# Needs: go, nvim, tmux, python3, rsvg-convert (librsvg2-bin). usage: tools/screenshot.sh
set -euo pipefail
tools="$(cd "$(dirname "$0")" && pwd)"
editors="$(dirname "$tools")"
repo="$(dirname "$editors")"
tmp="$(mktemp -d)"
sock="hmbshot$$"
trap 'tmux -L "$sock" kill-server 2>/dev/null || true; rm -rf "$tmp"' EXIT
(cd "$repo" && go build -o "$tmp/hmb" ./cmd/hmb)
cp "$tools/demo.hmb" "$tmp/demo.hmb"

tmux -L "$sock" -f /dev/null new-session -d -x 112 -y 28 -e TERM=tmux-256color \
  "cd $tmp && nvim --clean -n -i NONE --cmd 'set runtimepath^=$editors/nvim' \
     --cmd 'lua require(\"hmb\").setup({ cmd = { \"$tmp/hmb\", \"lsp\" } })' \
     -c 'set number laststatus=0 noruler noshowmode' \
     -c 'hi NormalFloat ctermbg=238 ctermfg=255' demo.hmb"
# Wait until the diagnostics are drawn (the HMB601 text appears as virtual text).
for _ in $(seq 1 100); do
  if tmux -L "$sock" capture-pane -p | grep -q 'HMB601\|expectation failed'; then break; fi
  sleep 0.1
done
# Hover on LP where the valve sends it out (line 13, column 7).
tmux -L "$sock" send-keys ':call cursor(13, 7) | lua vim.lsp.buf.hover()' Enter
sleep 1.5
tmux -L "$sock" capture-pane -e -p > "$tmp/capture.txt"
[ -z "${HMB_SHOT_CAPTURE:-}" ] || cp "$tmp/capture.txt" "$HMB_SHOT_CAPTURE"
python3 "$tools/ansi_svg.py" < "$tmp/capture.txt" > "$tmp/screenshot.svg"
rsvg-convert -o "$tmp/screenshot.png" "$tmp/screenshot.svg"
mv "$tmp/screenshot.png" "$editors/screenshot.png"
echo "wrote $editors/screenshot.png"
