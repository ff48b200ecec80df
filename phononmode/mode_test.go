package phononmode

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"thzdrive/units"
)

// GaAs, physics.md §5 (derived from published parameters): a = 5.65325 Å,
// V = a³/4 = 45.168 Å³, μ = 36.114 amu, W_TO = 268 cm⁻¹, ε(0) = 12.9,
// ε∞ = 10.89 → Z_B = 2.19, consistent with the Szigeti charge 0.51 of Hass &
// Henvis (J. Phys. Chem. Solids 23, 1099 (1962)) times (ε∞ + 2)/3.
func TestBornHuangGaAs(t *testing.T) {
	a := 5.65325 * units.Angstrom
	v := a * a * a / 4
	// physics.md §5: 45.168 Å³, quoted to 5 digits → ±0.0005 Å³.
	if got := v / units.CubicAngstrom; math.Abs(got-45.168) > 0.0005 {
		t.Errorf("V = a³/4 = %.5f Å³, want 45.168", got)
	}
	// Reduced mass from the standard atomic weights Ga 69.723, As 74.921595
	// (IUPAC, from memory): physics.md quotes 36.114 amu (±0.0005).
	mu := 69.723 * 74.921595 / (69.723 + 74.921595)
	if math.Abs(mu-36.114) > 0.0005 {
		t.Errorf("μ = %.5f amu, want 36.114", mu)
	}
	muKg := 36.114 * units.Amu
	epsInf := 10.89
	z, err := ZStarFromOscillatorStrength(12.9-epsInf, v, 268*units.InvCm)
	if err != nil {
		t.Fatal(err)
	}
	zb, err := DiatomicBornCharge(z, muKg)
	if err != nil {
		t.Fatal(err)
	}
	// physics.md §5 (derived): Z_B = 2.19, quoted to 3 digits → ±0.005.
	if math.Abs(zb-2.19) > 0.005 {
		t.Errorf("Z_B = %.4f, want 2.19", zb)
	}
	// Szigeti charge 0.51 (Hass & Henvis 1962, 2 digits → ±0.005) times
	// (ε∞+2)/3 = 4.297: ±0.0215, plus the ±0.005 of Z_B's own rounding.
	if s := 0.51 * (epsInf + 2) / 3; math.Abs(zb-s) > 0.005*(epsInf+2)/3+0.005 {
		t.Errorf("Z_B = %.4f, Szigeti 0.51·(ε∞+2)/3 = %.4f", zb, s)
	}
	// Round trip through DiatomicZStar and the Born–Huang relation: exact up
	// to rounding (common practice: a few ulps → 1e-14).
	z2, err := DiatomicZStar(zb, muKg)
	if err != nil {
		t.Fatal(err)
	}
	de, err := OscillatorStrength(z2, v, 268*units.InvCm)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(de-(12.9-epsInf)) > 1e-14 {
		t.Errorf("Δε round trip = %.16g, want %g", de, 12.9-epsInf)
	}
}

