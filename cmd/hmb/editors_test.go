package main

import (
	"bytes"
	"encoding/json"
	"maps"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"slices"
	"sort"
	"strings"
	"testing"

	"hmb/lang/check"
	"hmb/thermo/model"
)

// editorWords are the notation's words the editor grammars highlight, from the catalogue and the
// checker: editors/tools/words.json, which editors/tools/grammar.py reads.
type editorWords struct {
	Kinds      []string `json:"kinds"`
	Roles      []string `json:"roles"`
	Properties []string `json:"properties"` // stream properties, unit parameters and results
	Settings   []string `json:"settings"`
}

func catalogueWords() editorWords {
	w := editorWords{Kinds: slices.Sorted(maps.Keys(model.Kinds)), Settings: check.Settings}
	seenRole, seenProp := map[string]bool{}, map[string]bool{}
	addProp := func(p string) {
		if !seenProp[p] {
			seenProp[p] = true
			w.Properties = append(w.Properties, p)
		}
	}
	for _, r := range model.StreamResults {
		addProp(r.Name)
	}
	for _, r := range model.TotalResults {
		addProp(r.Name)
	}
	for _, n := range w.Kinds {
		k := model.Kinds[n]
		for _, p := range k.Ports {
			if !seenRole[p.Role] {
				seenRole[p.Role] = true
				w.Roles = append(w.Roles, p.Role)
			}
		}
		for _, p := range k.Params {
			addProp(p.Name)
		}
		for _, r := range k.Results {
			addProp(r.Name)
		}
	}
	w.Roles = append(w.Roles, slices.Sorted(maps.Keys(check.RoleAliases))...)
	return w
}

const editorsDir = "../../editors"

// TestEditorWords keeps editors/tools/words.json equal to the catalogue (-update rewrites it),
// the grammars that editors/tools/grammar.py generates from it current, and the hand-written
// word lists of the Neovim and Emacs modes equal to it.
func TestEditorWords(t *testing.T) {
	want := catalogueWords()
	b, err := json.MarshalIndent(want, "", "  ")
	if err != nil {
		t.Fatal(err)
	}
	b = append(b, '\n')
	path := filepath.Join(editorsDir, "tools", "words.json")
	if update() {
		if err := writeFileAtomic(path, b); err != nil {
			t.Fatal(err)
		}
		if out, err := exec.Command("/usr/bin/python3", filepath.Join(editorsDir, "tools", "grammar.py")).CombinedOutput(); err != nil {
			t.Fatalf("grammar.py: %v\n%s", err, out)
		}
	}
	if got, err := os.ReadFile(path); err != nil || !bytes.Equal(got, b) {
		t.Errorf("%s is out of date (go test ./cmd/hmb -run EditorWords -update): %v", path, err)
	}
	if _, err := os.Stat("/usr/bin/python3"); err == nil {
		if out, err := exec.Command("/usr/bin/python3", filepath.Join(editorsDir, "tools", "grammar.py"), "--check").CombinedOutput(); err != nil {
			t.Errorf("grammars out of date with words.json (go test ./cmd/hmb -run EditorWords -update): %v\n%s", err, out)
		}
	}

	// Neovim: syn keyword lines.
	vim, err := os.ReadFile(filepath.Join(editorsDir, "nvim", "syntax", "hmb.vim"))
	if err != nil {
		t.Fatal(err)
	}
	vimGroup := func(group string, drop ...string) []string {
		var out []string
		for _, line := range strings.Split(string(vim), "\n") {
			f := strings.Fields(line)
			if len(f) < 3 || f[0] != "syn" || f[1] != "keyword" || f[2] != group {
				continue
			}
			for _, w := range f[3:] {
				if strings.ContainsAny(w, "=") || w == "contained" || w == "skipwhite" || slices.Contains(drop, w) {
					continue
				}
				out = append(out, w)
			}
		}
		return out
	}
	sameSet(t, "hmb.vim kinds", vimGroup("hmbKind"), want.Kinds)
	sameSet(t, "hmb.vim roles", vimGroup("hmbRole"), want.Roles)
	sameSet(t, "hmb.vim properties", vimGroup("hmbProperty", "fluid"), want.Properties)
	sameSet(t, "hmb.vim settings", vimGroup("hmbSetting"), want.Settings)

	// Emacs: (defconst hmb--NAME '("..." ...)).
	el, err := os.ReadFile(filepath.Join(editorsDir, "emacs", "hmb-mode.el"))
	if err != nil {
		t.Fatal(err)
	}
	elList := func(name string, drop ...string) []string {
		m := regexp.MustCompile(`(?s)\(defconst hmb--` + name + `\s+'\(([^)]*)\)`).FindSubmatch(el)
		if m == nil {
			t.Errorf("hmb-mode.el has no hmb--%s", name)
			return nil
		}
		var out []string
		for _, q := range regexp.MustCompile(`"([^"]*)"`).FindAllSubmatch(m[1], -1) {
			if !slices.Contains(drop, string(q[1])) {
				out = append(out, string(q[1]))
			}
		}
		return out
	}
	sameSet(t, "hmb-mode.el kinds", elList("kinds"), want.Kinds)
	sameSet(t, "hmb-mode.el roles", elList("roles"), want.Roles)
	sameSet(t, "hmb-mode.el properties", elList("properties", "fluid"), want.Properties)
	sameSet(t, "hmb-mode.el settings", elList("settings"), want.Settings)
}

func sameSet(t *testing.T, what string, got, want []string) {
	t.Helper()
	g, w := slices.Clone(got), slices.Clone(want)
	sort.Strings(g)
	sort.Strings(w)
	if !slices.Equal(g, w) {
		t.Errorf("%s: %q, want (from the catalogue) %q", what, got, want)
	}
}
