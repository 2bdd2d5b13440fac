package section

import (
	"errors"
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/funcs"
)

// positive reports a dimension that must be a positive finite length.
func positive(name string, v float64) error {
	if !(v > 0) || math.IsInf(v, 0) {
		return fmt.Errorf("%s must be a positive length, got %s", name, funcs.Length(v))
	}
	return nil
}

func rectRing(y0, z0, y1, z1 float64) *Ring {
	return &Ring{Y: []float64{y0, y1, y1, y0}, Z: []float64{z0, z0, z1, z1}}
}

// Circle is a solid circle of diameter d centred at the origin.
func Circle(d float64) (*Shape, error) {
	if err := positive("diameter d", d); err != nil {
		return nil, err
	}
	return &Shape{Regions: []Region{{Sign: 1, Ann: &Annulus{Rout: d / 2}}}}, nil
}

// CHS is a circular hollow section (a tube) of outside diameter d and wall
// t centred at the origin; t = d/2 gives the solid circle.
func CHS(d, t float64) (*Shape, error) {
	if err := positive("diameter d", d); err != nil {
		return nil, err
	}
	if err := positive("wall thickness t", t); err != nil {
		return nil, err
	}
	if t > d/2 {
		msg := fmt.Sprintf("wall thickness t = %s is more than half the diameter d = %s", funcs.Length(t), funcs.Length(d))
		if t > d {
			msg += "; hint: the arguments look swapped: chs(d, t) takes the outside diameter first, then the wall thickness"
		}
		return nil, errors.New(msg)
	}
	s := &Shape{Regions: []Region{{Sign: 1, Ann: &Annulus{Rin: d/2 - t, Rout: d / 2}}}}
	if t < d/2 {
		s.Core = &Shape{Regions: []Region{{Sign: 1, Ann: &Annulus{Rout: d/2 - t}}}}
	}
	return s, nil
}

// Rect is a solid rectangle, b wide (along y) and h high (along z), centred
// at the origin.
func Rect(b, h float64) (*Shape, error) {
	if err := positive("width b", b); err != nil {
		return nil, err
	}
	if err := positive("height h", h); err != nil {
		return nil, err
	}
	return &Shape{Regions: []Region{{Sign: 1, Ring: rectRing(-b/2, -h/2, b/2, h/2)}}}, nil
}

// RHS is a rectangular hollow section b wide and h high with wall t, centred
// at the origin. Corners are sharp: the corner radii of rolled or formed
// tubes are ignored, which overstates the area by (4 − π)(r_o² − r_i²).
func RHS(b, h, t float64) (*Shape, error) {
	if err := positive("width b", b); err != nil {
		return nil, err
	}
	if err := positive("height h", h); err != nil {
		return nil, err
	}
	if err := positive("wall thickness t", t); err != nil {
		return nil, err
	}
	if 2*t >= math.Min(b, h) {
		return nil, fmt.Errorf("wall thickness t = %s leaves no hole in a %s × %s tube; t must be less than half the smaller side", funcs.Length(t), funcs.Length(b), funcs.Length(h))
	}
	return &Shape{Regions: []Region{
		{Sign: 1, Ring: rectRing(-b/2, -h/2, b/2, h/2)},
		{Sign: -1, Ring: rectRing(-b/2+t, -h/2+t, b/2-t, h/2-t)},
	}, Core: &Shape{Regions: []Region{{Sign: 1, Ring: rectRing(-b/2+t, -h/2+t, b/2-t, h/2-t)}}}}, nil
}

// ISection is a doubly symmetric I or H shape of depth h (along z), flange
// width b, web thickness t_w and flange thickness t_f, centred at the origin.
// Root radii are ignored (the section is three plates), which understates the
// area of a rolled profile by (4 − π)·r².
func ISection(h, b, tw, tf float64) (*Shape, error) {
	for _, c := range []struct {
		n string
		v float64
	}{{"depth h", h}, {"flange width b", b}, {"web thickness t_w", tw}, {"flange thickness t_f", tf}} {
		if err := positive(c.n, c.v); err != nil {
			return nil, err
		}
	}
	if tw >= b {
		return nil, fmt.Errorf("web thickness t_w = %s must be less than the flange width b = %s", funcs.Length(tw), funcs.Length(b))
	}
	if 2*tf >= h {
		return nil, fmt.Errorf("two flanges of t_f = %s do not fit in the depth h = %s", funcs.Length(tf), funcs.Length(h))
	}
	y1, y2 := b/2, tw/2
	z1, z2 := h/2, h/2-tf
	ring := &Ring{
		Y: []float64{-y1, y1, y1, y2, y2, y1, y1, -y1, -y1, -y2, -y2, -y1},
		Z: []float64{-z1, -z1, -z2, -z2, z2, z2, z1, z1, z2, z2, -z2, -z2},
	}
	return &Shape{Regions: []Region{{Sign: 1, Ring: ring}}}, nil
}

// Angle is an L shape with legs h high (along +z) and b wide (along +y), both
// of thickness t, with the heel (outer corner) at the origin. Root and toe
// radii are ignored.
func Angle(h, b, t float64) (*Shape, error) {
	for _, c := range []struct {
		n string
		v float64
	}{{"leg height h", h}, {"leg width b", b}, {"thickness t", t}} {
		if err := positive(c.n, c.v); err != nil {
			return nil, err
		}
	}
	if t >= math.Min(h, b) {
		return nil, fmt.Errorf("thickness t = %s must be less than both legs (h = %s, b = %s)", funcs.Length(t), funcs.Length(h), funcs.Length(b))
	}
	ring := &Ring{Y: []float64{0, b, b, t, t, 0}, Z: []float64{0, 0, t, t, h, h}}
	return &Shape{Regions: []Region{{Sign: 1, Ring: ring}}}, nil
}

// Polygon is the simple polygon through the given vertices (either
// orientation; see NewRing).
func Polygon(ys, zs []float64) (*Shape, error) {
	r, err := NewRing(ys, zs)
	if err != nil {
		return nil, err
	}
	return &Shape{Regions: []Region{{Sign: 1, Ring: r}}}, nil
}