// physics.md §5 (derived): with Z_B = 2.16 a static field of 1 MV/cm inside
// GaAs displaces the sublattices by x = Z_B·e·E/(μ·W²) = 0.2264 pm. Checked
// on the static formula, and on the exact and time-domain drives by a field
// that ramps smoothly to 1 MV/cm and holds (the plateau response of the
// linear oscillator is exactly the static one once the ramp's transient has
// decayed: its amplitude is ~e^{−(Wσ)²/2} with σ the ramp width).
func TestStaticDisplacementGaAs(t *testing.T) {
	mu := 36.114 * units.Amu
	z, err := DiatomicZStar(2.16, mu)
	if err != nil {
		t.Fatal(err)
	}
	m := Mode{FreqHz: 268 * units.InvCm, LinewidthHz: 2.5 * units.InvCm,
		ZStarCPerSqrtKg: z, CellVolumeM3: 45.168 * units.CubicAngstrom, EffectiveMassKg: mu}
	x := m.StaticQMSqrtKg(units.MVPerCm) / math.Sqrt(mu)
	// 0.2264 pm quoted to 4 digits → ±0.00005 pm.
	if math.Abs(x/units.Pm-0.2264) > 0.00005 {
		t.Fatalf("static x = %.6f pm, want 0.2264", x/units.Pm)
	}

	// Ramp: ½(1+erf((t−t1)/σ)) up, the mirror image down; σ = 0.5 ps, so
	// (Wσ)²/2 ≈ 320 and the ramp excites no ringing.
	const n, step = 6000, 10e-15
	sigma, t1, t2 := 0.5e-12, 5e-12, 55e-12
	v := make([]float64, n)
	for i := range v {
		tt := float64(i) * step
		v[i] = units.MVPerCm * 0.25 * (1 + math.Erf((tt-t1)/sigma)) * (1 - math.Erf((tt-t2)/sigma))
	}
	f := Field{StepS: step, VPerM: v}
	// The plateau sample at 30 ps, 25 ps after the ramp: transients of
	// the ramp are below e^{−(Wσ)²/2}, and the ramp-down is 25 ps away.
	i := 3000
	for _, meth := range []Method{Exact, TimeDomain} {
		r := mustDrive(t, m, f, Options{Method: meth})
		got := r.QMSqrtKg[i] / math.Sqrt(mu)
		// 1e-6 relative: the integrator's target is 1e-7 of max|Q|.
		if math.Abs(got/x-1) > 1e-6 {
			t.Errorf("%v: plateau x = %.9g pm, static %.9g pm", meth, got/units.Pm, x/units.Pm)
		}
		// The displacement output uses M_eff = μ: the sublattice x.
		if math.Abs(r.DisplacementM/x-1) > 1e-6 {
			t.Errorf("%v: DisplacementM = %.9g pm, want %.9g", meth, r.DisplacementM/units.Pm, x/units.Pm)
		}
	}
}

// Born & Huang: Δε = Z*²/(ε0·V·W²) and its inverse agree over random inputs
// (property; round-off tolerance 1e-13).
func TestOscillatorStrengthRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for range 200 {
		de := math.Exp(rng.Float64()*12 - 8) // 3e-4 … 50
		v := math.Exp(rng.Float64()*6-3) * 100 * units.CubicAngstrom
		f := math.Exp(rng.Float64()*5-2) * units.THz
		m, err := FromOscillatorStrength(de, f, 0.1*f, v)
		if err != nil {
			t.Fatal(err)
		}
		if got := m.OscillatorStrength(); math.Abs(got/de-1) > 1e-13 {
			t.Fatalf("Δε %g → Z* %g → Δε %g", de, m.ZStarCPerSqrtKg, got)
		}
		// ε(0) − ε(∞) from the dielectric term at f → 0 (Lorentz model).
		if got := real(m.DielectricTerm(0)); math.Abs(got/de-1) > 1e-13 {
			t.Fatalf("DielectricTerm(0) = %g, want Δε = %g", got, de)
		}
	}
}

// Lyddane–Sachs–Teller (Phys. Rev. 59, 673 (1941)): one undamped mode puts
// Re ε = 0 at W_LO = W_TO·√(ε(0)/ε∞). physics.md §4 check: GaAs (Hass &
// Henvis 1962) W_TO = 273.3 cm⁻¹, ε∞ = 10.89, Δε = 2.00 → Re ε(297.3 cm⁻¹)
// = 0 within 0.1 %.
func TestDielectricTermLST(t *testing.T) {
	m, err := FromOscillatorStrength(2.00, 273.3*units.InvCm, 0, 45.168*units.CubicAngstrom)
	if err != nil {
		t.Fatal(err)
	}
	re := func(f float64) float64 { return 10.89 + real(m.DielectricTerm(f)) }
	lo, hi := 274*units.InvCm, 400*units.InvCm
	for range 200 {
		mid := 0.5 * (lo + hi)
		if re(mid) < 0 {
			lo = mid
		} else {
			hi = mid
		}
	}
	if got := lo / units.InvCm; math.Abs(got/297.3-1) > 1e-3 {
		t.Errorf("Re ε = 0 at %.2f cm⁻¹, want 297.3 within 0.1 %%", got)
	}
}

