package main

// This file checks behaviour (formats, limits, protocol, timing, no panic)
// or provides helpers; it holds no physics check value that would need a
// source.

import (
	"bytes"
	"strings"
	"testing"
	"unicode/utf8"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
)

func TestReportAlignment(t *testing.T) {
	r := &report{title: "t"}
	s := r.section("A")
	s.add("peak |E|", 1273.4, "kV/cm")
	s.add("a much longer label", 0.0322, "")
	s.add("max |Q|", 0.1296, "Å·sqrt(amu)")
	s = r.section("B")
	s.add("x", 16.24, "K")
	s.text("solved by", "exact")
	var b bytes.Buffer
	r.print(&b)
	out := b.String()

	tests := []struct {
		label, value, unit string
	}{
		{"peak |E|", "1273", "kV/cm"},
		{"a much longer label", "0.0322", ""},
		{"max |Q|", "0.1296", "Å·sqrt(amu)"},
		{"x", "16.24", "K"},
		{"solved by", "exact", ""},
	}
	valueEnd, unitStart := -1, -1
	for _, tc := range tests {
		var line string
		for _, l := range strings.Split(out, "\n") {
			if strings.HasPrefix(l, "  "+tc.label+" ") {
				line = l
			}
		}
		if line == "" {
			t.Fatalf("no row %q in\n%s", tc.label, out)
		}
		// Numbers end in one column (right-aligned) ...
		i := strings.Index(line, " "+tc.value)
		if i < 0 {
			t.Fatalf("row %q lacks %q: %q", tc.label, tc.value, line)
		}
		end := utf8.RuneCountInString(line[:i+1+len(tc.value)])
		if valueEnd < 0 {
			valueEnd = end
		} else if end != valueEnd {
			t.Errorf("row %q: value ends at column %d, others at %d\n%s", tc.label, end, valueEnd, out)
		}
		// ... and units start one column after it (left-aligned).
		if tc.unit != "" {
			u := utf8.RuneCountInString(line[:strings.Index(line, tc.unit)])
			if unitStart < 0 {
				unitStart = u
			} else if u != unitStart {
				t.Errorf("row %q: unit starts at column %d, others at %d", tc.label, u, unitStart)
			}
		}
	}
	if !strings.Contains(out, "Cautions: none") || !strings.HasSuffix(strings.TrimSpace(out), strings.TrimSpace(safetyLine)) {
		t.Errorf("report must end with the cautions and the safety line:\n%s", out)
	}
}

func TestReportStagedCautions(t *testing.T) {
	r := &report{title: "t", cautions: []*thzdrivev1.Caution{
		{Code: thzdrivev1.CautionCode_CAUTION_CODE_RESTSTRAHLEN, Message: "screened", Stage: "optics"},
		{Code: thzdrivev1.CautionCode_CAUTION_CODE_HEATING_LARGE, Message: "warm", Stage: "heating"},
		{Code: thzdrivev1.CautionCode_CAUTION_CODE_DC_OFFSET, Message: "offset", Stage: "elsewhere"},
	}}
	s := r.section("Optics")
	s.stages = []string{"optics"}
	s.add("a", 1, "")
	s = r.section("Heating")
	s.stages = []string{"heating"}
	s.add("b", 2, "")
	var b bytes.Buffer
	r.print(&b)
	out := b.String()
	iOptics, iRest, iHeat := strings.Index(out, "Optics"), strings.Index(out, "[optics] RESTSTRAHLEN"), strings.Index(out, "Heating")
	if iOptics < 0 || iRest < iOptics || iHeat < iRest {
		t.Errorf("the optics caution should sit under its section:\n%s", out)
	}
	if strings.Count(out, "RESTSTRAHLEN") != 1 {
		t.Errorf("a caution shown under its stage is not repeated:\n%s", out)
	}
	if !strings.Contains(out, "Cautions (1):") || !strings.Contains(out, "[elsewhere] DC_OFFSET") {
		t.Errorf("cautions of no section are listed at the end:\n%s", out)
	}
}

func TestWrap(t *testing.T) {
	long := strings.Repeat("word ", 40)
	for _, line := range strings.Split(wrap(long, 30, "    "), "\n") {
		if n := utf8.RuneCountInString(line); n > 30 {
			t.Errorf("line of %d runes: %q", n, line)
		}
	}
	if got := wrap("short", 30, "  "); got != "short" {
		t.Errorf("wrap(short) = %q", got)
	}
}
