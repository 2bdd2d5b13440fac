package main

import (
	"encoding/json"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The example sheets under sheets/ are checked here against closed-form
// mechanics computed in Go from the inputs the sheet reports, and, where a
// case of the project's outside check values fits (shared REFERENCES.md,
// groups B and C), against the published number at the inputs of that case
// set with --set. The golden files catch any change; these tests say whether
// the numbers are right.

// sheetRun is the part of `sheaf run --json` these tests read.
type sheetRun struct {
	Cells []struct {
		Name   string   `json:"name"`
		SI     *float64 `json:"si"`
		Fields []struct {
			Name string   `json:"name"`
			SI   *float64 `json:"si"`
		} `json:"fields"`
		Columns []struct {
			Name string    `json:"name"`
			SI   []float64 `json:"si"`
		} `json:"columns"`
	} `json:"cells"`
	Checks []struct {
		Name        string   `json:"name"`
		Pass        bool     `json:"pass"`
		DemandSI    *float64 `json:"demand_si"`
		Combination *struct {
			Governing string `json:"governing"`
			Text      string `json:"text"`
			Evaluated int    `json:"evaluated"`
		} `json:"combination"`
	} `json:"checks"`
}

// demand is the SI demand of a check (in its governing combination for a
// sheet with actions), and the combination in words ("" when none).
func (r *exampleRun) demand(name string) (float64, string) {
	r.t.Helper()
	for _, c := range r.res.Checks {
		if c.Name == name && c.DemandSI != nil {
			text := ""
			if c.Combination != nil {
				text = c.Combination.Text
			}
			return *c.DemandSI, text
		}
	}
	r.t.Fatalf("no check %s with a demand", name)
	return math.NaN(), ""
}

// exampleRun runs a sheet with overrides and decodes its JSON listing.
type exampleRun struct {
	t   *testing.T
	res sheetRun
}

func runExample(t *testing.T, file string, sets ...string) *exampleRun {
	t.Helper()
	// --draft: some closed forms use inputs that leave a cell of the
	// sheet uncomputed (a slenderness beyond the buckling curve); the
	// cells compared here are computed.
	args := []string{"run", "--json", "--draft", file}
	for _, s := range sets {
		args = append(args, "--set", s)
	}
	out, errs, code := sheaf(t, args...)
	if code != exitOK && code != exitChecks {
		t.Fatalf("sheaf %s: exit %d\n%s", strings.Join(args, " "), code, errs)
	}
	r := &exampleRun{t: t}
	if err := json.Unmarshal([]byte(out), &r.res); err != nil {
		t.Fatalf("decoding the JSON listing: %v", err)
	}
	return r
}

// v is the SI value of a number cell.
func (r *exampleRun) v(name string) float64 {
	r.t.Helper()
	for _, c := range r.res.Cells {
		if c.Name == name {
			if c.SI == nil {
				r.t.Fatalf("cell %s has no number", name)
			}
			return *c.SI
		}
	}
	r.t.Fatalf("no cell %s", name)
	return math.NaN()
}

// f is the SI value of a field of a record cell.
func (r *exampleRun) f(name, field string) float64 {
	r.t.Helper()
	for _, c := range r.res.Cells {
		if c.Name != name {
			continue
		}
		for _, fl := range c.Fields {
			if fl.Name == field && fl.SI != nil {
				return *fl.SI
			}
		}
	}
	r.t.Fatalf("no number field %s.%s", name, field)
	return math.NaN()
}

// near fails unless got is within rel (relative to want) of want.
func (r *exampleRun) near(what string, got, want, rel float64) {
	r.t.Helper()
	if math.IsNaN(got) || math.Abs(got-want) > rel*math.Abs(want) {
		r.t.Errorf("%s = %.12g, want %.12g (relative %.1e)", what, got, want, rel)
	}
}

// allPass fails unless every design check of the run passed.
func (r *exampleRun) allPass() {
	r.t.Helper()
	if len(r.res.Checks) == 0 {
		r.t.Error("the sheet has no design checks")
	}
	for _, c := range r.res.Checks {
		if !c.Pass {
			r.t.Errorf("check %s fails at the example's inputs", c.Name)
		}
	}
}

// Tolerances: closed forms against the solvers agree to rounding; the
// published reference values are printed to 9 significant figures.
const (
	relExact = 1e-9
	relRef   = 1e-7
)

// TestCanopyHangerClosedForm runs the sheet, written with actions, its governing
// combinations against the ones it wrote by hand before it had actions.
func TestCanopyHangerClosedForm(t *testing.T) {
	t.Chdir("../..")
	cases := []struct {
		name string
		sets []string
		pass bool
	}{
		{"as drawn", nil, true},
		{"longer and thicker rod, less snow", []string{"L=25 m", "d=20 mm", "q_k=0.5 kN/m^2"}, true},
		{"short rod", []string{"L=0.8 m"}, true},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			r := runExample(t, "sheets/canopy-hanger.sheaf", c.sets...)
			if c.pass {
				r.allPass()
			}
			L, d := r.v("L"), r.v("d")
			E, gam := r.f("rod_steel", "E"), r.f("rod_steel", "gamma")
			// The combinations the sheet wrote by hand before it had actions:
			// 1.35 G + 1.5 S for the stress, G + S for the elongation; γG,sup
			// 1.35 and γQ 1.5 from EN 1990 Table A1.2(B) (REFERENCES D7).
			const gG, gQ = 1.35, 1.5
			area := r.v("a_proj") / 2 * r.v("s")
			A := math.Pi * d * d / 4
			Pk := (r.v("g_k") + r.v("q_k")) * area
			PEd := gG*r.v("g_k")*area + gQ*r.v("q_k")*area
			r.near("A", r.v("A"), A, relExact)
			r.near("G", r.v("G"), r.v("g_k")*area, relExact) // actions show characteristic values
			// Source: prismatic bar δ = PL/(EA), REFERENCES C1 (Gere & Goodno ch. 2),
			// plus a bar hanging under its own weight δ = γL²/(2E), REFERENCES C3
			// (Timoshenko, Strength of Materials I, Art. 2); superposition holds
			// for a linear bar. The stretch check governs in G + S + w_rod.
			want := Pk*L/(E*A) + gam*L*L/(2*E)
			dem, comb := r.demand("stretch")
			r.near("stretch demand (solver)", dem, want, relExact)
			if comb != "1.0 G + 1.0 S + 1.0 w_rod" {
				t.Errorf("stretch governs in %q", comb)
			}
			// delta feeds the stretch check, so it shows that check's
			// combination; the shortcuts feed no check and show the
			// combination of the stress check, 1.35 G + 1.5 S + 1.35 w_rod.
			r.near("delta (solver, SLS-c 2)", r.v("delta"), want, relExact)
			wantD := PEd*L/(E*A) + gG*gam*L*L/(2*E)
			r.near("delta_sum (shortcuts, ULS 2)", r.v("delta_sum"), wantD, relExact)
			r.near("delta_g", r.v("delta_g"), gG*gam*L*L/(2*E), relExact)
			// Source: equilibrium of the whole rod: the truss carries the end
			// pull and the factored weight γ_G·γ·A·L (common practice).
			R := PEd + gG*gam*A*L
			r.near("R_top", r.v("R_top"), R, relExact)
			// Source: σ_max = (P + γAL)/A at the support, REFERENCES C3 (σ = γL)
			// plus the end pull over the area.
			r.near("sigma_Ed", r.v("sigma_Ed"), R/A, relExact)
			dem, comb = r.demand("stress")
			r.near("stress demand", dem, R/A, relExact)
			if comb != "1.35 G + 1.5 S + 1.35 w_rod" {
				t.Errorf("stress governs in %q", comb)
			}
			r.near("sigma_g", r.v("sigma_g"), gG*gam*L, relExact)
			if x := r.v("x_sigma"); x != 0 {
				t.Errorf("largest stress at x = %g m, want at the truss (0)", x)
			}
		})
	}
}