// γ is exactly the FWHM of ω·ε″(ω) (derived: ω·ε″ ∝ γ/((W²−ω²)²/ω² + γ²) is
// half its maximum where |W² − ω²| = γω, whose positive roots differ by γ),
// the maximum sits at ω = W, and ε″ >= 0 for ω > 0 (passivity, physics.md
// §1). Tolerance 1e-9 relative: bisection to 1e-15 on well-conditioned roots.
func TestLinewidthIsFWHM(t *testing.T) {
	cases := []struct {
		name         string
		fHz, gammaHz float64
	}{
		{"narrow", 5 * units.THz, 0.01 * units.THz},
		{"broad", 1 * units.THz, 0.8 * units.THz},
		{"overdamped", 1 * units.THz, 3 * units.THz},
	}
	for _, c := range cases {
		m, err := FromOscillatorStrength(1, c.fHz, c.gammaHz, 100*units.CubicAngstrom)
		if err != nil {
			t.Fatal(err)
		}
		s := func(f float64) float64 { return f * imag(m.DielectricTerm(f)) }
		peak := s(c.fHz)
		for _, df := range []float64{1e-6, -1e-6} {
			if s(c.fHz*(1+df)) > peak {
				t.Errorf("%s: ω·ε″ not maximal at W", c.name)
			}
		}
		half := func(lo, hi float64) float64 {
			up := s(lo) < s(hi)
			for range 200 {
				mid := 0.5 * (lo + hi)
				if (s(mid) < peak/2) == up {
					lo = mid
				} else {
					hi = mid
				}
			}
			return lo
		}
		f1 := half(0, c.fHz)
		f2 := half(c.fHz, 100*c.fHz)
		if got := f2 - f1; math.Abs(got/c.gammaHz-1) > 1e-9 {
			t.Errorf("%s: FWHM of ω·ε″ = %g Hz, want γ/2π = %g Hz", c.name, got, c.gammaHz)
		}
		for _, f := range []float64{1e9, c.fHz / 2, c.fHz, 2 * c.fHz, 50 * c.fHz} {
			if imag(m.DielectricTerm(f)) < 0 {
				t.Errorf("%s: ε″(%g Hz) < 0", c.name, f)
			}
		}
	}
}

// Landau & Lifshitz, Mechanics §28 (eq. 28.13, from memory): for
// ẍ + ω0²x = −αx² − βx³ the frequency at amplitude a of the fundamental is
// ω0 + (3β/(8ω0) − 5α²/(12ω0³))·a². The free anharmonic mode is integrated
// with the package's RK4 step; its frequency is measured from upward zero
// crossings over 40 periods, and a is the fundamental's Fourier coefficient
// over those periods. The perturbation series neglects terms of relative
// order ε² and ε_β (ε = αa/ω0², ε_β = βa²/ω0²), here <= 4e-4 and 2e-3 of the
// shift, so a 1 % tolerance leaves room for the measurement and no more.
func TestAnharmonicShiftLandauLifshitz(t *testing.T) {
	w0 := 2 * math.Pi * units.THz
	a0 := 1e-24 // m·√kg, any scale: only α·a/ω0² and β·a²/ω0² matter
	cases := []struct {
		name string
		epsA float64 // α·a/ω0²
		epsB float64 // β·a²/ω0²
	}{
		{"quartic stiffening", 0, 2e-3},
		{"quartic softening", 0, -2e-3},
		{"cubic softens either sign", -2e-2, 0},
		{"both", 2e-2, 2e-3},
	}
	for _, c := range cases {
		m := Mode{FreqHz: units.THz, CellVolumeM3: 1e-28,
			A3PerMSqrtKgS2: c.epsA * w0 * w0 / a0, A4PerM2KgS2: c.epsB * w0 * w0 / (a0 * a0)}
		o := newOscillator(m)
		h := 2 * math.Pi / w0 / 4000
		run := func(visit func(t, q float64) bool) {
			q, p, work, tt := a0, 0.0, 0.0, 0.0
			for {
				qn, pn, wn := o.step(q, p, work, h, 0, 0, 0)
				if !visit(tt, q) {
					return
				}
				q, p, work = qn, pn, wn
				tt += h
			}
		}
		var cross []float64
		prev := a0
		run(func(tt, q float64) bool {
			if prev < 0 && q >= 0 {
				cross = append(cross, tt-h*q/(q-prev))
			}
			prev = q
			return len(cross) < 41
		})
		w := 2 * math.Pi * 40 / (cross[40] - cross[0])
		var proj, cnt float64
		run(func(tt, q float64) bool {
			if tt >= cross[0] && tt < cross[40] {
				proj += q * math.Sin(w*(tt-cross[0]))
				cnt++
			}
			return tt < cross[40]
		})
		a := 2 * proj / cnt
		want := m.AnharmonicShiftHz(a) * 2 * math.Pi
		got := w - w0
		if math.Abs(got/want-1) > 1e-2 {
			t.Errorf("%s: shift %.6g rad/s, L&L §28 %.6g (a = %.4g)", c.name, got, want, a)
		}
		t.Logf("%s: measured/L&L − 1 = %.2g", c.name, got/want-1)
	}
}

