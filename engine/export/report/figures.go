package report

import (
	"math"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/units"
	"github.com/sheafcalc/sheaf/funcs"
)

// figures draws what a value holds that an engineer would rather look at
// than read: the N(x), u(x) and σ(x) of a bar result, the outline of a
// section, an N–ε curve.
func (d *doc) figures(c *engine.Cell, v funcs.Value) {
	switch v := v.(type) {
	case *funcs.RecordValue:
		if v.Type != nil && v.Type.Name == "bar_result" {
			if s, ok := v.Get("samples").(*funcs.TableValue); ok {
				d.barFigure(c, v, s)
			}
		}
		if o, ok := v.Payload.(funcs.Outliner); ok {
			d.sectionFigure(c, v, o.Outline())
		}
	case *funcs.TableValue:
		if v.Type != nil && v.Type.Name == "n_eps_curve" {
			d.curveFigure(c, v)
		}
	}
}

func (d *doc) caption(c *engine.Cell, what string) {
	d.fig++
	d.w("<figcaption><b>Figure ", itoa(d.fig), ".</b> ", what, " — <code>", esc(c.Name), "</code></figcaption>")
}

// plot is one diagram of a quantity along an axis.
type plot struct {
	xs, ys     []float64 // in the units shown
	xu, yu     string    // unit symbols
	xname      string    // axis quantity (x, ε)
	yname      string    // quantity (N, u, σ)
	xsi, ysi   []float64 // SI, for the data attributes of the marked extreme
	endsMarked bool
}

// Geometry of a diagram, in the SVG's own units (1 unit ≈ 0.26 mm on A4).
const (
	plotW, plotH           = 640.0, 150.0
	padL, padR, padT, padB = 70.0, 24.0, 18.0, 30.0
)

// draw writes the diagram: the curve filled to zero, the zero line, the
// ends of the axis, the largest absolute value marked with its position.
func (p *plot) draw(class string) string {
	n := len(p.xs)
	s := newSVG(plotW, plotH, "plot "+class)
	if n < 2 {
		return s.String()
	}
	x0, x1 := p.xs[0], p.xs[n-1]
	for _, x := range p.xs {
		x0, x1 = math.Min(x0, x), math.Max(x1, x)
	}
	y0, y1 := 0.0, 0.0
	for _, y := range p.ys {
		y0, y1 = math.Min(y0, y), math.Max(y1, y)
	}
	if y1-y0 == 0 {
		y0, y1 = -1, 1
	}
	if x1-x0 == 0 {
		x1 = x0 + 1
	}
	pad := 0.08 * (y1 - y0)
	y0, y1 = y0-pad, y1+pad
	if y0 > -pad { // keep zero at the edge when all values have one sign
		y0 = math.Min(0, y0+pad)
	}
	if y1 < pad {
		y1 = math.Max(0, y1-pad)
	}
	px := func(x float64) float64 { return padL + (x-x0)/(x1-x0)*(plotW-padL-padR) }
	py := func(y float64) float64 { return padT + (y1-y)/(y1-y0)*(plotH-padT-padB) }
	var area, curve strings.Builder
	area.WriteString("M" + f1(px(p.xs[0])) + " " + f1(py(0)))
	for i := range p.xs {
		area.WriteString(" L" + f1(px(p.xs[i])) + " " + f1(py(p.ys[i])))
		if i == 0 {
			curve.WriteString("M")
		} else {
			curve.WriteString(" L")
		}
		curve.WriteString(f1(px(p.xs[i])) + " " + f1(py(p.ys[i])))
	}
	area.WriteString(" L" + f1(px(p.xs[n-1])) + " " + f1(py(0)) + " Z")
	s.rect(padL, padT, plotW-padL-padR, plotH-padT-padB, "frame")
	s.path(area.String(), "area")
	s.line(padL, py(0), plotW-padR, py(0), "zero")
	s.path(curve.String(), "curve")
	// axis: the two ends and the unit
	s.text(px(x0), plotH-padB+14, "middle", "tick", units.FormatNumber(x0, 4))
	s.text(px(x1), plotH-padB+14, "middle", "tick", units.FormatNumber(x1, 4))
	s.text((padL+plotW-padR)/2, plotH-6, "middle", "axis", p.xname+" ["+p.xu+"]")
	s.text(padL-6, py(0)+4, "end", "tick", "0")
	s.text(8, padT+10, "start", "axis", p.yname)
	s.text(8, padT+24, "start", "tick", "["+p.yu+"]")
	// the largest absolute value, where it first occurs
	k := 0
	for i, y := range p.ys {
		if math.Abs(y) > math.Abs(p.ys[k]) {
			k = i
		}
	}
	cx, cy := px(p.xs[k]), py(p.ys[k])
	s.raw("<circle class=\"extreme\" cx=\"" + f1(cx) + "\" cy=\"" + f1(cy) + "\" r=\"4\" data-x=\"" + g(p.xsi[k]) + "\" data-v=\"" + g(p.ysi[k]) + "\"/>")
	label := "max |" + p.yname + "| = " + strings.Replace(units.FormatNumber(p.ys[k], 4), "-", "−", 1) + " " + p.yu + " at " + p.xname + " = " + units.FormatNumber(p.xs[k], 4) + " " + p.xu
	anchor, lx := "start", cx+8
	if cx > plotW/2 {
		anchor, lx = "end", cx-8
	}
	ly := cy - 7
	if ly < padT+10 {
		ly = cy + 15
	}
	s.text(lx, ly, anchor, "label", label)
	if p.endsMarked {
		for _, i := range []int{0, n - 1} {
			if i == k {
				continue
			}
			a := "start"
			xx := px(p.xs[i]) + 4
			if i == n-1 {
				a, xx = "end", px(p.xs[i])-4
			}
			yy := py(p.ys[i]) + 14
			if p.ys[i] < 0 {
				yy = py(p.ys[i]) - 6
			}
			s.text(xx, yy, a, "tick", strings.Replace(units.FormatNumber(p.ys[i], 4), "-", "−", 1))
		}
	}
	return s.String()
}

