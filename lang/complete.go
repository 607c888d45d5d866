package lang

import (
	"slices"
	"strings"

	"hmb/lang/ast"
	"hmb/lang/check"
	"hmb/lang/token"
	"hmb/thermo/model"
	"hmb/thermo/units"
)

// SiteKind is a set of things that may be written at a place of a file, for completion.
type SiteKind uint16

const (
	SiteKeyword  SiteKind = 1 << iota // a statement keyword or setting (Keywords)
	SiteUnitKind                      // a unit kind
	SiteRole                          // a port role of Site.Kind
	SiteParam                         // a parameter of Site.Kind
	SiteProp                          // a property a stream block may give
	SiteSpelling                      // a unit spelling of dimension Site.Dim
	SiteStream                        // the name of a declared stream
	SiteUnit                          // the name of a declared unit
	SiteResult                        // a result an expectation may check: Site.Results
	SiteWord                          // one of Site.Words (display SI or US, fluid water)
)

// Site is what may be written at one place.
type Site struct {
	Kinds   SiteKind
	Kind    *model.Kind        // the unit whose block, or whose result, is being written
	Dim     units.Dim          // for SiteSpelling
	Results []model.ResultSpec // for SiteResult
	Words   []string           // for SiteWord
	Replace model.Span         // the partly typed word completion replaces (empty at a fresh place)
}

// SiteAt says what may be written at byte offset off. It reads the tokens of the entry or
// statement being written, back to the last separator, and whether a block is open around it.
// Blocks do not nest, so the nearest brace before the cursor decides.
func (r *Result) SiteAt(off int) Site {
	toks := r.File.Tokens
	site := Site{Replace: model.Span{Start: off, End: off}}
	// The token ending at or containing off is the word being typed, when it is a word.
	end := len(toks)
	for i, t := range toks {
		if int(t.Pos) >= off {
			end = i
			break
		}
		if off <= int(t.End) && (t.Kind == token.Ident || t.Kind == token.Word) {
			site.Replace = model.Span{Start: int(t.Pos), End: int(t.End)}
			end = i
			break
		}
		if t.Kind == token.Comment && off <= int(t.End) {
			return site // nothing to offer inside a comment
		}
	}
	// The entry: tokens back to a separator, comments skipped; a list goes on after a comma.
	var entry []token.Token
	i := end - 1
	for ; i >= 0; i-- {
		t := toks[i]
		if t.IsSeparator() && !(i > 0 && toks[i-1].Kind == token.Comma) || t.Kind == token.LBrace || t.Kind == token.RBrace {
			break
		}
		if t.Kind != token.Comment && !t.IsSeparator() {
			entry = append(entry, t)
		}
	}
	for a, b := 0, len(entry)-1; a < b; a, b = a+1, b-1 {
		entry[a], entry[b] = entry[b], entry[a]
	}
	e := siteEntry{r: r, toks: entry}
	if lbrace := openBrace(toks, i); lbrace >= 0 {
		return e.inBlock(site, lbrace)
	}
	return e.topLevel(site)
}

// openBrace returns the offset of the "{" of the block open at token i, or -1.
func openBrace(toks []token.Token, i int) int {
	for j := i; j >= 0; j-- {
		switch toks[j].Kind {
		case token.RBrace:
			return -1
		case token.LBrace:
			return int(toks[j].Pos)
		}
	}
	return -1
}

// siteEntry is the entry being written: its tokens before the cursor.
type siteEntry struct {
	r    *Result
	toks []token.Token
}

func (e siteEntry) text(i int) string { return e.toks[i].Text(e.r.File.Src.Src) }

func (e siteEntry) afterNumber() bool {
	return len(e.toks) > 0 && e.toks[len(e.toks)-1].Kind == token.Number
}

