package lang

import (
	"fmt"
	"strings"
	"testing"

	"hmb/lang/check"
)

// TestSiteAt: what may be written at each marked place (the | in the source is the cursor).
func TestSiteAt(t *testing.T) {
	tests := []struct {
		name, src string
		want      string // Kinds as names, then the kind, dimension, results or words
	}{
		{"top level", "|", "keyword unitkind"},
		{"top level after a statement", "stream A\n|", "keyword unitkind"},
		{"partial keyword", "str|", "keyword unitkind"},
		{"stream block", "stream A {\n  |\n}", "keyword prop"},
		{"stream block spelling", "stream A { p 5 |}", "spelling pressure"},
		{"stream block fluid", "stream A { fluid |}", "word water,steam"},
		{"unit block", "turbine T1 {\n  |\n}", "role param turbine"},
		{"unit role", "stream A\nvalve V { in |}", "stream valve"},
		{"unit role list", "stream A\nmixer M { in A,\n   |}", "stream mixer"},
		{"unit param spelling", "valve V { dp 3 |}", "spelling pressure valve"},
		{"unit of unknown kind", "frobnicator F {\n  |\n}", ""},
		{"expect target", "expect |", "stream unit word total"},
		{"expect stream result", "stream A\nexpect A |", "result flow,p,T,h,s,x,v,rho,vol_flow,Tsat,superheat,subcooling"},
		{"expect unit result", "turbine T1 { }\nexpect T1 |", "result power,efficiency,dp,sgen turbine"},
		{"expect total result", "expect total |", "result power_out,power_in,net_power,heat_in,heat_out,efficiency,heat_rate"},
		{"expect total spelling", "expect total heat_rate < 9000 |", "spelling heat rate"},
		{"expect result spelling", "stream A\nexpect A h = 3 |", "spelling specific enthalpy"},
		{"expect sgen spelling", "valve V { }\nexpect V sgen > 0 |", "spelling rate of entropy generation valve"},
		{"display", "display |", "word SI,US"},
		{"atmosphere", "atmosphere 99 |", "spelling pressure"},
		{"elevation", "elevation 99 |", "spelling length"},
		{"tolerance", "tolerance 1 |", "spelling dimensionless"},
		{"in a comment", "# a comment |\n", ""},
		{"case block", "case low {\n  |\n}", "stream unit word expect"},
		{"case stream property", "stream A\ncase low { A | }", "prop"},
		{"case unit parameter", "turbine T1 { }\ncase low { T1 | }", "param turbine"},
		{"case value or free", "stream A\ncase low { A T | }", "word free"},
		{"case word parameter", "exchanger HX { }\ncase low { HX arrangement | }", "word free,counterflow,parallel exchanger"},
		{"case spelling", "stream A\ncase low { A p 5 | }", "spelling pressure"},
		{"case unit spelling", "turbine T1 { }\ncase low { T1 power 5 | }", "spelling shaft power turbine"},
		{"case expectation", "stream A\ncase low { expect A | }", "result flow,p,T,h,s,x,v,rho,vol_flow,Tsat,superheat,subcooling"},
		{"sweep block", "sweep s {\n  |\n}", "stream unit word show,case"},
		{"sweep from", "stream A\nsweep s { A flow | }", "word from"},
		{"sweep from spelling", "stream A\nsweep s { A flow from 4 | }", "spelling word mass flow to"},
		{"sweep after from", "stream A\nsweep s { A flow from 4 kg/s | }", "word to"},
		{"sweep step or count", "stream A\nsweep s { A flow from 4 kg/s to 8 kg/s | }", "word step,count"},
		{"sweep step spelling", "stream A\nsweep s { A flow from 4 kg/s to 8 kg/s step 1 | }", "spelling mass flow"},
		{"sweep count", "stream A\nsweep s { A flow from 4 kg/s to 8 kg/s count 5 | }", ""},
		{"sweep show", "stream A\nsweep s { show | }", "stream unit"},
		{"sweep show result", "turbine T1 { }\nsweep s { show T1 | }", "result power,efficiency,dp,sgen turbine"},
		{"sweep show after comma", "stream A\nsweep s { show A T, | }", "stream unit"},
		{"sweep case", "case low { }\ncase high { }\nsweep s { case | }", "word low,high"},
	}
	names := []string{"keyword", "unitkind", "role", "param", "prop", "spelling", "stream", "unit", "result", "word"}
	for _, tt := range tests {
		off := strings.Index(tt.src, "|")
		src := tt.src[:off] + tt.src[off+1:]
		r := Check("t.hmb", []byte(src))
		s := r.SiteAt(off)
		var parts []string
		for i, n := range names {
			if s.Kinds&(1<<i) != 0 {
				parts = append(parts, n)
			}
		}
		if s.Kinds&SiteSpelling != 0 {
			parts = append(parts, s.Dim.String())
		}
		if s.Kinds&SiteResult != 0 {
			var rs []string
			for _, x := range s.Results {
				rs = append(rs, x.Name)
			}
			parts = append(parts, strings.Join(rs, ","))
		}
		if s.Kinds&SiteWord != 0 {
			parts = append(parts, strings.Join(s.Words, ","))
		}
		if s.Kind != nil {
			parts = append(parts, s.Kind.Name)
		}
		if got := strings.Join(parts, " "); got != tt.want {
			t.Errorf("%s: %q at %d: got %q, want %q", tt.name, src, off, got, tt.want)
		}
	}
	// The word being typed is what completion replaces.
	src := "stream A\nvalve V { in A; out Ab }"
	if s := Check("t.hmb", []byte(src)).SiteAt(len(src) - 3); s.Replace.Start != len(src)-4 || s.Replace.End != len(src)-2 {
		t.Errorf("replace %v", s.Replace)
	}
}