// TestCFTColumnClosedForm runs the sheet, written with actions, its governing
// combinations against the ones it wrote by hand before it had actions.
func TestCFTColumnClosedForm(t *testing.T) {
	t.Chdir("../..")
	r := runExample(t, "sheets/cft-column.sheaf")
	r.allPass()
	// The actions G and Q combined by EN 1990 (6.10): 1.35 G + 1.5 Q governs
	// both resistance checks, as the sheet wrote by hand before (REFERENCES D7).
	NEd := 1.35*r.v("G_k") + 1.5*r.v("Q_k")
	r.near("N_Ed", r.v("N_Ed"), NEd, relExact)
	for _, name := range []string{"squash", "buckling"} {
		dem, comb := r.demand(name)
		r.near(name+" demand", dem, NEd, relExact)
		if comb != "1.35 G + 1.5 Q" {
			t.Errorf("%s governs in %q", name, comb)
		}
	}
	d, tw := r.v("d"), r.v("t")
	di := d - 2*tw
	Aa := math.Pi * (d*d - di*di) / 4
	Ac := math.Pi * di * di / 4
	r.near("A_a", r.v("A_a"), Aa, relExact)
	r.near("A_c", r.v("A_c"), Ac, relExact)
	// Source: EN 1992-1-1 Table 3.1, E_cm = 22 (f_cm/10)^0.3 GPa, f_cm = f_ck + 8 MPa
	// (REFERENCES B4: the formula, not the rounded table).
	fck := r.v("f_ck")
	Ecm := 22e9 * math.Pow((fck/1e6+8)/10, 0.3)
	r.near("E_cm", r.v("E_cm"), Ecm, relExact)
	Es, as, ac := r.f("steel_a", "E"), r.f("steel_a", "alpha"), r.f("concrete_c", "alpha")
	EAa, EAc := Es*Aa, Ecm*Ac
	// Source: composite bar, N_i = N·E_iA_i/ΣEA (Gere & Goodno §2.4; REFERENCES C8a, C8c).
	Nk := r.v("N_k")
	r.near("N_a", r.v("N_a"), Nk*EAa/(EAa+EAc), relExact)
	r.near("N_c", r.v("N_c"), Nk*EAc/(EAa+EAc), relExact)
	r.near("sigma_a", r.v("sigma_a"), Nk*Es/(EAa+EAc), relExact)
	r.near("sigma_c", r.v("sigma_c"), Nk*Ecm/(EAa+EAc), relExact)
	// Source: thermal mismatch F = (α_a − α_c)ΔT/(1/EA_a + 1/EA_c), Gere & Goodno
	// §2.5 (REFERENCES C8b).
	dT := r.v("dT")
	F := (as - ac) * dT / (1/EAa + 1/EAc)
	r.near("F_th", r.v("F_th"), F, relExact)
	r.near("sig_th_a", r.v("sig_th_a"), -F/Aa, relExact)
	r.near("sig_th_c", r.v("sig_th_c"), F/Ac, relExact)
	// Source: EN 1994-1-1 §6.7.3.2(1) Eq. (6.30), N_pl,Rd = A_a f_yd + η A_c f_cd
	// (REFERENCES C11; coefficient from memory).
	fyd, fcd, eta := r.v("f_yd"), r.v("f_cd"), r.v("eta_c")
	r.near("N_plRd", r.v("N_plRd"), Aa*fyd+eta*Ac*fcd, relExact)
	// Source: strain compatibility (EN 1994-1-1 §6.7.2(1), from memory) with the
	// parabola–rectangle law of EN 1992-1-1 Eq. (3.17), n = 2, ε_c2 = 2 ‰, and an
	// elastic–perfectly plastic tube: the force at the reported strain must be
	// the design load.
	e := r.v("eps_Ed") // shortening, positive
	sa := math.Min(Es*e, fyd)
	sc := fcd
	if e < 2e-3 {
		sc = fcd * (1 - (1-e/2e-3)*(1-e/2e-3))
	}
	r.near("N(eps_Ed)", Aa*sa+Ac*sc, r.v("N_Ed"), 1e-8)
	// Source: Euler load π²EI/L² with EI_eff = E_a I_a + K_e E_cm I_c,
	// EN 1994-1-1 Eq. (6.40) (from memory); I of a circle and a tube, Gere &
	// Goodno App. E.
	Ia := math.Pi * (math.Pow(d, 4) - math.Pow(di, 4)) / 64
	Ic := math.Pi * math.Pow(di, 4) / 64
	EI := Es*Ia + r.v("K_e")*Ecm*Ic
	L := r.v("L")
	Ncr := math.Pi * math.Pi * EI / (L * L)
	r.near("N_cr", r.v("N_cr"), Ncr, relExact)
	lb := math.Sqrt((Aa*r.f("steel_a", "f_y") + eta*Ac*fck) / Ncr)
	r.near("lambda_bar", r.v("lambda_bar"), lb, relExact)
	chi := chiEN1993(lb, 0.21) // curve a
	r.near("N_bRd", r.v("N_bRd"), chi*(Aa*fyd+eta*Ac*fcd), relExact)

	// The sheet at the inputs of the reference cases: CHS 219.1×10 S355 filled
	// with C30/37 (E_cm = 32836.568 MPa, f_cd = 30/1.5 = 20 MPa), N = 1000 kN.
	// Section and class are catalogue keys, not inputs: a copy of the sheet
	// names the other ones.
	refSheet := catalogueCopy(t, "sheets/cft-column.sheaf", `"CHS 273x10"`, `"CHS 219.1x10"`, `"C35/45"`, `"C30/37"`)
	ref := runExample(t, refSheet, "G_k=1000 kN", "Q_k=0 kN")
	// Source: REFERENCES C8c (load sharing, Gere & Goodno §2.4).
	ref.near("C8c N_steel", ref.v("N_a"), 574.355095e3, relRef)
	ref.near("C8c N_conc", ref.v("N_c"), 425.644905e3, relRef)
	ref.near("C8c sigma_s", ref.v("sigma_a"), 87.4332401e6, relRef)
	ref.near("C8c sigma_c", ref.v("sigma_c"), 13.6714645e6, relRef)
	// Source: REFERENCES B4, f_ck = 30 MPa (EN 1992-1-1 Table 3.1 formula).
	ref.near("B4 E_cm", ref.v("E_cm"), 32836.5680e6, relRef)
	// Source: REFERENCES C11, EN 1994-1-1 §6.7.3.2(1) (coefficient from memory).
	ref.near("C11 N_plRd", ref.v("N_plRd"), 2954.69632e3, relRef)
	ref85 := runExample(t, refSheet, "eta_c=0.85")
	ref85.near("C11 N_plRd with 0.85", ref85.v("N_plRd"), 2861.29486e3, relRef)
}

