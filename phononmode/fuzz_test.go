package phononmode

import (
	"encoding/binary"
	"math"
	"math/rand/v2"
	"testing"

	"thzdrive/units"
)

// FuzzMode builds a mode and a field from the fuzzer's input and drives it:
// whatever the input, Drive returns an error or a result whose every number
// is finite, and never panics (the service's contract, service.md).
func FuzzMode(f *testing.F) {
	seed := func(fTHz, lwTHz, zE, volA3, a3, a4, deps, angle, stepFs float64, method uint8, field []float64) {
		b := make([]byte, 8*len(field))
		for i, v := range field {
			binary.LittleEndian.PutUint64(b[8*i:], math.Float64bits(v))
		}
		f.Add(fTHz, lwTHz, zE, volA3, a3, a4, deps, angle, stepFs, method, b)
	}
	pulse := singleCycle(1e8, 0.1e-12, 0.5e-12, 0, 10e-15, 128).VPerM
	seed(2, 0.1, 1, 100, 0, 0, 0, 0, 10, 0, pulse)
	seed(2, 0.1, 1, 100, 1e48, 1e71, 1e25, 0.3, 10, 2, pulse)
	seed(8, 0, 2, 45, 0, 0, 0, 1, 10, 1, pulse)
	seed(40, 3, 1, 1, 0, -1e70, 0, 0, 20, 0, pulse)
	seed(0.01, 0.5, 1e3, 1e-3, 0, 0, 0, 0, 1e3, 0, []float64{1, -1, 1e10, 0})
	seed(1e-300, 1e300, 1e300, 1e-300, 1e300, -1e300, 1e300, 1e300, 1e-300, 2, []float64{1e300, -1e300})
	f.Fuzz(func(t *testing.T, fTHz, lwTHz, zE, volA3, a3, a4, deps, angle, stepFs float64, method uint8, data []byte) {
		m := Mode{
			FreqHz:           fTHz * units.THz,
			LinewidthHz:      lwTHz * units.THz,
			ZStarCPerSqrtKg:  zE * units.ESqrtAmu,
			CellVolumeM3:     volA3 * units.CubicAngstrom,
			EffectiveMassKg:  10 * units.Amu,
			BondLengthM:      2.5 * units.Angstrom,
			A3PerMSqrtKgS2:   a3,
			A4PerM2KgS2:      a4,
			DEpsDQPerMSqrtKg: deps,
			PolarAngleRad:    angle,
		}
		n := min(len(data)/8, 512)
		v := make([]float64, n)
		for i := range v {
			v[i] = math.Float64frombits(binary.LittleEndian.Uint64(data[8*i:]))
		}
		fld := Field{StepS: stepFs * units.Fs, VPerM: v}
		opt := Options{Method: Method(method % 4), MaxSamples: 1 << 14}
		if method&8 != 0 {
			opt.Depth = &Depth{ProbeDepthM: 1e-7, Index: func(float64) complex128 { return complex(3, 0.1) }}
		}
		r, err := Drive(m, fld, opt)
		if err != nil {
			return
		}
		for _, x := range append([]float64{r.MaxAbsQMSqrtKg, r.MaxAbsQTimeS, r.DisplacementM, r.LindemannRatio,
			r.ModeEnergyJ, r.Quanta, r.AbsorbedJPerCell, r.AbsorbedJPerM3, r.Overlap, r.RelAmplitudeAtMode,
			r.AnharmonicShiftHz, r.PulseEndS, r.DepthAvgMaxAbsQMSqrtKg}, append(r.QMSqrtKg, r.DepthAvgQMSqrtKg...)...) {
			if math.IsNaN(x) || math.IsInf(x, 0) {
				t.Fatalf("non-finite output %g for %+v, %d samples, %+v", x, m, n, opt)
			}
		}
		if r.Overlap < 0 || r.Overlap > 1+1e-12 {
			t.Fatalf("overlap %g outside [0, 1]", r.Overlap)
		}
	})
}

// Properties over random modes and pulses (energy and passivity): the
// absorbed energy is >= 0 for a passive mode whatever the pulse (ε″ >= 0,
// physics.md §1); the exact and time-domain absorbed energies agree (1e-6,
// the integrator's tolerance); the overlap lies in [0, 1]; the relative
// amplitude at the mode in [0, 1].
func TestEnergyProperties(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for trial := range 20 {
		fHz := (0.5 + 8*rng.Float64()) * units.THz
		m := Mode{FreqHz: fHz, LinewidthHz: (0.005 + 0.3*rng.Float64()) * fHz,
			ZStarCPerSqrtKg: (rng.Float64() - 0.5) * 4 * units.ESqrtAmu, CellVolumeM3: (20 + 200*rng.Float64()) * units.CubicAngstrom,
			PolarAngleRad: 2 * math.Pi * rng.Float64()}
		step := 1 / (fHz * (8 + 20*rng.Float64()))
		n := 600 + rng.IntN(1200)
		fld := fewCycle(units.MVPerCm*rng.Float64(), (4+40*rng.Float64())*step, fHz*(0.3+1.4*rng.Float64()),
			2*math.Pi*rng.Float64(), float64(n)*step/2, 0, step, n)
		ex := mustDrive(t, m, fld, Options{Method: Exact})
		td := mustDrive(t, m, fld, Options{Method: TimeDomain})
		if ex.AbsorbedJPerCell < 0 || td.AbsorbedJPerCell < -1e-6*math.Abs(ex.AbsorbedJPerCell) {
			t.Errorf("trial %d: negative absorption %g / %g", trial, ex.AbsorbedJPerCell, td.AbsorbedJPerCell)
		}
		if math.Abs(td.AbsorbedJPerCell-ex.AbsorbedJPerCell) > 1e-6*ex.AbsorbedJPerCell {
			t.Errorf("trial %d: absorbed exact %.9g, time-domain %.9g", trial, ex.AbsorbedJPerCell, td.AbsorbedJPerCell)
		}
		if ex.Overlap < 0 || ex.Overlap > 1 || ex.RelAmplitudeAtMode < 0 || ex.RelAmplitudeAtMode > 1+1e-9 {
			t.Errorf("trial %d: η = %g, relative amplitude %g", trial, ex.Overlap, ex.RelAmplitudeAtMode)
		}
	}
}
