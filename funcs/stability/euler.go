package stability

import (
	"fmt"
	"math"
)

// EulerLoad returns N_cr = π²·E·I/(K·L)² [N], the elastic critical load of a
// pin-ended ideal column of length L [m] scaled by the effective-length factor
// K (1 pinned–pinned, 2 cantilever, 0.5 fixed–fixed, 0.7 fixed–pinned as
// theoretical values), modulus E [Pa] and second moment I [m⁴].
// Source: Timoshenko & Gere, Theory of Elastic Stability, §2.1; Gere &
// Goodno, Mechanics of Materials, §11.3–11.4 (effective length).
func EulerLoad(e, i, l, k float64) (float64, error) {
	if err := pos("E", e); err != nil {
		return 0, err
	}
	if err := pos("I", i); err != nil {
		return 0, err
	}
	if err := pos("L", l); err != nil {
		return 0, err
	}
	if err := pos("K", k); err != nil {
		return 0, err
	}
	kl := k * l
	return math.Pi * math.Pi * e * i / (kl * kl), nil
}

// Slenderness returns λ = K·L/i, the geometric slenderness ratio.
// Source: Gere & Goodno, Mechanics of Materials, §11.6 (slenderness ratio).
func Slenderness(k, l, i float64) (float64, error) {
	for _, a := range []struct {
		n string
		v float64
	}{{"K", k}, {"L", l}, {"i", i}} {
		if err := pos(a.n, a.v); err != nil {
			return 0, err
		}
	}
	return k * l / i, nil
}

// RadiusOfGyration returns i = √(I/A) [m].
// Source: Gere & Goodno, Mechanics of Materials, §12.4 (radius of gyration).
func RadiusOfGyration(i, a float64) (float64, error) {
	if err := pos("I", i); err != nil {
		return 0, err
	}
	if err := pos("A", a); err != nil {
		return 0, err
	}
	return math.Sqrt(i / a), nil
}

// RelativeSlenderness returns λ̄ = √(A·f_y/N_cr), the non-dimensional
// slenderness used with buckling curves. Source: EN 1993-1-1 §6.3.1.2(1),
// Eq. (6.49) for class 1–3 sections (from memory).
func RelativeSlenderness(a, fy, ncr float64) (float64, error) {
	for _, q := range []struct {
		n string
		v float64
	}{{"A", a}, {"f_y", fy}, {"N_cr", ncr}} {
		if err := pos(q.n, q.v); err != nil {
			return 0, err
		}
	}
	return math.Sqrt(a * fy / ncr), nil
}

// EulerStress returns σ_cr = π²·E/λ² [Pa] for slenderness λ.
// Source: Gere & Goodno, Mechanics of Materials, §11.6 (critical stress).
func EulerStress(e, lambda float64) (float64, error) {
	if err := pos("E", e); err != nil {
		return 0, err
	}
	if err := pos("lambda", lambda); err != nil {
		return 0, err
	}
	return math.Pi * math.Pi * e / (lambda * lambda), nil
}

func pos(name string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) || v <= 0 {
		return fmt.Errorf("%s = %g must be a positive number", name, v)
	}
	return nil
}
