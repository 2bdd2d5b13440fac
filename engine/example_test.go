package engine_test

import (
	"fmt"
	"os"

	"github.com/sheafcalc/sheaf/engine"
	"github.com/sheafcalc/sheaf/engine/diag"
)

// A sheet of our own: a rod hanging a light rig from a studio ceiling.
const rig = `title: Light rig hanger
m_rig [kg]   = 95 kg            -- rig with its lamps
gamma        = 1.35             -- @ EN 1990 Table A1.2(B) (from memory)
N_Ed  [kN]   = gamma * m_rig * g_n
d     [mm]   = 10 mm            -- rod diameter
A     [mm^2] = pi * d^2 / 4
f_y   [MPa]  = 235 MPa
N_Rd  [kN]   = A * f_y          -- @ EN 1993-1-1 6.2.3(2)

check tension: N_Ed <= N_Rd
`

// Compile checks a sheet held in memory; Run evaluates it.
func ExampleCompile() {
	s, err := engine.Compile("rig.sheaf", []byte(rig))
	if err != nil {
		if l, ok := err.(diag.List); ok {
			_ = diag.Render(os.Stderr, l, diag.Sources{"rig.sheaf": []byte(rig)})
		}
		return
	}
	r := s.Run(nil)
	fmt.Println("N_Ed =", r.Cell("N_Ed").Text)
	fmt.Println("N_Rd =", r.Cell("N_Rd").Text)
	for _, c := range r.Checks {
		fmt.Printf("%s: utilisation %.3f, pass %v\n", c.Cell.Name, c.Util, c.Pass)
	}
	// Closed forms: N_Ed = 1.35 · 95 kg · 9.80665 m/s² = 1.2577 kN;
	// N_Rd = π · (10 mm)²/4 · 235 MPa = 18.457 kN; 1.2577/18.457 = 0.068.

	// Output:
	// N_Ed = 1.258 kN
	// N_Rd = 18.46 kN
	// tension: utilisation 0.068, pass true
}

// A State keeps its values: after Set, Eval recomputes only the cells
// downstream of the changed input.
func ExampleState_Set() {
	s, err := engine.Compile("rig.sheaf", []byte(rig))
	if err != nil {
		fmt.Println(err)
		return
	}
	st := s.NewState()
	st.Eval()
	fmt.Println("first:", len(st.LastEvaluated()), "cells")

	v, err := s.ParseInput("d", "12 mm")
	if err != nil {
		fmt.Println(err)
		return
	}
	if err := st.Set("d", v); err != nil {
		fmt.Println(err)
		return
	}
	r := st.Eval()
	fmt.Println("after d = 12 mm:", st.LastEvaluated())
	fmt.Println("N_Rd =", r.Cell("N_Rd").Text)
	// Closed form: N_Rd = π · (12 mm)²/4 · 235 MPa = 26.578 kN.

	// Output:
	// first: 8 cells
	// after d = 12 mm: [d A N_Rd tension]
	// N_Rd = 26.58 kN
}

// ParseInput reads a value as written on a command line, in any unit of
// the input's dimension, and returns it in SI; a value of the wrong kind
// is refused with the reason.
func ExampleSheet_ParseInput() {
	s, err := engine.Compile("rig.sheaf", []byte(rig))
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, text := range []string{"120 kg", "0.25 t", "120", "120 kN"} {
		v, err := s.ParseInput("m_rig", text)
		if err != nil {
			fmt.Println(text, "->", err)
			continue
		}
		fmt.Println(text, "->", v, "kg in SI")
	}
	_, err = s.ParseInput("N_Ed", "2 kN")
	fmt.Println(err)
	// Source: 1 t = 1000 kg, BIPM SI Brochure (9th ed.) Table 8.

	// Output:
	// 120 kg -> 120 kg in SI
	// 0.25 t -> 250 kg in SI
	// 120 -> `m_rig` must be a mass (kg), but "120" is a plain number; write the unit, e.g. 120 kg
	// 120 kN -> `m_rig` must be a mass (kg), but "120 kN" is a force
	// `N_Ed` is computed from gamma, m_rig; only inputs can be set
}
