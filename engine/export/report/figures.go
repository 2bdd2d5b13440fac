package report

import (
	"math"
	"strings"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/check"
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
	d.w("<figcaption><b>Figure ", itoa(d.fig), ".</b> ", what, " — <code>", esc(c.Name), "</code>")
	if m := d.cellCombo(c.Index); m >= 0 && c.Kind != engine.Check {
		d.w(", in ", esc(d.res.Combos.All[m].Name), ": ", esc(d.res.Combos.Text(m)))
	}
	d.w("</figcaption>")
}

// plot is one diagram of a quantity along an axis.
type plot struct {
	xs, ys   []float64 // in the units shown
	xu, yu   string    // unit symbols
	xname    string    // axis quantity (x, ε)
	yname    string    // quantity (N, u, σ)
	xsi, ysi []float64 // SI, for the data attributes of the marked extreme
	ends     bool      // label the values at both ends
	// vertical draws the axis down the page (a bar that hangs or stands):
	// depth downward when down is set, else x upward from the bottom.
	vertical, down bool
	// start, end are the supports drawn at the ends of the axis ("" for none).
	start, end string
	points     []funcs.PointLoad // drawn as arrows at their x (SI)
	pu         units.Unit        // unit of the point loads' labels
	xfactor    float64           // SI metres per unit of xs
	marks      []mark            // reference lines and points (N–ε: squash load, design point)
}

// mark is a reference drawn on a diagram: a horizontal line at y, or a
// point at (x, y), in the units shown.
type mark struct {
	x, y  float64
	line  bool
	label string // on the drawing
	long  string // in the caption
}

// Geometry of a diagram, in the SVG's own units (1 unit ≈ 0.26 mm on A4).
const (
	plotW, plotH           = 640.0, 150.0
	padL, padR, padT, padB = 70.0, 24.0, 18.0, 30.0
	// a vertical diagram: three stand side by side
	vplotW, vplotH             = 210.0, 330.0
	vpadL, vpadR, vpadT, vpadB = 34.0, 34.0, 40.0, 26.0
)

// frame is where a diagram's axis and values go on the drawing.
type frame struct {
	w, h                  float64
	a0, a1                float64 // pixel range along the axis
	c0, c1                float64 // pixel range across it (low values to high)
	vertical              bool
	x0, x1, y0, y1        float64 // data ranges
	flipAlong, flipAcross bool
}

func (f *frame) along(x float64) float64 {
	t := (x - f.x0) / (f.x1 - f.x0)
	if f.flipAlong {
		t = 1 - t
	}
	return f.a0 + t*(f.a1-f.a0)
}

func (f *frame) across(y float64) float64 {
	t := (y - f.y0) / (f.y1 - f.y0)
	return f.c0 + t*(f.c1-f.c0)
}

// pt is the drawing point of (x, y).
func (f *frame) pt(x, y float64) (float64, float64) {
	if f.vertical {
		return f.across(y), f.along(x)
	}
	return f.along(x), f.across(y)
}

func (p *plot) frame() *frame {
	n := len(p.xs)
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
	if y0 < 0 {
		y0 -= pad
	}
	if y1 > 0 {
		y1 += pad
	}
	f := &frame{x0: x0, x1: x1, y0: y0, y1: y1, vertical: p.vertical}
	if p.vertical {
		f.w, f.h = vplotW, vplotH
		f.a0, f.a1 = vpadT, vplotH-vpadB
		f.c0, f.c1 = vpadL, vplotW-vpadR
		f.flipAlong = !p.down // x upward: x = 0 at the bottom
	} else {
		f.w, f.h = plotW, plotH
		f.a0, f.a1 = padL, plotW-padR
		f.c0, f.c1 = plotH-padB, padT // high values up
	}
	return f
}