func TestTaperedStrutClosedForm(t *testing.T) {
	t.Chdir("../..")
	r := runExample(t, "sheets/tapered-strut.sheaf")
	r.allPass()
	L, d1, d2 := r.v("L"), r.v("d_1"), r.v("d_2")
	E, fy := r.f("bar_steel", "E"), r.f("bar_steel", "f_y")
	// Source: equilibrium of the tie node, P = 2T sin θ, tan θ = L/a (common practice).
	P := 2 * r.v("T_Ed") * math.Sin(math.Atan(L/r.v("a")))
	r.near("P_Ed", r.v("P_Ed"), P, relExact)
	// Source: tapered solid circular bar δ = 4PL/(πE d1 d2), Gere & Goodno §2.3
	// (REFERENCES C2); the sheet's solver integrates dx/(EA) by quadrature.
	want := 4 * P * L / (math.Pi * E * d1 * d2)
	r.near("delta (solver)", r.v("delta"), want, 1e-10)
	r.near("delta_cf", r.v("delta_cf"), want, relExact)
	A2 := math.Pi * d2 * d2 / 4
	r.near("sigma_max", r.v("sigma_max"), P/A2, relExact)
	// Source: Euler load π²EI/(KL)², Timoshenko & Gere, Theory of Elastic
	// Stability §2.1 (REFERENCES C9); λ̄ = √(A f_y/N_cr), EN 1993-1-1 §6.3.1.2 (from memory).
	K := r.v("K")
	Ncr := math.Pi * math.Pi * E * (math.Pi * math.Pow(d2, 4) / 64) / (K * L * K * L)
	r.near("N_cr", r.v("N_cr"), Ncr, relExact)
	r.near("lambda", r.v("lambda"), K*L/(d2/4), relExact)
	lb := math.Sqrt(A2 * fy / Ncr)
	r.near("lambda_bar", r.v("lambda_bar"), lb, relExact)
	chi := chiEN1993(lb, 0.49) // curve c
	r.near("chi", r.v("chi"), chi, relExact)
	r.near("N_bRd", r.v("N_bRd"), chi*A2*fy/r.v("gamma_M1"), relExact)

	// The inputs of REFERENCES C2: d1 = 40, d2 = 20 mm, L = 2 m, P = 50 kN
	// (a = L makes θ = 45°, so T = 25 kN·√2 gives P = 50 kN).
	c2 := runExample(t, "sheets/tapered-strut.sheaf",
		"d_1=40 mm", "d_2=20 mm", "L=2 m", "a=2 m", "T_Ed=35.35533905932738 kN")
	// Source: REFERENCES C2, δ = 4PL/(πE d1 d2) = 0.757880681 mm; the
	// mean-diameter shortcut gives 0.673672 mm (11 % low).
	c2.near("C2 delta", c2.v("delta"), 0.757880681e-3, relRef)
	c2.near("C2 mean-diameter estimate", c2.v("delta_m"), 0.673672e-3, 1e-6)
}

