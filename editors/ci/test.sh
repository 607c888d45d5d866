#!/usr/bin/env bash
# Runs the commands of the CI integrations against throwaway repositories of calc files:
#  1. the steps "check" and "fmt" of github-workflow.yml, read from the file itself, on a clean
#     repository and on one with an error and a badly laid-out file; the SARIF is checked for
#     what code scanning needs (rule, level, relative file, line and column).
#  2. the hooks of .pre-commit-hooks.yaml through pre-commit itself: a copy of the hmb source
#     with the manifest at its root (where pre-commit looks for it) serves as the hook repository.
# usage: editors/ci/test.sh [PATH_TO_HMB]    (default: build it from this repository)
# Needs: go, git, python3 with yaml, pre-commit.
set -euo pipefail
ci="$(cd "$(dirname "$0")" && pwd)"
repo="$(cd "$ci/../.." && pwd)"
tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT
mkdir -p "$tmp/bin"
if [ $# -ge 1 ]; then
  cp "$1" "$tmp/bin/hmb"
else
  (cd "$repo" && go build -o "$tmp/bin/hmb" ./cmd/hmb)
fi
export PATH="$tmp/bin:$PATH"
fail=0
ok() { echo "ok   $*"; }
bad() { echo "FAIL $*"; fail=1; }
git_() { git -c user.name=test -c user.email=test@example.invalid -c init.defaultBranch=main -c commit.gpgsign=false "$@"; }

# make_repo DIR [broken]: a git repository of calc files; "broken" adds an unknown unit spelling
# (calcs/broken.hmb line 6) and a file whose layout hmb fmt would change (calcs/layout.hmb).
make_repo() {
  mkdir -p "$1/calcs"
  cp "$ci/testdata/good.hmb" "$1/calcs/good.hmb"
  if [ "${2:-}" = broken ]; then
    sed 's/p 2 barg/p 2 bragg/' "$ci/testdata/good.hmb" > "$1/calcs/broken.hmb"
    sed 's/^  in HP/      in    HP/' "$ci/testdata/good.hmb" > "$1/calcs/layout.hmb"
  fi
  (cd "$1" && git_ init -q && git_ add -A && git_ commit -qm calcs)
}

# run_step DIR ID: runs the workflow step with that id in DIR the way GitHub's runner does
# (bash -eo pipefail), with GITHUB_OUTPUT collected in DIR/.github_output.
run_step() {
  local script
  script="$(python3 - "$ci/github-workflow.yml" "$2" <<'PY'
import sys, yaml
wf = yaml.safe_load(open(sys.argv[1]))
steps = [s for job in wf["jobs"].values() for s in job["steps"] if s.get("id") == sys.argv[2]]
assert len(steps) == 1, f"no single step with id {sys.argv[2]}"
print(steps[0]["run"])
PY
)"
  (cd "$1" && GITHUB_OUTPUT="$1/.github_output" bash --noprofile --norc -eo pipefail -c "$script")
}

echo "== GitHub workflow steps"
make_repo "$tmp/clean"
if run_step "$tmp/clean" check >/dev/null 2>&1; then ok "check step passes on a clean repository"; else bad "check step failed on a clean repository"; fi
grep -qx 'status=0' "$tmp/clean/.github_output" && ok "check step records status 0" || bad "check step status: $(cat "$tmp/clean/.github_output")"
if run_step "$tmp/clean" fmt; then ok "fmt step passes on a clean repository"; else bad "fmt step failed on a clean repository"; fi

make_repo "$tmp/broken" broken
if run_step "$tmp/broken" check >/dev/null 2>&1; then ok "check step leaves failing to the last step on findings"; else bad "check step itself failed on findings"; fi
grep -qx 'status=1' "$tmp/broken/.github_output" && ok "check step records status 1 on findings" || bad "check step status: $(cat "$tmp/broken/.github_output")"
out="$(run_step "$tmp/broken" fmt 2>&1)" && bad "fmt step passed a badly laid-out file" || true
[ "$out" = "calcs/layout.hmb" ] && ok "fmt step names calcs/layout.hmb" || bad "fmt step output: $out"