func (e siteEntry) inBlock(site Site, lbrace int) Site {
	for _, s := range e.r.File.Stmts {
		switch s := s.(type) {
		case *ast.CaseDecl:
			if s.Block != nil && s.Block.Lbrace == lbrace {
				return e.inCase(site)
			}
		case *ast.SweepDecl:
			if s.Block != nil && s.Block.Lbrace == lbrace {
				return e.inSweep(site)
			}
		case *ast.StreamDecl:
			if s.Block == nil || s.Block.Lbrace != lbrace {
				continue
			}
			switch {
			case len(e.toks) == 0:
				site.Kinds = SiteProp | SiteKeyword
			case e.text(0) == "fluid" && len(e.toks) == 1:
				site.Kinds, site.Words = SiteWord, []string{"water", "steam"}
			case e.afterNumber():
				if r := model.StreamResult(e.text(0)); r != nil {
					site.Kinds, site.Dim = SiteSpelling, r.Dim
				}
			}
			return site
		case *ast.UnitDecl:
			if s.Block == nil || s.Block.Lbrace != lbrace {
				continue
			}
			k := model.Kinds[s.Kind.Name]
			if k == nil {
				return site
			}
			site.Kind = k
			if len(e.toks) == 0 {
				site.Kinds = SiteRole | SiteParam
				return site
			}
			key := e.text(0)
			if r, ok := check.RoleAliases[key]; ok {
				key = r
			}
			switch p := k.Param(key); {
			case k.Port(key) != nil && !e.afterNumber():
				site.Kinds = SiteStream
			case p != nil && e.afterNumber():
				site.Kinds, site.Dim = SiteSpelling, p.Dim
			}
			return site
		}
	}
	return site
}

// inCase: a case's entries name the base's streams and units, then a property or parameter of
// it, then its value (or free); or they are expectations.
func (e siteEntry) inCase(site Site) Site {
	switch {
	case len(e.toks) == 0:
		site.Kinds, site.Words = SiteStream|SiteUnit|SiteWord, []string{"expect"}
		return site
	case e.text(0) == "expect":
		return e.expect(site)
	}
	return e.value(site, []string{check.FreeWord})
}

// value completes "NAME PROPERTY VALUE" of a case or a sweep: the property or parameter of the
// stream or unit named, then words (after the property) or a spelling of its dimension.
func (e siteEntry) value(site Site, words []string) Site {
	var kind *model.Kind
	isUnit := false
	if e.r.Info != nil {
		if o := e.r.Info.Objects[e.text(0)]; o != nil && o.IsUnit {
			kind, isUnit = o.Kind, true
		}
	}
	if isUnit && kind == nil {
		return site // a unit of unknown kind
	}
	site.Kind = kind
	dim, known := units.Dim(0), false
	var paramWords []string
	if len(e.toks) >= 2 {
		if isUnit {
			if p := kind.Param(e.text(1)); p != nil {
				dim, known, paramWords = p.Dim, true, p.Words
			}
		} else if r := model.StreamResult(e.text(1)); r != nil && e.text(1) != "v" {
			dim, known = r.Dim, true
		}
	}
	switch {
	case len(e.toks) == 1 && isUnit:
		site.Kinds = SiteParam
	case len(e.toks) == 1:
		site.Kinds = SiteProp
	case len(e.toks) == 2 && known:
		site.Kinds, site.Words = SiteWord, append(slices.Clone(words), paramWords...)
	case e.afterNumber() && known:
		site.Kinds, site.Dim = SiteSpelling, dim
	}
	return site
}