func TestHeatedPipeClosedForm(t *testing.T) {
	t.Chdir("../..")
	cases := []struct {
		name   string
		sets   []string
		pass   bool
		closed bool
	}{
		{"as drawn: the clearance closes", nil, true, true},
		{"cooler flow: the clearance stays open", []string{"T_flow=60 °C"}, true, false},
		{"tight clearance", []string{"g=4 mm"}, false, true},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			r := runExample(t, "sheets/heated-pipe.sheaf", c.sets...)
			if c.pass {
				r.allPass()
			}
			L, g, k := r.v("L"), r.v("g"), r.v("k_stop")
			E, alpha := r.f("steel", "E"), r.f("steel", "alpha")
			D, tw := r.v("D"), r.v("t")
			A := math.Pi * (D*D - (D-2*tw)*(D-2*tw)) / 4
			dT := r.v("T_flow") - r.v("T_install")
			free := alpha * dT * L
			// Source: misfit of a bar against a stop, Gere & Goodno §2.5 (from
			// memory): the stop takes back the growth beyond the clearance,
			// through the bar's flexibility L/(EA) and the stop's 1/k in series.
			excess := math.Max(free-g, 0)
			Rr := E * A * excess / L
			Re := excess / (L/(E*A) + 1/k)
			if got := r.v("closed") == 1; got != c.closed {
				t.Errorf("gap closed = %v, want %v (free growth %.4g mm, clearance %.4g mm)", got, c.closed, free*1e3, g*1e3)
			}
			r.near("R_rigid", r.v("R_rigid")+1, Rr+1, relExact) // +1 N keeps the open-gap case (0) meaningful
			r.near("R_stop", r.v("R_stop")+1, Re+1, relExact)
			r.near("sigma_r", r.v("sigma_r")-1, -Rr/A-1, relExact)
			r.near("sigma_e", r.v("sigma_e")-1, -Re/A-1, relExact)
			wantU := free
			if c.closed {
				wantU = g + Re/k
			}
			r.near("u_end", r.v("u_end"), wantU, relExact)
			// Source: bar fixed at both ends and heated, σ = −EαΔT (REFERENCES C7).
			r.near("sigma_full", r.v("sigma_full"), -E*alpha*dT, relExact)
		})
	}

	// Source: REFERENCES C7, ΔT = +40 K, E = 210 GPa, α = 12e-6 /K, no clearance:
	// σ = −100.8 MPa (independent of the area).
	c7 := runExample(t, "sheets/heated-pipe.sheaf", "g=0 mm", "T_flow=50 °C")
	c7.near("C7 sigma", c7.v("sigma_r"), -100.8e6, relRef)
	// Source: REFERENCES C9, CHS 168.3×8, L = 6 m, E = 210 GPa, K = 1:
	// P_cr = 746.873947 kN (the guide spacing is 6 m).
	c9 := runExample(t, "sheets/heated-pipe.sheaf", "t=8 mm")
	c9.near("C9 N_cr", c9.v("N_cr"), 746.873947e3, relRef)
}