for d in clean broken; do
  if python3 - "$tmp/$d/hmb.sarif" "$d" <<'PY'
import json, sys
log = json.load(open(sys.argv[1]))
assert log["version"] == "2.1.0", log.get("version")
assert "sarif-2.1.0" in log["$schema"], log.get("$schema")
run = log["runs"][0]
assert run["tool"]["driver"]["name"] == "hmb"
rules = run["tool"]["driver"].get("rules", [])
results = run.get("results", [])
errors = [r for r in results if r.get("level", "warning") == "error"]
if sys.argv[2] == "clean":
    assert errors == [], errors
    sys.exit(0)
# calcs/broken.hmb line 6: 'stream LP "process steam" { p 2 bragg }': the unit starts at column 33.
hits = [r for r in results if r["ruleId"] == "HMB301"]
assert len(hits) == 1, results
r = hits[0]
assert rules[r["ruleIndex"]]["id"] == "HMB301", rules
assert r["level"] == "error" and "bragg" in r["message"]["text"], r
loc = r["locations"][0]["physicalLocation"]
assert loc["artifactLocation"]["uri"] == "calcs/broken.hmb", loc
assert loc["region"]["startLine"] == 6 and loc["region"]["startColumn"] == 33, loc["region"]
PY
  then ok "SARIF of the $d repository"; else bad "SARIF of the $d repository"; fi
done

echo "== pre-commit hooks"
hooks="$tmp/hooks"
mkdir -p "$hooks"
(cd "$repo" && tar --exclude=./.git --exclude=./editors -cf - .) | tar -xf - -C "$hooks"
cp "$ci/.pre-commit-hooks.yaml" "$hooks/.pre-commit-hooks.yaml"
(cd "$hooks" && git_ init -q && git_ add -A && git_ commit -qm hooks)
rev="$(git -C "$hooks" rev-parse HEAD)"
# pre-commit builds hmb with `go install ./...` in its own GOPATH; the shared module cache keeps
# that offline.
export PRE_COMMIT_HOME="$tmp/pre-commit-home" GOMODCACHE="$(go env GOMODCACHE)" GOPROXY=off GOFLAGS=-mod=mod GOTOOLCHAIN=local
for d in clean broken; do
  cat > "$tmp/$d/.pre-commit-config.yaml" <<YAML
repos:
  - repo: $hooks
    rev: $rev
    hooks:
      - id: hmb-fmt
      - id: hmb-check
YAML
  (cd "$tmp/$d" && git_ add .pre-commit-config.yaml)
done
if out="$(cd "$tmp/clean" && PATH="${PATH#"$tmp/bin:"}" pre-commit run --all-files 2>&1)"; then
  ok "pre-commit passes a clean repository"
else
  bad "pre-commit failed a clean repository:"; echo "$out"
fi
if out="$(cd "$tmp/broken" && PATH="${PATH#"$tmp/bin:"}" pre-commit run --all-files 2>&1)"; then
  bad "pre-commit passed a broken repository:"; echo "$out"
else
  grep -q 'hmb fmt.*Failed' <<<"$out" && grep -q 'calcs/layout.hmb' <<<"$out" \
    && ok "pre-commit hmb-fmt fails on calcs/layout.hmb" || { bad "hmb-fmt output:"; echo "$out"; }
  grep -q 'hmb check.*Failed' <<<"$out" && grep -q 'HMB301' <<<"$out" \
    && ok "pre-commit hmb-check fails with HMB301" || { bad "hmb-check output:"; echo "$out"; }
fi
(cd "$tmp/broken" && hmb fmt -w calcs/layout.hmb && rm calcs/broken.hmb && git_ add -A)
if out="$(cd "$tmp/broken" && PATH="${PATH#"$tmp/bin:"}" pre-commit run --all-files 2>&1)"; then
  ok "pre-commit passes once fixed (hmb fmt -w, error removed)"
else
  bad "pre-commit still fails after the fixes:"; echo "$out"
fi

[ "$fail" = 0 ] && echo "CI integration tests passed" || { echo "CI integration tests FAILED"; exit 1; }