// inSweep: a sweep's range ("NAME PROPERTY from A to B step C"), show list and case.
func (e siteEntry) inSweep(site Site) Site {
	if len(e.toks) == 0 {
		site.Kinds, site.Words = SiteStream|SiteUnit|SiteWord, []string{"show", "case"}
		return site
	}
	last := e.toks[len(e.toks)-1]
	switch first := e.text(0); {
	case first == "case":
		if len(e.toks) == 1 && e.r.Model != nil {
			site.Kinds = SiteWord
			for _, c := range e.r.Model.Cases {
				site.Words = append(site.Words, c.Name)
			}
		}
		return site
	case first == "show":
		// show A r, B r: a name after show or a comma, then one of its results.
		if last.Kind == token.Comma || len(e.toks) == 1 {
			site.Kinds = SiteStream | SiteUnit
			return site
		}
		if e.toks[len(e.toks)-2].Kind == token.Comma || len(e.toks) == 2 {
			return e.resultsOf(site, e.text(len(e.toks)-1))
		}
		return site
	case len(e.toks) <= 2:
		return e.value(site, []string{"from"})
	}
	// After the property: from A [unit] to B [unit] step|count C [unit].
	said := func(w string) bool {
		for i := range e.toks {
			if e.text(i) == w {
				return true
			}
		}
		return false
	}
	var next []string
	switch {
	case !said("to"):
		next = []string{"to"}
	case !said("step") && !said("count"):
		next = []string{"step", "count"}
	}
	switch w := e.text(len(e.toks) - 1); {
	case e.afterNumber() && e.text(len(e.toks)-2) == "count":
	case e.afterNumber():
		site = e.value(site, nil) // the number's unit, or the next keyword
		if next != nil {
			site.Kinds, site.Words = site.Kinds|SiteWord, next
		}
	case w == "from" || w == "to" || w == "step" || w == "count":
		// a number comes next
	case (last.Kind == token.Ident || last.Kind == token.Word) && next != nil:
		site.Kinds, site.Words = SiteWord, next
	}
	return site
}

// resultsOf offers the results of the stream or unit named.
func (e siteEntry) resultsOf(site Site, name string) Site {
	results := model.StreamResults
	if e.r.Info != nil {
		if o := e.r.Info.Objects[name]; o != nil && o.IsUnit {
			if o.Kind == nil {
				return site
			}
			results, site.Kind = o.Kind.Results, o.Kind
		}
	}
	site.Kinds, site.Results = SiteResult, results
	return site
}

func (e siteEntry) topLevel(site Site) Site {
	if len(e.toks) == 0 {
		site.Kinds = SiteKeyword | SiteUnitKind
		return site
	}
	switch first := e.text(0); {
	case first == "expect":
		return e.expect(site)
	case first == "display" && len(e.toks) == 1:
		site.Kinds, site.Words = SiteWord, []string{"SI", "US"}
	case len(e.toks) == 1 && strings.HasPrefix(first, check.DisplayPrefix):
		if _, dim, ok := check.DisplayQuantity(first); ok {
			site.Kinds, site.Dim = SiteSpelling, dim
		}
	case first == "atmosphere" && e.afterNumber():
		site.Kinds, site.Dim = SiteSpelling, units.Pressure
	case first == "elevation" && e.afterNumber():
		site.Kinds, site.Dim = SiteSpelling, units.Length
	case first == "tolerance" && e.afterNumber():
		site.Kinds, site.Dim = SiteSpelling, units.Dimensionless
	case first == "ambient" && e.afterNumber():
		site.Kinds, site.Dim = SiteSpelling, units.Temperature
	}
	return site
}

// expect: the subject, then one of its results, then after the number a spelling of the
// result's dimension.
func (e siteEntry) expect(site Site) Site {
	var unit *model.Kind
	isUnit := false
	if len(e.toks) >= 2 && e.r.Info != nil {
		if o := e.r.Info.Objects[e.text(1)]; o != nil && o.IsUnit {
			unit, isUnit = o.Kind, true
		}
	}
	results := model.StreamResults
	if len(e.toks) >= 2 && !isUnit && e.text(1) == model.TotalName && (e.r.Info == nil || e.r.Info.Objects[model.TotalName] == nil) {
		results = model.TotalResults
	}
	if isUnit {
		if unit == nil {
			return site // a unit of unknown kind
		}
		results = unit.Results
		site.Kind = unit
	}
	switch {
	case len(e.toks) == 1:
		site.Kinds, site.Words = SiteStream|SiteUnit|SiteWord, []string{model.TotalName}
	case len(e.toks) == 2:
		site.Kinds, site.Results = SiteResult, results
	case e.afterNumber():
		for _, r := range results {
			if r.Name == e.text(2) {
				site.Kinds, site.Dim = SiteSpelling, r.Dim
			}
		}
	}
	return site
}

