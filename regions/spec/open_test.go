package spec

import (
	"strings"
	"testing"
)

func TestParseAxisOrName(t *testing.T) {
	tests := []struct {
		name, in string
		want     Axis
		ranged   bool
		wantErr  string
	}{
		{name: "range", in: "kp=0:20", want: Axis{"kp", 0, 20}, ranged: true},
		{name: "bare name", in: " KI ", want: Axis{Param: "ki"}},
		{name: "name with digit", in: "z1", want: Axis{Param: "z1"}},
		{name: "bad range", in: "kp=5:1", wantErr: "must be below"},
		{name: "empty", in: "", wantErr: "expected a parameter name"},
		{name: "digit first", in: "1kp", wantErr: "expected a parameter name"},
		{name: "colon without name", in: "0:5", wantErr: "expected a parameter name"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, ranged, err := ParseAxisOrName(tc.in)
			if tc.wantErr != "" {
				if err == nil || !strings.Contains(err.Error(), tc.wantErr) {
					t.Fatalf("error %v; want one containing %q", err, tc.wantErr)
				}
				return
			}
			if err != nil || got != tc.want || ranged != tc.ranged {
				t.Fatalf("got %+v, %v, %v; want %+v, %v", got, ranged, err, tc.want, tc.ranged)
			}
		})
	}
}