// draw writes the diagram: the curve filled to zero, the zero line, the
// ends of the axis, the supports and point loads, and the largest
// absolute value marked with its position.
func (p *plot) draw(class string) string {
	n := len(p.xs)
	if n < 2 {
		return ""
	}
	f := p.frame()
	s := newSVG(f.w, f.h, "plot "+class)
	var area, curve strings.Builder
	X, Y := f.pt(p.xs[0], 0)
	area.WriteString("M" + f1(X) + " " + f1(Y))
	for i := range p.xs {
		X, Y := f.pt(p.xs[i], p.ys[i])
		area.WriteString(" L" + f1(X) + " " + f1(Y))
		if i == 0 {
			curve.WriteString("M")
		} else {
			curve.WriteString(" L")
		}
		curve.WriteString(f1(X) + " " + f1(Y))
	}
	X, Y = f.pt(p.xs[n-1], 0)
	area.WriteString(" L" + f1(X) + " " + f1(Y) + " Z")
	if f.vertical {
		s.rect(f.c0, f.a0, f.c1-f.c0, f.a1-f.a0, "frame")
	} else {
		s.rect(f.a0, f.c1, f.a1-f.a0, f.c0-f.c1, "frame")
	}
	s.path(area.String(), "area")
	zx0, zy0 := f.pt(f.x0, 0)
	zx1, zy1 := f.pt(f.x1, 0)
	s.line(zx0, zy0, zx1, zy1, "zero")
	s.path(curve.String(), "curve")
	for _, m := range p.marks {
		if m.line {
			lx0, ly0 := f.pt(f.x0, m.y)
			lx1, ly1 := f.pt(f.x1, m.y)
			s.line(lx0, ly0, lx1, ly1, "ref")
			s.text(lx1-4, ly1-4, "end", "tick", m.label)
			continue
		}
		mx, my := f.pt(m.x, m.y)
		s.raw("<circle class=\"design\" cx=\"" + f1(mx) + "\" cy=\"" + f1(my) + "\" r=\"4.5\"/>")
		anchor, lx := "start", mx+8
		if mx > f.w/2 {
			anchor, lx = "end", mx-8
		}
		s.text(lx, my-7, anchor, "label", m.label)
	}
	p.axis(s, f)
	p.supports(s, f)
	p.loads(s, f)
	// the largest absolute value, where it first occurs
	k := 0
	for i, y := range p.ys {
		if math.Abs(y) > math.Abs(p.ys[k]) {
			k = i
		}
	}
	cx, cy := f.pt(p.xs[k], p.ys[k])
	s.raw("<circle class=\"extreme\" cx=\"" + f1(cx) + "\" cy=\"" + f1(cy) + "\" r=\"4\" data-x=\"" + g(p.xsi[k]) + "\" data-v=\"" + g(p.ysi[k]) + "\"/>")
	val := minus(units.FormatNumber(p.ys[k], 4)) + " " + p.yu
	at := p.xname + " = " + units.FormatNumber(p.xs[k], 4) + " " + p.xu
	if f.vertical {
		// two short lines above the diagram: a tall narrow drawing has no room beside the curve
		s.text(f.w/2, 13, "middle", "label", "largest |"+p.yname+"|: "+val)
		s.text(f.w/2, 26, "middle", "tick", "at "+at)
	} else {
		anchor, lx := "start", cx+8
		if cx > plotW/2 {
			anchor, lx = "end", cx-8
		}
		ly := cy - 7
		if ly < padT+10 {
			ly = cy + 15
		}
		s.text(lx, ly, anchor, "label", "largest |"+p.yname+"|: "+val+" at "+at)
	}
	if p.ends {
		for _, i := range []int{0, n - 1} {
			if i == k {
				continue
			}
			ex, ey := f.pt(p.xs[i], p.ys[i])
			anchor := "start"
			if f.vertical {
				ey += 4
				ex += 5
				if p.ys[i] < 0 {
					anchor, ex = "end", ex-10
				}
			} else {
				ex += 4
				if i == n-1 {
					anchor, ex = "end", ex-8
				}
				ey += 14
				if p.ys[i] < 0 {
					ey -= 20
				}
			}
			s.text(ex, ey, anchor, "tick", minus(units.FormatNumber(p.ys[i], 4)))
		}
	}
	return s.String()
}

func minus(s string) string { return strings.Replace(s, "-", "−", 1) }

