package pulse

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"encoding/binary"
	"fmt"
	"math"
	"math/cmplx"
	"testing"
)

// traceFromBytes builds a trace and processing options from fuzz input:
// byte 0 picks the baseline and window, byte 1 the padding, byte 2 the step
// (1e-18 … 1e2 s, and out-of-range values), byte 3 how the rest is read:
// as 16-bit integers scaled by a power of ten (finite, wide dynamic range)
// or as raw float64 bits (NaN, Inf, subnormals, anything).
func traceFromBytes(data []byte) (Trace, Processing) {
	var b [4]byte
	copy(b[:], data)
	rest := data[min(4, len(data)):]
	p := Processing{
		Baseline:   Baseline(b[0] % 4),       // includes one unknown value
		Window:     Window((b[0] / 4) % 5),   // includes one unknown value
		TukeyAlpha: float64((b[0]/20)%4) / 3, // 0 (default), 1/3, 2/3, 1
	}
	if b[1]%3 == 1 {
		p.PadToSamples = int(b[1]) * 37
	}
	tr := Trace{StepS: math.Pow(10, float64(int(b[2]%24)-20)), StartS: -float64(b[2]) * 1e-13}
	if b[3]%2 == 0 {
		scale := math.Pow(10, float64(int(b[3]%64)-32)*6)
		for i := 0; i+1 < len(rest); i += 2 {
			tr.Field = append(tr.Field, float64(int16(binary.LittleEndian.Uint16(rest[i:])))*scale)
		}
	} else {
		for i := 0; i+7 < len(rest); i += 8 {
			tr.Field = append(tr.Field, math.Float64frombits(binary.LittleEndian.Uint64(rest[i:])))
		}
	}
	tr.Absolute = b[3]&4 != 0
	return tr, p
}

func checkFinite(m Metrics) error {
	for name, v := range map[string]float64{
		"PeakFieldVPerM": m.PeakFieldVPerM, "PeakTimeS": m.PeakTimeS, "PeakToPeakVPerM": m.PeakToPeakVPerM,
		"SpectralPeakHz": m.SpectralPeakHz, "CentroidHz": m.CentroidHz, "BandwidthFWHMHz": m.BandwidthFWHMHz,
		"BandLowHz": m.BandLowHz, "BandHighHz": m.BandHighHz, "DynamicRangeDB": m.DynamicRangeDB,
		"DCAreaRatio": m.DCAreaRatio, "FluenceJPerM2": m.FluenceJPerM2, "NyquistHz": m.NyquistHz,
		"ResolutionHz": m.ResolutionHz, "EdgeRatio": m.EdgeRatio,
	} {
		if !finite(v) {
			return fmt.Errorf("%s = %g", name, v)
		}
	}
	return nil
}

// FuzzAnalyze checks that Analyze never panics and, when it accepts a
// trace, returns no NaN or Inf in any metric, spectral bin, processed sample
// or caution number. Run with: go test -fuzz=FuzzAnalyze ./pulse/
func FuzzAnalyze(f *testing.F) {
	pulseBytes := make([]byte, 4, 4+2*256)
	for i := range 256 {
		v := int16(20000 * math.Sin(float64(i)/10) * math.Exp(-math.Pow(float64(i-128)/30, 2)))
		pulseBytes = binary.LittleEndian.AppendUint16(pulseBytes, uint16(v))
	}
	f.Add(pulseBytes)
	f.Add([]byte{5, 1, 7, 0, 1, 0, 1, 0, 1, 0, 1, 0, 1, 0, 1, 0, 1, 0, 1, 0, 1, 0})
	f.Add([]byte{1, 0, 7, 0, 9, 9, 9, 9, 9, 9, 9, 9, 9, 9, 9, 9, 9, 9, 9, 9, 9, 9})
	f.Add([]byte{2, 4, 3, 0, 1, 0, 2, 0, 3, 0, 4, 0, 5, 0, 6, 0, 7, 0, 8, 0, 9, 0, 10, 0})
	alt := []byte{8, 0, 7, 1}
	for i := range 16 {
		alt = binary.LittleEndian.AppendUint64(alt, math.Float64bits(math.Pow(-1, float64(i))*1e-300))
	}
	f.Add(alt)
	f.Fuzz(func(t *testing.T, data []byte) {
		tr, p := traceFromBytes(data)
		a, err := Analyze(tr, p)
		if err != nil {
			if !isInputError(err) {
				t.Fatalf("error of type %T: %v", err, err)
			}
			return
		}
		if err := checkFinite(a.Metrics); err != nil {
			t.Fatalf("metric not finite: %v (trace %d samples, step %g, %+v)", err, tr.Len(), tr.StepS, p)
		}
		for k, v := range a.Spectrum.Values {
			if cmplx.IsNaN(v) || cmplx.IsInf(v) {
				t.Fatalf("spectrum bin %d = %v", k, v)
			}
		}
		if !finite(a.Spectrum.StepHz) || a.Spectrum.StepHz <= 0 {
			t.Fatalf("spectrum step %g Hz", a.Spectrum.StepHz)
		}
		for i, v := range a.Processed.Field {
			if !finite(v) {
				t.Fatalf("processed sample %d = %g", i, v)
			}
		}
		for _, c := range a.Cautions {
			for _, v := range c.Values {
				if !finite(v.Number) {
					t.Fatalf("caution %v value %s = %g", c.Code, v.Name, v.Number)
				}
			}
		}
	})
}
