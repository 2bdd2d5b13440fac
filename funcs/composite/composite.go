package composite

import (
	"fmt"
	"math"

	"github.com/sheafcalc/sheaf/funcs"
	"github.com/sheafcalc/sheaf/funcs/section"
)

// GradedTol is the relative tolerance of the section integrals of a graded
// part (EA, first and second moments of E).
const GradedTol = 1e-11

// Part is one material region of a composite section.
type Part struct {
	Shape *section.Shape
	// E is the uniform modulus (Pa); EField, when set, replaces it with a
	// modulus field E(y, z).
	E        float64
	EField   section.Field
	Alpha    float64 // coefficient of thermal expansion, 1/K
	HasAlpha bool
	// Law is the stress–strain law for strain compatibility (an opaque value
	// the plastic family reads), nil for linear elastic.
	Law any
	// Fy and Fc are strengths from the material record (0 when absent).
	Fy, Fc float64

	// Computed by Prepare: area and the moments of E about the origin.
	A                float64
	EA               float64 // ∫E dA
	ESy              float64 // ∫E·y dA
	ESz              float64 // ∫E·z dA
	ESyy, ESzz, ESyz float64
}

// Prepare computes the area and the E-weighted moments of the part about
// (y0, z0). For a graded part these are section integrals to GradedTol.
func (p *Part) Prepare(y0, z0 float64) error {
	m := p.Shape.MomentsAbout(y0, z0)
	p.A = m.A
	if p.EField == nil {
		if !(p.E > 0) || math.IsInf(p.E, 0) {
			return fmt.Errorf("the modulus E must be positive, got %s", funcs.Quantity(p.E, funcs.Stress))
		}
		p.EA, p.ESy, p.ESz = p.E*m.A, p.E*m.Sy, p.E*m.Sz
		p.ESyy, p.ESzz, p.ESyz = p.E*m.Syy, p.E*m.Szz, p.E*m.Syz
		return nil
	}
	weights := []func(y, z float64) float64{
		func(y, z float64) float64 { return 1 },
		func(y, z float64) float64 { return y },
		func(y, z float64) float64 { return z },
		func(y, z float64) float64 { return y * y },
		func(y, z float64) float64 { return z * z },
		func(y, z float64) float64 { return y * z },
	}
	out := []*float64{&p.EA, &p.ESy, &p.ESz, &p.ESyy, &p.ESzz, &p.ESyz}
	for k, w := range weights {
		r, err := section.Integrate(p.Shape, func(y, z float64) float64 {
			return p.EField(y, z) * w(y-y0, z-z0)
		}, GradedTol)
		if err != nil {
			return fmt.Errorf("integrating the modulus field: %w", err)
		}
		*out[k] = r.Value
	}
	if !(p.EA > 0) {
		return fmt.Errorf("the modulus field integrates to EA = %s; it must be positive over the part", funcs.Quantity(p.EA, funcs.Force))
	}
	return nil
}

// Composite is a section of several parts.
type Composite struct {
	Parts  []*Part
	Y0, Z0 float64 // reference point of the part moments

	A, EA          float64
	YE, ZE         float64 // modulus-weighted centroid, m
	EIy, EIz, EIyz float64 // about the modulus-weighted centroid, N·m²
}