// axis labels the two ends of the axis, the axis itself and the quantity.
func (p *plot) axis(s *svg, f *frame) {
	if f.vertical {
		ax := f.c0 - 12 // clear of the support drawn at the end
		_, y0 := f.pt(f.x0, 0)
		_, y1 := f.pt(f.x1, 0)
		s.text(ax, y0+4, "end", "tick", units.FormatNumber(f.x0, 4))
		s.text(ax, y1+4, "end", "tick", units.FormatNumber(f.x1, 4))
		dir := "↑"
		if p.down {
			dir = "↓"
		}
		s.text(ax, (f.a0+f.a1)/2, "end", "axis", p.xname+dir)
		s.text(ax, (f.a0+f.a1)/2+13, "end", "tick", "["+p.xu+"]")
		s.text(f.w/2, f.h-8, "middle", "axis", p.yname+" ["+p.yu+"]")
		return
	}
	x0, _ := f.pt(f.x0, 0)
	x1, _ := f.pt(f.x1, 0)
	s.text(x0, plotH-padB+14, "middle", "tick", units.FormatNumber(f.x0, 4))
	s.text(x1, plotH-padB+14, "middle", "tick", units.FormatNumber(f.x1, 4))
	s.text((padL+plotW-padR)/2, plotH-6, "middle", "axis", p.xname+" ["+p.xu+"]")
	_, zy := f.pt(f.x0, 0)
	s.text(padL-14, zy+4, "end", "tick", "0")
	s.text(8, padT+10, "start", "axis", p.yname)
	s.text(8, padT+24, "start", "tick", "["+p.yu+"]")
}

// supports draws the support at each end of the axis as a short thick bar
// across it, hatched on the outside, with its kind written beside it.
func (p *plot) supports(s *svg, f *frame) {
	for _, e := range []struct {
		kind string
		x    float64
	}{{p.start, f.x0}, {p.end, f.x1}} {
		if e.kind == "" || e.kind == "free" {
			continue
		}
		// the outward direction along the axis, in pixels
		a := f.along(e.x)
		out := -1.0
		if (e.x == f.x1) != f.flipAlong {
			out = 1
		}
		const half, depth = 9.0, 6.0
		zc := f.across(0)
		var d strings.Builder
		if f.vertical {
			d.WriteString("M" + f1(zc-half) + " " + f1(a) + " H" + f1(zc+half))
			for k := -half; k < half; k += 4 {
				d.WriteString(" M" + f1(zc+k) + " " + f1(a) + " l4 " + f1(out*depth))
			}
		} else {
			d.WriteString("M" + f1(a) + " " + f1(zc-half) + " V" + f1(zc+half))
			for k := -half; k < half; k += 4 {
				d.WriteString(" M" + f1(a) + " " + f1(zc+k) + " l" + f1(out*depth) + " 4")
			}
		}
		s.path(d.String(), "support")
		if e.kind != "fixed" {
			if f.vertical {
				s.text(zc+half+3, a+out*10+3, "start", "tick", e.kind)
			} else {
				s.text(a+out*4, zc-half-3, map[bool]string{true: "start", false: "end"}[out > 0], "tick", e.kind)
			}
		}
	}
}

// loads draws each point load as an arrow on the axis pointing the way it
// acts, labelled with its size.
func (p *plot) loads(s *svg, f *frame) {
	if p.xfactor == 0 {
		return
	}
	for _, l := range p.points {
		a := f.along(l.X / p.xfactor)
		zc := f.across(0)
		dir := 1.0 // +x in pixels
		if f.along(f.x1) < f.along(f.x0) {
			dir = -1
		}
		if l.P < 0 {
			dir = -dir
		}
		const len = 16.0
		var d string
		label := minus(units.FormatNumber(l.P/p.pu.Factor, 4)) + " " + p.pu.Pretty()
		if f.vertical {
			d = "M" + f1(zc) + " " + f1(a-dir*len) + " V" + f1(a) + " M" + f1(zc-3) + " " + f1(a-dir*5) + " L" + f1(zc) + " " + f1(a) + " L" + f1(zc+3) + " " + f1(a-dir*5)
			s.path(d, "load")
			s.text(zc+5, a-dir*len/2+3, "start", "tick", "P = "+label)
		} else {
			d = "M" + f1(a-dir*len) + " " + f1(zc) + " H" + f1(a) + " M" + f1(a-dir*5) + " " + f1(zc-3) + " L" + f1(a) + " " + f1(zc) + " L" + f1(a-dir*5) + " " + f1(zc+3)
			s.path(d, "load")
			s.text(a-dir*len/2, zc-6, "middle", "tick", "P = "+label)
		}
	}
}

