#!/usr/bin/env bash
# CI for editors/: builds and tests the editor and CI integrations against a freshly built hmb.
#   - grammars are up to date with editors/tools/grammar.py
#   - VS Code extension: npm ci, compile, grammar tests (vscode-tmgrammar-test), tests of the
#     extension with a stand-in editor API and a real hmb, .vsix package
#   - Neovim: headless end-to-end test against hmb lsp (diagnostics, hover, syntax, indent; the
#     diagnostics of every testdata/examples file equal hmb check's)
#   - CI integrations: the GitHub workflow steps and the pre-commit hooks on sample repositories
#   - Emacs: hmb-mode byte-compiles cleanly; ERT tests of the mode and of eglot with hmb lsp
#   - Helix: languages.toml parses
# Installs what it needs with apt-get (as root) and npm. Run from anywhere.
set -euo pipefail
editors="$(cd "$(dirname "$0")" && pwd)"
repo="$(dirname "$editors")"
export DEBIAN_FRONTEND=noninteractive

need=()
command -v nvim >/dev/null || need+=(neovim)
command -v pre-commit >/dev/null || need+=(pre-commit)
command -v git >/dev/null || need+=(git)
command -v emacs >/dev/null || need+=(emacs-nox)
compgen -G '/usr/share/emacs/site-lisp/elpa-src/eglot-*' >/dev/null || need+=(elpa-eglot)
python3 -c 'import yaml' 2>/dev/null || need+=(python3-yaml)
if [ ${#need[@]} -gt 0 ]; then
  echo "== apt-get install ${need[*]}"
  apt-get update -qq
  apt-get install -y -qq --no-install-recommends "${need[@]}" >/dev/null
fi
node_major="$(node -p 'process.versions.node.split(".")[0]' 2>/dev/null || echo 0)"
if [ "$node_major" -lt 20 ]; then
  echo "editors/ci.sh: Node.js 20 or later is needed for the VS Code extension (found: ${node_major})" >&2
  exit 1
fi

tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT
echo "== build hmb"
(cd "$repo" && go build -o "$tmp/hmb" ./cmd/hmb)

echo "== grammars generated from editors/tools/grammar.py"
python3 "$editors/tools/grammar.py" --check

echo "== VS Code extension"
(
  cd "$editors/vscode"
  npm ci --no-audit --no-fund --loglevel=error
  npm run --silent compile
  npm run --silent test:grammar
  HMB="$tmp/hmb" npm run --silent test:unit > "$tmp/unit.log" 2>&1 || { cat "$tmp/unit.log"; exit 1; }
  grep -E '^# (pass|fail)' "$tmp/unit.log"
  rm -f ./*.vsix
  npm run --silent package > "$tmp/package.log" 2>&1 || { cat "$tmp/package.log"; exit 1; }
  vsix="$(ls ./*.vsix)"
  unzip -Z1 "$vsix" > "$tmp/vsix-files"
  grep -qx 'extension/out/extension.js' "$tmp/vsix-files"
  grep -qx 'extension/syntaxes/hmb.tmLanguage.json' "$tmp/vsix-files"
  grep -qx 'extension/node_modules/vscode-languageclient/package.json' "$tmp/vsix-files"
  echo "packaged $vsix ($(wc -c < "$vsix") bytes)"
  rm -f "$vsix"
)

echo "== Neovim end-to-end"
"$editors/nvim/test/run.sh" "$tmp/hmb"

echo "== CI integrations (GitHub workflow, pre-commit)"
"$editors/ci/test.sh" "$tmp/hmb"

echo "== Emacs (ERT: hmb-mode, and eglot with hmb lsp) and Helix"
cp "$editors/emacs/hmb-mode.el" "$tmp/"
emacs --batch --eval '(setq byte-compile-error-on-warn t)' -f batch-byte-compile "$tmp/hmb-mode.el" \
  > "$tmp/elc.log" 2>&1 || { cat "$tmp/elc.log"; exit 1; }
if ! out="$(HMB="$tmp/hmb" emacs --batch -L "$editors/emacs" -l "$editors/emacs/test/hmb-mode-test.el" \
  -l "$editors/emacs/test/hmb-eglot-test.el" -f ert-run-tests-batch-and-exit 2>&1)"; then
  echo "$out"
  exit 1
fi
grep -E '^ *(passed|SKIPPED|Ran )' <<<"$out"
python3 -c 'import sys, tomllib; c = tomllib.load(open(sys.argv[1], "rb")); assert c["language"][0]["name"] == "hmb"' \
  "$editors/helix/languages.toml"
echo "editors CI passed"
