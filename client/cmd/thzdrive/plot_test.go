package main

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"image"
	"image/png"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// checkFigure opens dir/name.png and .svg: the PNG must decode at the
// figure size and not be a blank canvas, and the SVG must carry the axis
// labels (with the trade's units) the figure promises.
func checkFigure(t *testing.T, dir, name string, labels ...string) {
	t.Helper()
	f, err := os.Open(filepath.Join(dir, name+".png"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	img, err := png.Decode(f)
	if err != nil {
		t.Fatalf("%s.png: %v", name, err)
	}
	b := img.Bounds()
	// 16 cm × 10 cm at gonum/plot's default 96 dpi: 605 × 378 pixels.
	if b.Dx() < 500 || b.Dy() < 300 {
		t.Errorf("%s.png is %d×%d pixels, smaller than the figure size", name, b.Dx(), b.Dy())
	}
	if distinctColours(img) < 3 {
		t.Errorf("%s.png looks blank", name)
	}
	svg, err := os.ReadFile(filepath.Join(dir, name+".svg"))
	if err != nil {
		t.Fatal(err)
	}
	for _, l := range labels {
		if !strings.Contains(string(svg), l) {
			t.Errorf("%s.svg lacks the label %q", name, l)
		}
	}
}

func distinctColours(img image.Image) int {
	seen := map[[4]uint32]bool{}
	b := img.Bounds()
	for y := b.Min.Y; y < b.Max.Y; y += 3 {
		for x := b.Min.X; x < b.Max.X; x += 3 {
			r, g, bl, a := img.At(x, y).RGBA()
			seen[[4]uint32{r, g, bl, a}] = true
		}
	}
	return len(seen)
}

func TestPlanPlots(t *testing.T) {
	dir := t.TempDir()
	code, _, stderr := runCLI(t, "demo", "--plot", dir)
	if code != 0 {
		t.Fatalf("demo --plot exited %d: %s", code, stderr)
	}
	checkFigure(t, dir, "field", "time (ps)", "field (kV/cm)")
	checkFigure(t, dir, "spectrum", "frequency (THz)", "kV/cm per THz", "mode 2 THz")
	checkFigure(t, dir, "transmission", "frequency (THz)")
	checkFigure(t, dir, "mode", "time (ps)", "Q (")
}

func TestSweepPlots(t *testing.T) {
	dir := t.TempDir()
	code, _, stderr := runCLI(t, "sweep", "--plot", dir, "--csv", filepath.Join(dir, "map.csv"),
		"--axis", "calibration.pulse_energy_uj=0.5:2:3", "--axis", "heating.base_temperature_k=5,10", demoFile(t))
	if code != 0 {
		t.Fatalf("sweep --plot exited %d: %s", code, stderr)
	}
	checkFigure(t, dir, "sweep-max_q", "pulse_energy_uj", "base_temperature_k")
	checkFigure(t, dir, "sweep-peak_temperature", "peak temperature (K)")
}
