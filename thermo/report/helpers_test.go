package report

import (
	"bytes"
	"context"
	"encoding/xml"
	"io"
	"strconv"
	"testing"

	"hmb/thermo/model"
	"hmb/thermo/solve"
	"hmb/thermo/units"
)

// testInput is an invented line-up: 1 MPa, 250 C steam throttled to 0.2 MPa, then expanded in a
// turbine of 80 % isentropic efficiency to 10 kPa. Its values are checked against python3-iapws
// in the tests that use it.
func testInput(t testing.TB, sys units.System) *Input {
	t.Helper()
	g := func(v float64) *model.Given { return &model.Given{Value: v} }
	src := []byte("expect C x >= 0.99\n")
	m := &model.Model{
		Title:   "Test line | valve and turbine",
		Display: sys,
		Atm:     units.StandardAtmosphere,
		Streams: []*model.Stream{
			{Name: "A", Label: "header <steam>", Fluid: "water", Span: model.Span{Start: 0, End: 1},
				Given: [model.NumProps]*model.Given{model.Flow: g(2), model.P: g(1e6), model.T: g(523.15)}},
			{Name: "B", Label: "after valve", Fluid: "water", Given: [model.NumProps]*model.Given{model.P: g(0.2e6)}},
			{Name: "C", Label: "exhaust", Fluid: "water", Given: [model.NumProps]*model.Given{model.P: g(1e4)}},
		},
		Units: []*model.Unit{
			{Name: "V1", Label: "valve", Kind: model.Kinds["valve"], Ports: []model.Port{{Role: "in", Stream: 0}, {Role: "out", Stream: 1}}},
			{Name: "T1", Label: "turbine", Kind: model.Kinds["turbine"], Ports: []model.Port{{Role: "in", Stream: 1}, {Role: "out", Stream: 2}},
				Params: map[string]*model.Given{"efficiency": g(0.8)}},
		},
		Expects: []*model.Expect{{Stream: 2, Unit: -1, Prop: "x", Op: model.Ge, Value: 0.99, Span: model.Span{Start: 0, End: 18}}},
	}
	r := solve.Solve(context.Background(), m, solve.Options{})
	return &Input{Path: "test.hmb", Src: src, Model: m, Result: r, Diags: r.Diags}
}

// node is any XML element, for reading back what the package wrote.
type node struct {
	XMLName xml.Name
	Attrs   []xml.Attr `xml:",any,attr"`
	Text    string     `xml:",chardata"`
	Nodes   []node     `xml:",any"`
}

func (n *node) attr(name string) string {
	for _, a := range n.Attrs {
		if a.Name.Local == name {
			return a.Value
		}
	}
	return ""
}

func (n *node) walk(f func(*node)) {
	f(n)
	for i := range n.Nodes {
		n.Nodes[i].walk(f)
	}
}

// parseXML reads a whole document strictly: any markup error fails the test.
func parseXML(t *testing.T, data []byte) *node {
	t.Helper()
	d := xml.NewDecoder(bytes.NewReader(data))
	d.Strict = true
	var root node
	if err := d.Decode(&root); err != nil {
		t.Fatalf("not well-formed XML: %v", err)
	}
	// Nothing but white space may follow the root element.
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("after the root element: %v", err)
		}
		if cd, ok := tok.(xml.CharData); ok && len(bytes.TrimSpace(cd)) == 0 {
			continue
		}
		if _, ok := tok.(xml.Comment); ok {
			continue
		}
		t.Fatalf("content after the root element: %#v", tok)
	}
	return &root
}

func parseNum(s string) (float64, error) { return strconv.ParseFloat(s, 64) }
