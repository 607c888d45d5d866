package report

// drawDeaerator: a storage vessel lying down with the deaerating column standing on it, the
// vent leaving from the column's top.
func drawDeaerator(w *svgWriter, x, y, wd, ht float64) {
	tank := ht * 0.6
	drawHorizontalVessel(w, x, y+ht/2-tank/2, wd, tank)
	cw, ch := wd*0.3, ht-tank
	w.printf(`<rect x="%s" y="%s" width="%s" height="%s" %s/>`+"\n", num(x-cw/2), num(y-ht/2), num(cw), num(ch+tank*0.1), symAttrs())
}
