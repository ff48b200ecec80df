package tdsfit

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"encoding/binary"
	"fmt"
	"math"
	"math/cmplx"
	"testing"

	"thzdrive/optics"
	"thzdrive/pulse"
	"thzdrive/units"
)

// fuzzInput builds two traces and the options from fuzz bytes: byte 0 picks
// the echoes and the window, byte 1 the thickness (1 um … 10 mm, and 0, NaN
// or too thick), byte 2 the margin and the noise limit, byte 3 the step
// (1e-16 … 1e-12 s), byte 4 how the rest is read: as pairs of 16-bit
// integers (reference, sample) scaled by a power of ten, or as pairs of raw
// float64 bits (NaN, Inf, anything).
func fuzzInput(data []byte) (ref, sam pulse.Trace, to TransmissionOptions, eo ExtractOptions) {
	var b [5]byte
	copy(b[:], data)
	rest := data[min(5, len(data)):]
	eo.Echoes = []Echoes{NoEchoes, AllEchoes, 1, 3}[b[0]%4]
	to.Processing.Window = pulse.Window((b[0] / 4) % 4)
	switch b[1] {
	case 255:
		eo.ThicknessM = math.NaN()
	case 254:
		eo.ThicknessM = 0
	case 253:
		eo.ThicknessM = 5
	default:
		eo.ThicknessM = math.Pow(10, -6+float64(b[1]%41)/10)
	}
	to.MarginDB = float64(b[2] % 64)
	if b[2] >= 128 {
		eo.MaxStdIndex = math.Pow(10, -float64(b[2]%8))
	}
	step := math.Pow(10, -16+float64(b[3]%5))
	ref = pulse.Trace{StepS: step, StartS: -float64(b[3]) * step}
	sam = pulse.Trace{StepS: step, StartS: ref.StartS}
	if b[4]%2 == 0 {
		scale := math.Pow(10, float64(int(b[4]%32)-16)*3)
		for i := 0; i+3 < len(rest); i += 4 {
			ref.Field = append(ref.Field, float64(int16(binary.LittleEndian.Uint16(rest[i:])))*scale)
			sam.Field = append(sam.Field, float64(int16(binary.LittleEndian.Uint16(rest[i+2:])))*scale)
		}
	} else {
		for i := 0; i+15 < len(rest); i += 16 {
			ref.Field = append(ref.Field, math.Float64frombits(binary.LittleEndian.Uint64(rest[i:])))
			sam.Field = append(sam.Field, math.Float64frombits(binary.LittleEndian.Uint64(rest[i+8:])))
		}
	}
	return ref, sam, to, eo
}

// encodeTraces is the inverse of fuzzInput for 16-bit samples at scale 1
// (byte 4 = 16), for seeds that reach the extraction.
func encodeTraces(head [4]byte, ref, sam []float64, peak float64) []byte {
	out := append(head[:], 16)
	for i := range ref {
		out = binary.LittleEndian.AppendUint16(out, uint16(int16(math.Round(ref[i]/peak*30000))))
		out = binary.LittleEndian.AppendUint16(out, uint16(int16(math.Round(sam[i]/peak*30000))))
	}
	return out
}

func checkExtraction(ex Extraction) error {
	n := len(ex.FreqHz)
	if n < MinBandBins || len(ex.Index) != n || len(ex.StdIndex) != n || len(ex.Iterations) != n || ex.Band.Len() != n {
		return fmt.Errorf("inconsistent lengths: %d frequencies, band %+v", n, ex.Band)
	}
	for i := range n {
		if !finite(ex.FreqHz[i]) || !finiteC(ex.Index[i]) || !finite(ex.StdIndex[i]) || ex.StdIndex[i] < 0 || real(ex.Index[i]) <= 0 {
			return fmt.Errorf("bin %d: f %g, ñ %v, σ %g", i, ex.FreqHz[i], ex.Index[i], ex.StdIndex[i])
		}
	}
	for _, e := range ex.Epsilon() {
		if !finiteC(e) {
			return fmt.Errorf("ε %v", e)
		}
	}
	for _, a := range ex.AbsorptionPerM() {
		if !finite(a) {
			return fmt.Errorf("α %g", a)
		}
	}
	for _, c := range ex.Cautions {
		for _, v := range c.Values {
			if !finite(v.Number) {
				return fmt.Errorf("caution %v: %s = %g", c.Code, v.Name, v.Number)
			}
		}
	}
	return nil
}

// FuzzExtractFromTraces checks that the extraction entry point never panics
// and, when it accepts its input, returns only finite numbers (and n > 0).
// Run with: go test -fuzz=FuzzExtractFromTraces ./tdsfit/
func FuzzExtractFromTraces(f *testing.F) {
	// A silicon slab through package optics, quantised to 16 bits, in
	// both echo models and with a noise limit.
	ref, sam := synth(f, synthSpec{model: onePulse, stepS: 100 * units.Fs, n: 200, startS: -3 * units.Ps,
		slab: optics.Slab{Medium: optics.Constant{N: 3.4175}, ThicknessM: 500 * units.Um, Incoherent: true}, noise: 1e-3, seed: 1})
	// Thickness byte 27 selects 10^(-6+2.7) m = 501 um; step byte 3 selects
	// 1e-13 s.
	f.Add(encodeTraces([4]byte{0, 27, 20, 3}, ref.Field, sam.Field, 1))
	f.Add(encodeTraces([4]byte{1, 27, 150, 3}, ref.Field, sam.Field, 1))
	f.Add(encodeTraces([4]byte{2, 30, 10, 3}, ref.Field, sam.Field, 1))
	f.Add(encodeTraces([4]byte{4, 254, 20, 3}, ref.Field, sam.Field, 1))
	f.Add([]byte{1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17})
	f.Add(make([]byte, 300))
	f.Fuzz(func(t *testing.T, data []byte) {
		ref, sam, to, eo := fuzzInput(data)
		ex, err := ExtractFromTraces(ref, sam, to, eo)
		if err != nil {
			return
		}
		if err := checkExtraction(ex); err != nil {
			t.Fatal(err)
		}
	})
}

// The fuzz seeds that describe silicon do reach the extraction and give
// its index (a check that the fuzz target exercises the Newton iteration,
// not only the input checks).
func TestFuzzSeedsReachExtraction(t *testing.T) {
	ref, sam := synth(t, synthSpec{model: onePulse, stepS: 100 * units.Fs, n: 200, startS: -3 * units.Ps,
		slab: optics.Slab{Medium: optics.Constant{N: 3.4175}, ThicknessM: 500 * units.Um, Incoherent: true}, noise: 1e-3, seed: 1})
	r, s, to, eo := fuzzInput(encodeTraces([4]byte{0, 27, 20, 3}, ref.Field, sam.Field, 1))
	ex, err := ExtractFromTraces(r, s, to, eo)
	if err != nil {
		t.Fatal(err)
	}
	if err := checkExtraction(ex); err != nil {
		t.Fatal(err)
	}
	// 1 um too thick (501 um for 500 um) biases n by (n-1)·δd/d = 0.005;
	// the 16-bit quantisation and the noise add ~1e-3.
	mid := ex.Index[len(ex.Index)/2]
	if math.Abs(real(mid)-3.4175) > 0.02 || cmplx.IsNaN(mid) {
		t.Errorf("n = %v in the middle of the band, want ≈ 3.41", mid)
	}
}