// Bad input returns an error wrapping ErrInvalidInput, never a panic
// (common practice).
func TestBadInput(t *testing.T) {
	good := Mode{FreqHz: units.THz, LinewidthHz: 0.1 * units.THz, ZStarCPerSqrtKg: units.ESqrtAmu, CellVolumeM3: 1e-28}
	field := singleCycle(units.KVPerCm, 0.2e-12, 1e-12, 0, 10e-15, 512)
	nan, inf := math.NaN(), math.Inf(1)
	with := func(f func(*Mode)) Mode { m := good; f(&m); return m }
	withField := func(f func(*Field)) Field {
		g := field
		g.VPerM = append([]float64(nil), field.VPerM...)
		f(&g)
		return g
	}
	cases := []struct {
		name string
		m    Mode
		f    Field
		opt  Options
	}{
		{"NaN frequency", with(func(m *Mode) { m.FreqHz = nan }), field, Options{}},
		{"Inf frequency", with(func(m *Mode) { m.FreqHz = inf }), field, Options{}},
		{"zero frequency", with(func(m *Mode) { m.FreqHz = 0 }), field, Options{}},
		{"negative frequency", with(func(m *Mode) { m.FreqHz = -1 }), field, Options{}},
		{"negative linewidth", with(func(m *Mode) { m.LinewidthHz = -1 }), field, Options{}},
		{"NaN linewidth", with(func(m *Mode) { m.LinewidthHz = nan }), field, Options{}},
		{"Inf Z*", with(func(m *Mode) { m.ZStarCPerSqrtKg = inf }), field, Options{}},
		{"zero volume", with(func(m *Mode) { m.CellVolumeM3 = 0 }), field, Options{}},
		{"negative mass", with(func(m *Mode) { m.EffectiveMassKg = -1 }), field, Options{}},
		{"NaN bond", with(func(m *Mode) { m.BondLengthM = nan }), field, Options{}},
		{"Inf a3", with(func(m *Mode) { m.A3PerMSqrtKgS2 = inf }), field, Options{}},
		{"NaN a4", with(func(m *Mode) { m.A4PerM2KgS2 = nan }), field, Options{}},
		{"NaN Raman", with(func(m *Mode) { m.DEpsDQPerMSqrtKg = nan }), field, Options{}},
		{"Inf angle", with(func(m *Mode) { m.PolarAngleRad = inf }), field, Options{}},
		{"empty field", good, Field{StepS: 1e-14}, Options{}},
		{"one sample", good, Field{StepS: 1e-14, VPerM: []float64{1}}, Options{}},
		{"NaN sample", good, withField(func(f *Field) { f.VPerM[7] = nan }), Options{}},
		{"Inf sample", good, withField(func(f *Field) { f.VPerM[7] = -inf }), Options{}},
		{"zero step", good, withField(func(f *Field) { f.StepS = 0 }), Options{}},
		{"NaN step", good, withField(func(f *Field) { f.StepS = nan }), Options{}},
		{"NaN start", good, withField(func(f *Field) { f.StartS = nan }), Options{}},
		{"unknown method", good, field, Options{Method: 7}},
		{"negative limit", good, field, Options{MaxSamples: -1}},
		{"tolerance 1", good, field, Options{TimeDomainTol: 1}},
		{"exact nonlinear", with(func(m *Mode) { m.A4PerM2KgS2 = 1 }), field, Options{Method: Exact}},
		{"depth without index", good, field, Options{Depth: &Depth{ProbeDepthM: 1e-6}}},
		{"depth zero", good, field, Options{Depth: &Depth{ProbeDepthM: 0, Index: func(float64) complex128 { return 3 }}}},
		{"depth gain medium", good, field, Options{Depth: &Depth{ProbeDepthM: 1e-6, Index: func(float64) complex128 { return complex(3, -0.1) }}}},
		{"depth NaN index", good, field, Options{Depth: &Depth{ProbeDepthM: 1e-6, Index: func(float64) complex128 { return complex(nan, 0) }}}},
	}
	for _, c := range cases {
		_, err := Drive(c.m, c.f, c.opt)
		if !errors.Is(err, ErrInvalidInput) {
			t.Errorf("%s: err = %v, want ErrInvalidInput", c.name, err)
		}
		var ie *InputError
		if err != nil && !errors.As(err, &ie) {
			t.Errorf("%s: error %v is not an *InputError", c.name, err)
		}
	}
	for _, c := range []struct {
		name string
		err  error
	}{
		{"Z* from NaN Δε", second(ZStarFromOscillatorStrength(nan, 1e-28, 1e12))},
		{"Z* from negative Δε", second(ZStarFromOscillatorStrength(-1, 1e-28, 1e12))},
		{"Z* zero volume", second(ZStarFromOscillatorStrength(1, 0, 1e12))},
		{"Z* zero frequency", second(ZStarFromOscillatorStrength(1, 1e-28, 0))},
		{"Δε NaN Z*", second(OscillatorStrength(nan, 1e-28, 1e12))},
		{"diatomic zero mass", second(DiatomicZStar(2, 0))},
		{"diatomic NaN charge", second(DiatomicZStar(nan, 1e-26))},
		{"Born charge Inf", second(DiatomicBornCharge(inf, 1e-26))},
	} {
		if !errors.Is(c.err, ErrInvalidInput) {
			t.Errorf("%s: err = %v, want ErrInvalidInput", c.name, c.err)
		}
	}
}

func second[T any](_ T, err error) error { return err }

// Limits and divergence are errors of their own kind (common practice).
func TestTooLargeAndDiverged(t *testing.T) {
	m := Mode{FreqHz: units.THz, LinewidthHz: 0.1 * units.THz, ZStarCPerSqrtKg: units.ESqrtAmu, CellVolumeM3: 1e-28}
	f := singleCycle(units.MVPerCm, 0.16e-12, 1e-12, 0, 10e-15, 1024)
	if _, err := Drive(m, f, Options{Method: TimeDomain, MaxSamples: 4096}); !errors.Is(err, ErrTooLarge) {
		t.Errorf("sub-step grid over the limit: err = %v, want ErrTooLarge", err)
	}
	// A cubic term with no quartic lets the mode escape over the barrier at
	// Q = −W²/a3 when driven past it: the solution diverges.
	esc := m
	w := m.OmegaRadPerS()
	qLin := mustDrive(t, m, f, Options{}).MaxAbsQMSqrtKg
	esc.A3PerMSqrtKgS2 = 10 * w * w / qLin
	if _, err := Drive(esc, f, Options{}); !errors.Is(err, ErrDiverged) {
		t.Errorf("escaping mode: err = %v, want ErrDiverged", err)
	}
}