// Keyword is one keyword of the notation with one line of help.
type Keyword struct {
	Name, Doc string
	// Inner marks a word of the inside of a statement (within, fluid, the words of cases and
	// sweeps), which starts no statement.
	Inner bool
}

// keywordDocs is the help on each keyword; every setting the checker knows has one
// (TestKeywordsCoverSettings).
var keywordDocs = map[string]string{
	"stream":      "declares a stream (a state point): stream NAME \"label\" { givens }, or stream A, B, C for bare streams",
	"expect":      "checks a solved value: expect NAME RESULT OP VALUE [within TOLERANCE]",
	"title":       "setting: the title of the calc",
	"display":     "setting: the unit system results are shown in, SI or US",
	"atmosphere":  "setting: the site atmosphere gauge pressures are measured against",
	"elevation":   "setting: the site elevation, giving the atmosphere from the standard atmosphere",
	"tolerance":   "setting: the relative closure tolerance of the balances",
	"ambient":     "setting: the temperature of the surroundings, at which heat losses leave (25 C when not set)",
	"project":     "setting (report title block): the project the calc belongs to",
	"document":    "setting (report title block): the document number of the calc",
	"revision":    "setting (report title block): the revision of the document",
	"prepared_by": "setting (report title block): who prepared the calc",
	"checked_by":  "setting (report title block): who checked the calc",
	"date":        "setting (report title block): the date of this revision",
	"case":        "a case of the file: case NAME \"label\" { NAME PROPERTY VALUE; NAME PROPERTY free; expect ... }, the base with values replaced, added or freed",
	"sweep":       "a sweep: sweep NAME \"label\" { NAME PROPERTY from A to B step C (or count N); show NAME RESULT, ...; case NAME }",
	"free":        "in a case, removes the base's value: FW T free (the balances then find it)",
	"from":        "the first value of a sweep's range: FW flow from 4 kg/s to 8 kg/s step 0.5 kg/s",
	"to":          "the last value of a sweep's range",
	"step":        "the step of a sweep's range, a difference (step 10 K, step 5 psi), from the first value towards the last",
	"count":       "the number of points of a sweep's range, both ends included: count 21",
	"show":        "the results a sweep's table and plot show: show MS T, T1 power",
	"within":      "the tolerance of an expectation: expect S1 T = 300 C within 2 C",
	"fluid":       "the stream's fluid (water, liquid or steam: IAPWS-IF97)",
}

func init() {
	for _, q := range check.DisplayQuantities {
		keywordDocs[check.DisplayPrefix+q.Name] = "setting: the unit " + q.Doc + " are shown in, whatever the display system: " +
			check.DisplayPrefix + q.Name + " " + units.SI.Default(q.Dim).Symbol()
	}
}

// Keywords lists the notation's keywords with their help, in completion order: the statements,
// the settings, then the words inside statements.
func Keywords() []Keyword {
	names := append([]string{"stream", "expect", "case", "sweep"}, check.Settings...)
	inner := []string{"within", "fluid", "free", "from", "to", "step", "count", "show"}
	out := make([]Keyword, 0, len(names)+len(inner))
	for _, n := range names {
		out = append(out, Keyword{Name: n, Doc: keywordDocs[n]})
	}
	for _, n := range inner {
		out = append(out, Keyword{Name: n, Doc: keywordDocs[n], Inner: true})
	}
	return out
}

// KeywordDoc is the help on a keyword, or "".
func KeywordDoc(name string) string {
	for _, k := range Keywords() {
		if k.Name == name {
			return k.Doc
		}
	}
	return ""
}

// ValidName reports whether name may name a stream or a unit: one identifier that is neither a
// keyword nor a unit kind.
func ValidName(name string) bool {
	toks, errs := token.Scan([]byte(name))
	if len(errs) > 0 || len(toks) != 2 || toks[0].Kind != token.Ident || int(toks[0].End) != len(name) {
		return false
	}
	return KeywordDoc(name) == "" && model.Kinds[name] == nil
}