// barFigure draws N(x), u(x) and σ(x) of a solved bar, x from the start
// of the bar, with its supports and point loads. A bar that carries its
// own weight along its axis is vertical by that fact (a hanger, a pile, a
// column under its weight) and is drawn so, x downward when the weight
// acts in +x; every other bar lies along x.
func (d *doc) barFigure(c *engine.Cell, r *funcs.RecordValue, s *funcs.TableValue) {
	x := s.Col("x")
	if len(x) < 2 {
		return
	}
	var lay funcs.BarLayout
	if l, ok := r.Payload.(funcs.BarLayouter); ok {
		lay = l.Layout()
	}
	lu := d.unitFor(units.Base(units.Length))
	metric := d.s.System() != units.US
	if u, err := units.Parse("m"); err == nil && metric {
		lu = u // positions along a bar are metres, as its length is written
	}
	fu := d.unitFor(units.Base(units.Mass).Mul(units.Base(units.Length)).Div(units.Base(units.Time).Mul(units.Base(units.Time))))
	vertical := lay.Gravity != 0
	class := "bar"
	if vertical {
		class = "bar vertical"
	}
	d.w("<figure class=\"", class, "\"><div class=\"plots\">")
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
		p := &plot{xname: "x", yname: q.name, xu: lu.Pretty(), yu: yu.Pretty(), xsi: x, ysi: ys, ends: true,
			vertical: vertical, down: lay.Gravity > 0, start: lay.Start, end: lay.End, xfactor: lu.Factor, pu: fu}
		if q.col == "N" {
			p.points = lay.Points
		}
		p.xs = make([]float64, len(x))
		p.ys = make([]float64, len(x))
		for i := range x {
			p.xs[i] = x[i] / lu.Factor
			p.ys[i] = ys[i] / yu.Factor
		}
		d.w(p.draw(q.class))
	}
	if lay.Distributed {
		if bx, bs := lineLoad(x, s.Col("N"), lay.Points); len(bx) >= 2 {
			qu := d.unitFor(units.Base(units.Mass).Div(units.Base(units.Time).Mul(units.Base(units.Time))))
			if u, err := units.Parse("kN/m"); err == nil && metric {
				qu = u
			}
			p := &plot{xname: "x", yname: "b", xu: lu.Pretty(), yu: qu.Pretty(), xsi: bx, ysi: bs, ends: true,
				vertical: vertical, down: lay.Gravity > 0, start: lay.Start, end: lay.End, xfactor: lu.Factor, pu: fu}
			p.xs = make([]float64, len(bx))
			p.ys = make([]float64, len(bx))
			for i := range bx {
				p.xs[i] = bx[i] / lu.Factor
				p.ys[i] = bs[i] / qu.Factor
			}
			d.w(p.draw("b"))
		}
	}
	d.w("</div>")
	rs, re := r.Num("R_start", 0), r.Num("R_end", 0)
	how := "x from its start"
	switch {
	case lay.Gravity > 0:
		how = "drawn vertical, x downward from the start: the bar carries its own weight in +x"
	case lay.Gravity < 0:
		how = "drawn vertical, x upward from the start: the bar carries its own weight in −x"
	}
	supports := ""
	if lay.Start != "" {
		supports = "; supports: start " + lay.Start + ", end " + lay.End
	}
	d.caption(c, "Axial force N (tension positive), displacement u and stress σ along the bar, "+how+supports+
		"; reactions on the bar R_start = "+esc(d.formatSI(rs, fu))+", R_end = "+esc(d.formatSI(re, fu))+" (+x positive); point loads on the N diagram"+
		map[bool]string{true: "; the load along the length b(x) = −dN/dx (+x positive), from equilibrium of the force diagram", false: ""}[lay.Distributed]+
		"; the largest absolute value of each is marked")
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
	what := "Axial force N against the uniform strain ε (tension positive) by strain compatibility; the largest |N| of the curve's range is marked"
	for _, m := range d.curveMarks(c, n, fu) {
		p.marks = append(p.marks, m)
		if m.line {
			what += "; dashed: " + esc(m.long)
		} else {
			what += "; ringed: " + esc(m.long)
		}
	}
	d.w("<figure class=\"curve\">", p.draw("neps"))
	d.caption(c, what)
	d.w("</figure>\n")
}

