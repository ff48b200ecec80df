package server

import (
	"strings"
	"testing"

	thzdrivev1 "thzdrive/api/thzdrive/v1"
	"thzdrive/caution"
)

// The wire enum mirrors the Go codes one to one (common practice for a
// stable API: a code's number and name never change). A code added on one
// side only fails here.
func TestCodesMatchWireEnum(t *testing.T) {
	for n := 0; ; n++ {
		c := caution.Code(n)
		name := c.String()
		wire, ok := thzdrivev1.CautionCode_name[int32(n)]
		if strings.HasPrefix(name, "Code(") {
			if ok {
				t.Errorf("wire code %d (%s) has no Go code", n, wire)
			}
			break
		}
		if !ok {
			t.Errorf("Go code %d (%s) has no wire code", n, name)
			continue
		}
		if want := "CAUTION_CODE_" + name; wire != want {
			t.Errorf("code %d: Go %s, wire %s", n, want, wire)
		}
	}
	if got, want := len(thzdrivev1.CautionCode_name), len(caution.Codes()); got != want {
		t.Errorf("%d wire codes, %d Go codes", got, want)
	}
}