// chiEN1993 is the reduction factor of EN 1993-1-1 §6.3.1.2 written out:
// Φ = 0.5[1 + α(λ̄ − 0.2) + λ̄²], χ = 1/(Φ + √(Φ² − λ̄²)) ≤ 1 (from memory;
// REFERENCES.md D1).
func chiEN1993(lb, alpha float64) float64 {
	phi := 0.5 * (1 + alpha*(lb-0.2) + lb*lb)
	return math.Min(1, 1/(phi+math.Sqrt(phi*phi-lb*lb)))
}

// catalogueCopy writes a copy of a sheet with catalogue keys replaced
// (pairs old, new) into a temporary folder and returns its path.
func catalogueCopy(t *testing.T, path string, pairs ...string) string {
	t.Helper()
	src, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	text := string(src)
	for i := 0; i+1 < len(pairs); i += 2 {
		if !strings.Contains(text, pairs[i]) {
			t.Fatalf("%s has no %s", path, pairs[i])
		}
		text = strings.ReplaceAll(text, pairs[i], pairs[i+1])
	}
	out := filepath.Join(t.TempDir(), filepath.Base(path))
	if err := os.WriteFile(out, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return out
}

// TestLayeredPileClosedForm: the pile of sheets/layered-pile.sheaf as drawn
// and with the layers, the size and the load moved by --set (the line loads
// follow the cells, not typed numbers), against the statics of a bar with
// friction q_i over [a_i, b_i]: toe R = P − Σq_i(b_i − a_i), shortening
// δ = (P·L − Σq_i[(b_i − a_i)²/2 + (b_i − a_i)(L − b_i)])/(EA).
// Source: equilibrium and δ = ∫N/(EA) dx, Gere & Goodno, Mechanics of
// Materials §2.3; REFERENCES.md C10 is the single-layer case.
func TestLayeredPileClosedForm(t *testing.T) {
	t.Chdir("../..")
	for _, sets := range [][]string{nil, {"z_1=3 m", "z_2=12 m", "D=750 mm", "P_k=3000 kN"}} {
		r := runExample(t, "sheets/layered-pile.sheaf", sets...)
		P, L, D := r.v("P_k"), r.v("L"), r.v("D")
		z1, z2, q1, q2 := r.v("z_1"), r.v("z_2"), r.v("q_1"), r.v("q_2")
		// Source: EN 1992-1-1 Table 3.1, E_cm of C30/37 (REFERENCES B4 formula).
		E := 22e9 * math.Pow(3.8, 0.3)
		EA := E * math.Pi * D * D / 4
		h1, h2 := z2-z1, L-z2
		toe := P - q1*h1 - q2*h2
		delta := (P*L - q1*(h1*h1/2+h1*(L-z2)) - q2*h2*h2/2) / EA
		r.near("R_toe", r.v("R_toe"), toe, relExact)
		r.near("s_el", r.v("s_el"), delta, relExact)
	}
}

// TestEncasedColumnClosedForm: sheets/encased-column.sheaf against the hand
// sums of its three parts: the HEB 260 area with its root fillets, the bars,
// the net concrete; EA, the elastic shares and the squash load.
// Source: A = 2bt_f + (h − 2t_f)t_w + (4 − π)r² (plane geometry, EN 10365
// dimensions from memory, REFERENCES D10); composite bar N_i = N·E_iA_i/ΣEA
// (Gere & Goodno §2.4); EN 1994-1-1 Eq. (6.30) with 0.85 for encased
// sections (from memory); E_cm by the Table 3.1 formula (REFERENCES B4).
func TestEncasedColumnClosedForm(t *testing.T) {
	t.Chdir("../..")
	r := runExample(t, "sheets/encased-column.sheaf")
	r.allPass()
	Aa := 2*0.260*0.0175 + (0.260-2*0.0175)*0.010 + (4-math.Pi)*0.024*0.024
	As := 4 * math.Pi * 0.008 * 0.008
	Ac := 0.45*0.45 - Aa - As
	r.near("A_a", r.v("A_a"), Aa, relExact)
	r.near("A_s", r.v("A_s"), As, relExact)
	r.near("A_c", r.v("A_c"), Ac, relExact)
	Ecm := 22e9 * math.Pow(3.8, 0.3)
	EA := 210e9*Aa + 200e9*As + Ecm*Ac
	Nk := r.v("N_k")
	r.near("N_a", r.v("N_a"), Nk*210e9*Aa/EA, relExact)
	r.near("N_c", r.v("N_c"), Nk*Ecm*Ac/EA, relExact)
	r.near("N_plRd", r.v("N_plRd"), Aa*355e6+As*500e6/1.15+0.85*Ac*30e6/1.5, relExact)
}

// TestDuctHangerUSClosedForm: the US sheet, written in inches, feet, kip
// and ksi, against the same mechanics computed here in SI from the NIST
// factors, and with the rod size given in inches through --set.
func TestDuctHangerUSClosedForm(t *testing.T) {
	t.Chdir("../..")
	// Source: NIST SP 811 (2008) App. B: 1 in = 0.0254 m, 1 ft = 0.3048 m
	// (exact); 1 kip = 4448.2216152605 N; 1 ksi = 6.894757293168361e6 Pa
	// (REFERENCES A1, A2, A6, A8).
	const in, ft, kip, ksi = 0.0254, 0.3048, 4448.2216152605, 6.894757293168361e6
	for _, c := range []struct {
		name string
		sets []string
		d    float64 // rod diameter, in
	}{
		{"as written", nil, 0.75},
		{"--set in inches", []string{"d=0.625in"}, 0.625},
		{"--set in inches with a space", []string{"d=0.875 in"}, 0.875},
	} {
		t.Run(c.name, func(t *testing.T) {
			r := runExample(t, "sheets/duct-hanger-us.sheaf", c.sets...)
			r.allPass()
			d := c.d * in
			r.near("d", r.v("d"), d, relExact)
			Ag := math.Pi * d * d / 4
			r.near("A_g", r.v("A_g"), Ag, relExact)
			// Source: AISC 360 D2, φPn = 0.90 Fy Ag (from memory); ASCE/SEI 7 2.3.1, 1.2D + 1.6L (from memory).
			r.near("phiP_n", r.v("phiP_n"), 0.90*36*ksi*Ag, relExact)
			r.near("P_u", r.v("P_u"), (1.2*1.2+1.6*0.8)*kip, relExact)
			// The sheet's actions D and L give 1.4D and 1.2D + 1.6L (REFERENCES
			// D8); the second governs the tension check, as written by hand before.
			dem, comb := r.demand("tension")
			r.near("tension demand", dem, (1.2*1.2+1.6*0.8)*kip, relExact)
			if comb != "1.2 D + 1.6 L" {
				t.Errorf("tension governs in %q", comb)
			}
			// Source: prismatic bar δ = PL/(EA), Gere & Goodno §2.2 (REFERENCES C1's formula).
			r.near("delta", r.v("delta"), 2.0*kip*6*ft/(29000*ksi*Ag), relExact)
		})
	}
}
