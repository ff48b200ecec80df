package pulse

import (
	"fmt"
	"math"
	"math/cmplx"
	"testing"

	"github.com/mjibson/go-dsp/fft"
	"gonum.org/v1/gonum/dsp/fourier"
)

// The FFT was chosen by measurement among the Go libraries at hand: gonum's
// dsp/fourier, go-dsp's fft, and our own half-length transform
// (Transform). BenchmarkFFTChoice times the three on the same real input;
// the README's performance section records the ratios. Before timing them
// the test below checks that they compute the same thing (go-dsp serving as
// an independent library source for the check), so the
// comparison is of equals: go-dsp's e^{-2πi kn/N} forward transform of real
// data is the complex conjugate of ours, up to the factor dt (physics.md §1).

func fftInput(n int) []float64 {
	x := make([]float64, n)
	for i := range x {
		t := float64(i-n/3) / 37
		x[i] = t*math.Exp(-t*t/2) + 0.01*math.Sin(float64(i)*0.7)
	}
	return x
}

func TestTransformMatchesGoDSP(t *testing.T) {
	const step = 1e-14
	for _, n := range []int{1024, 4096, 5000, 4099} {
		x := fftInput(n)
		tr := NewTransform(n)
		ours := tr.Forward(nil, x, step)
		ref := fft.FFTReal(x)
		peak := 0.0
		for _, c := range ref {
			peak = math.Max(peak, cmplx.Abs(c))
		}
		for k := range ours {
			want := complex(step, 0) * cmplx.Conj(ref[k])
			if d := cmplx.Abs(ours[k] - want); d > 1e-9*peak*step {
				t.Fatalf("n=%d bin %d: %v, go-dsp gives %v (|diff| %.3g of the peak)", n, k, ours[k], want, d/(peak*step))
			}
		}
	}
}

func BenchmarkFFTChoice(b *testing.B) {
	for _, n := range []int{1024, 4096, 5000, 65536} {
		x := fftInput(n)
		b.Run(fmt.Sprintf("ours/n=%d", n), func(b *testing.B) {
			tr := NewTransform(n)
			dst := make([]complex128, tr.Bins())
			b.ReportAllocs()
			for b.Loop() {
				tr.Forward(dst, x, 1)
			}
		})
		b.Run(fmt.Sprintf("gonum/n=%d", n), func(b *testing.B) {
			plan := fourier.NewFFT(n)
			dst := make([]complex128, n/2+1)
			b.ReportAllocs()
			for b.Loop() {
				plan.Coefficients(dst, x)
			}
		})
		b.Run(fmt.Sprintf("godsp/n=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				fft.FFTReal(x)
			}
		})
	}
}