// curveMarks finds, among the sheet's cells, the squash load and the
// strain at a design force of the composite the curve c is drawn for
// (cells written as squash_load(col, ...) and strain_for_force(col, N),
// possibly negated), to mark them on the curve.
func (d *doc) curveMarks(c *engine.Cell, n []float64, fu units.Unit) []mark {
	if c.Body().IsZero() || c.Body().Op() != check.OpPlugin || c.Body().NArg() == 0 || c.Body().Arg(0).Op() != check.OpCell {
		return nil
	}
	col := c.Body().Arg(0).Index()
	lo, hi := 0.0, 0.0
	for _, x := range n {
		lo, hi = math.Min(lo, x), math.Max(hi, x)
	}
	compression := -lo > hi
	var out []mark
	for _, o := range d.prog.Cells {
		body, sign := o.Body(), 1.0
		if !body.IsZero() && body.Op() == check.OpNeg {
			body, sign = body.Arg(0), -1
		}
		if body.IsZero() || body.Op() != check.OpPlugin || body.NArg() < 2 || body.Arg(0).Op() != check.OpCell || body.Arg(0).Index() != col {
			continue
		}
		cr := &d.res.Cells[o.Index]
		v, ok := cr.Value.(float64)
		if !cr.Known || !ok {
			continue
		}
		switch body.Str() {
		case "squash_load":
			q := math.Abs(v)
			if compression {
				q = -q
			}
			l := "squash load " + o.Name + " = " + d.formatSI(q, fu)
			out = append(out, mark{y: q / fu.Factor, line: true, label: l, long: l})
		case "strain_for_force":
			force, ok := d.number(body.Arg(1))
			if !ok {
				continue
			}
			eps := sign * v
			out = append(out, mark{x: eps * 1000, y: force / fu.Factor, label: "design point " + o.Name,
				long: "design point " + o.Name + ": N = " + d.formatSI(force, fu) + ", ε = " + minus(units.FormatNumber(eps*1000, 4)) + " ‰"})
		}
	}
	return out
}

// number evaluates a node that is a number cell, a constant, or either
// negated (the force argument of strain_for_force).
func (d *doc) number(n check.Node) (float64, bool) {
	switch n.Op() {
	case check.OpConst:
		return n.Num(), true
	case check.OpNeg:
		x, ok := d.number(n.Arg(0))
		return -x, ok
	case check.OpCell, check.OpField, check.OpIndex:
		v, ok := d.eval(n)
		x, isNum := v.(float64)
		return x, ok && isNum
	}
	return 0, false
}

// lineLoad returns the load per unit length along a bar, b = −dN/dx (the
// equilibrium of a slice, dN/dx + b = 0), at the middle of each interval of
// the samples of N: a point load is a jump of N, so an interval that holds
// one (or has no length) is left out.
func lineLoad(x, n []float64, points []funcs.PointLoad) (bx, b []float64) {
	if len(n) != len(x) {
		return nil, nil
	}
	for i := 0; i+1 < len(x); i++ {
		dx := x[i+1] - x[i]
		if !(dx > 0) {
			continue
		}
		jump := false
		for _, p := range points {
			if p.X >= x[i] && p.X <= x[i+1] {
				jump = true
			}
		}
		if jump {
			continue
		}
		bx = append(bx, (x[i]+x[i+1])/2)
		b = append(b, -(n[i+1]-n[i])/dx)
	}
	return bx, b
}
