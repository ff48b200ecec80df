package tdsfit

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"testing"

	"thzdrive/optics"
	"thzdrive/pulse"
	"thzdrive/units"
)

// siliconTraces is a 164 ps measurement of 500 um of silicon with its
// echoes (8192 samples of 20 fs).
func siliconTraces(b *testing.B) (ref, sam pulse.Trace) {
	return synth(b, synthSpec{model: onePulse, stepS: 20 * units.Fs, n: 8192, startS: -15 * units.Ps,
		slab: optics.Slab{Medium: optics.Constant{N: 3.4175}, ThicknessM: 500 * units.Um}, noise: 1e-4, seed: 31})
}

func BenchmarkNewTransmission(b *testing.B) {
	ref, sam := siliconTraces(b)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := NewTransmission(ref, sam, TransmissionOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkExtractSlab(b *testing.B) {
	ref, sam := siliconTraces(b)
	tr, err := NewTransmission(ref, sam, TransmissionOptions{})
	if err != nil {
		b.Fatal(err)
	}
	for _, e := range []Echoes{NoEchoes, AllEchoes} {
		name := map[Echoes]string{NoEchoes: "first-pass", AllEchoes: "all-echoes"}[e]
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := ExtractSlab(tr, ExtractOptions{ThicknessM: 500 * units.Um, Echoes: e}); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(tr.Band.Len()), "bins")
		})
	}
}

// One echo in a 24 ps window (1200 samples): the branch search runs up to
// ten continuations.
func BenchmarkExtractSlabOneEcho(b *testing.B) {
	ref, sam := synth(b, synthSpec{model: onePulse, stepS: 20 * units.Fs, n: 1200, startS: -3 * units.Ps,
		slab: optics.Slab{Medium: optics.Constant{N: 3.4175}, ThicknessM: 500 * units.Um}, noise: 1e-4, seed: 31})
	tr, err := NewTransmission(ref, sam, TransmissionOptions{})
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := ExtractSlab(tr, ExtractOptions{ThicknessM: 500 * units.Um, Echoes: 1}); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(tr.Band.Len()), "bins")
}

func BenchmarkFitDielectric(b *testing.B) {
	var ref fitRef
	loadJSON(b, "fit_reference.json", &ref)
	eps := make([]complex128, len(ref.FreqHz))
	for i := range eps {
		eps[i] = complex(ref.EpsRe[i], ref.EpsIm[i])
	}
	init := dielectricFrom(ref.Initial)
	b.ReportAllocs()
	for b.Loop() {
		if _, err := FitDielectric(ref.FreqHz, eps, ref.Sigma, FitOptions{Initial: init}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkDeconvolve(b *testing.B) {
	d := catalogueDetector(b, "znte", 1*units.Mm, ZnTeGroupIndex800nm)
	tr := convolve(d, delayed(onePulse, 0, -10*units.Ps, 20*units.Fs, 4096, 0, nil))
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Deconvolve(tr, d, DeconvolveOptions{}); err != nil {
			b.Fatal(err)
		}
	}
}