// barFigure draws N(x), u(x) and σ(x) of a solved bar, x from the start
// of the bar, with the reactions at the supports.
func (d *doc) barFigure(c *engine.Cell, r *funcs.RecordValue, s *funcs.TableValue) {
	x := s.Col("x")
	if len(x) < 2 {
		return
	}
	lu := d.unitFor(units.Base(units.Length))
	metric := d.s.System() != units.US
	if u, err := units.Parse("m"); err == nil && metric {
		lu = u // positions along a bar are metres, as its length is written
	}
	d.w("<figure class=\"bar\">")
	for _, q := range []struct{ col, name, class string }{
		{"N", "N", "n"}, {"u", "u", "u"}, {"sigma", "σ", "sigma"},
	} {
		ys := s.Col(q.col)
		if len(ys) != len(x) {
			continue
		}
		fi := s.Type.Field(q.col)
		yu := d.unitFor(s.Type.Fields[fi].Type.Dim)
		if q.col == "u" {
			yu = d.unitFor(units.Base(units.Length))
			if u, err := units.Parse("mm"); err == nil && metric {
				yu = u // displacements of a bar are millimetres, not metres
			}
		}
		p := &plot{xname: "x", yname: q.name, xu: lu.Pretty(), yu: yu.Pretty(), xsi: x, ysi: ys, endsMarked: true}
		p.xs = make([]float64, len(x))
		p.ys = make([]float64, len(x))
		for i := range x {
			p.xs[i] = x[i] / lu.Factor
			p.ys[i] = ys[i] / yu.Factor
		}
		d.w(p.draw(q.class))
	}
	fu := d.unitFor(units.Base(units.Mass).Mul(units.Base(units.Length)).Div(units.Base(units.Time).Mul(units.Base(units.Time))))
	rs, re := r.Num("R_start", 0), r.Num("R_end", 0)
	d.caption(c, "Axial force N (tension positive), displacement u and stress σ along the bar, x from its start; reactions on the bar R_start = "+
		esc(d.formatSI(rs, fu))+", R_end = "+esc(d.formatSI(re, fu))+" (+x positive); the largest absolute value of each is marked")
	d.w("</figure>\n")
}

// curveFigure draws an N–ε curve, strain in per mille.
func (d *doc) curveFigure(c *engine.Cell, t *funcs.TableValue) {
	eps, n := t.Col("eps"), t.Col("N")
	if len(eps) < 2 || len(eps) != len(n) {
		return
	}
	fu := d.unitFor(units.Base(units.Mass).Mul(units.Base(units.Length)).Div(units.Base(units.Time).Mul(units.Base(units.Time))))
	p := &plot{xname: "ε", yname: "N", xu: "‰", yu: fu.Pretty(), xsi: eps, ysi: n}
	p.xs = make([]float64, len(eps))
	p.ys = make([]float64, len(eps))
	for i := range eps {
		p.xs[i] = eps[i] * 1000
		p.ys[i] = n[i] / fu.Factor
	}
	d.w("<figure class=\"curve\">", p.draw("neps"))
	d.caption(c, "Axial force N against the uniform strain ε (tension positive) by strain compatibility; the largest |N| is the squash load of the curve's range")
	d.w("</figure>\n")
}