// New builds a composite of parts: it prepares every part about a common
// reference point and sums.
func New(parts []*Part) (*Composite, error) {
	if len(parts) == 0 {
		return nil, fmt.Errorf("a composite needs at least one part")
	}
	for i := range parts {
		for j := i + 1; j < len(parts); j++ {
			if _, err := section.Join(parts[i].Shape, parts[j].Shape); err != nil {
				return nil, fmt.Errorf("parts[%d] and parts[%d] overlap; a core inside a tube is the tube's hole, e.g. circle(d − 2t) with chs(d, t) (%v)", i, j, err)
			}
		}
	}
	c := &Composite{Parts: parts}
	y0, y1, z0, z1 := math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	for _, p := range parts {
		a0, a1, b0, b1 := p.Shape.BBox()
		y0, y1 = math.Min(y0, a0), math.Max(y1, a1)
		z0, z1 = math.Min(z0, b0), math.Max(z1, b1)
	}
	c.Y0, c.Z0 = (y0+y1)/2, (z0+z1)/2
	var sy, sz, syy, szz, syz float64
	for i, p := range parts {
		if err := p.Prepare(c.Y0, c.Z0); err != nil {
			return nil, fmt.Errorf("parts[%d]: %w", i, err)
		}
		c.A += p.A
		c.EA += p.EA
		sy += p.ESy
		sz += p.ESz
		syy += p.ESyy
		szz += p.ESzz
		syz += p.ESyz
	}
	cy, cz := sy/c.EA, sz/c.EA
	c.YE, c.ZE = c.Y0+cy, c.Z0+cz
	c.EIy = szz - c.EA*cz*cz
	c.EIz = syy - c.EA*cy*cy
	c.EIyz = syz - c.EA*cy*cz
	return c, nil
}

// Axial is the elastic response of a composite to N and ΔT.
type Axial struct {
	Eps        float64   // uniform total strain (elongation per length)
	EpsThermal float64   // free thermal strain of the composite, ΣαEA·ΔT/EA
	N          []float64 // force carried by each part, N
	Sigma      []float64 // mean stress of each part N_i/A_i, Pa (exact stress for a uniform E)
	SigmaTh    []float64 // self-equilibrated thermal stress of each part (the N = 0 share), Pa
}

// Response solves ε = (N + ΔT·Σα_i·EA_i)/EA, N_i = EA_i(ε − α_i·ΔT).
// Source: Gere & Goodno, Mechanics of Materials, §2.4 and §2.5 (statically
// indeterminate and thermal effects in composite bars).
func (c *Composite) Response(n, dT float64) (*Axial, error) {
	if math.IsNaN(n) || math.IsInf(n, 0) || math.IsNaN(dT) || math.IsInf(dT, 0) {
		return nil, fmt.Errorf("the axial force and the temperature change must be finite, got N = %s, ΔT = %.4g K", funcs.Quantity(n, funcs.Force), dT)
	}
	thermal := 0.0
	for i, p := range c.Parts {
		if dT != 0 && !p.HasAlpha {
			return nil, fmt.Errorf("parts[%d] has no alpha; give alpha (1/K) in its material to apply a temperature change", i)
		}
		thermal += p.Alpha * p.EA * dT
	}
	r := &Axial{Eps: (n + thermal) / c.EA, EpsThermal: thermal / c.EA}
	for _, p := range c.Parts {
		ni := p.EA * (r.Eps - p.Alpha*dT)
		nth := p.EA * (r.EpsThermal - p.Alpha*dT)
		r.N = append(r.N, ni)
		r.Sigma = append(r.Sigma, ni/p.A)
		r.SigmaTh = append(r.SigmaTh, nth/p.A)
	}
	return r, nil
}

// EcmEN1992 is the secant modulus of normal-weight concrete, E_cm =
// 22·(f_cm/10)^0.3 GPa with f_cm = f_ck + 8 MPa (f in MPa). Source:
// EN 1992-1-1:2004 Table 3.1. The table covers f_ck from 12 to 90 MPa.
func EcmEN1992(fck float64) (float64, error) {
	fckMPa := fck / 1e6
	if !(fckMPa > 0) || math.IsInf(fckMPa, 0) {
		return 0, fmt.Errorf("characteristic strength f_ck must be positive, got %g MPa", fckMPa)
	}
	if fckMPa > 200 {
		return 0, fmt.Errorf("f_ck = %g MPa is far beyond the range of EN 1992-1-1 Table 3.1 (12 to 90 MPa); check the unit", fckMPa)
	}
	return 22e9 * math.Pow((fckMPa+8)/10, 0.3), nil
}