// Every setting the checker knows, and every keyword the notation has, has help.
func TestKeywordsCoverSettings(t *testing.T) {
	for _, s := range check.Settings {
		if KeywordDoc(s) == "" {
			t.Errorf("setting %s has no help in keywordDocs", s)
		}
	}
	for _, k := range Keywords() {
		if k.Doc == "" {
			t.Errorf("keyword %s has no help", k.Name)
		}
	}
	if len(keywordDocs) != len(Keywords()) {
		t.Errorf("%d docs for %d keywords", len(keywordDocs), len(Keywords()))
	}
}

func TestValidName(t *testing.T) {
	for _, tt := range []struct {
		name string
		ok   bool
	}{{"S1", true}, {"FW-101", true}, {"_x", true}, {"stream", false}, {"within", false}, {"valve", false},
		{"1A", false}, {"A B", false}, {"", false}, {"A;", false}, {"°F", false}} {
		if got := ValidName(tt.name); got != tt.ok {
			t.Errorf("ValidName(%q) = %v", tt.name, got)
		}
	}
}

// TestTokens classes every token of a file by its role.
func TestTokens(t *testing.T) {
	src := "title \"x\" # c\nstream A { p 5 bar; fluid water }\nvalve V { in A; out B; dp 2 psi }\nexpect V sgen > 0 kW/K within 1 %\nexpect A T = 5 C ± 1 C\n"
	r := Check("t.hmb", []byte(src))
	var got []string
	for _, tk := range r.Tokens() {
		d := ""
		if tk.Decl {
			d = "*"
		}
		got = append(got, fmt.Sprintf("%s:%s%s", src[tk.Pos:tk.End], tk.Kind, d))
	}
	want := "title:keyword \"x\":string # c:comment stream:keyword A:stream* p:property 5:number bar:unit spelling " +
		"fluid:keyword water:keyword valve:kind V:unit* in:role A:stream out:role B:stream dp:parameter 2:number psi:unit spelling " +
		"expect:keyword V:unit sgen:property >:operator 0:number kW/K:unit spelling within:keyword 1:number %:unit spelling " +
		"expect:keyword A:stream T:property =:operator 5:number C:unit spelling ±:operator 1:number C:unit spelling"
	if strings.Join(got, " ") != want {
		t.Errorf("tokens\n got %s\nwant %s", strings.Join(got, " "), want)
	}
}
