package spec

import (
	"strings"
	"testing"
)

func TestParseAxis(t *testing.T) {
	tests := []struct {
		in      string
		want    Axis
		wantErr string
	}{
		{in: "kp=0:20", want: Axis{"kp", 0, 20}},
		{in: " KI = -1.5 : 2e1", want: Axis{"ki", -1.5, 20}},
		{in: "kp", wantErr: "expected name=min:max"},
		{in: "kp=3", wantErr: "expected a range"},
		{in: "kp=5:1", wantErr: "must be below"},
		{in: "kp=1:1", wantErr: "must be below"},
		{in: "kp=a:1", wantErr: "is not a number"},
		{in: "kp=0:inf", wantErr: "not a finite number"},
		{in: "kp=NaN:1", wantErr: "not a finite number"},
	}
	for _, tc := range tests {
		t.Run(tc.in, func(t *testing.T) {
			got, err := ParseAxis(tc.in)
			if tc.wantErr != "" {
				if err == nil || !strings.Contains(err.Error(), tc.wantErr) || !strings.Contains(err.Error(), tc.in) {
					t.Fatalf("error %v; want one quoting the input and containing %q", err, tc.wantErr)
				}
				return
			}
			if err != nil || got != tc.want {
				t.Fatalf("got %+v, %v; want %+v", got, err, tc.want)
			}
		})
	}
}

func TestParseValues(t *testing.T) {
	got, err := ParseValues("kd=0.5, tau=0")
	if err != nil || len(got) != 2 || got[0] != (Value{"kd", 0.5}) || got[1] != (Value{"tau", 0}) {
		t.Fatalf("got %v, %v", got, err)
	}
	for _, bad := range []string{"", "kd", "kd=x", "kd=1,kd=2", "=3"} {
		if _, err := ParseValues(bad); err == nil {
			t.Errorf("%q: no error", bad)
		}
	}
}

func TestParseGrid(t *testing.T) {
	tests := []struct {
		in     string
		nx, ny int
		ok     bool
	}{
		{"400x300", 400, 300, true},
		{"50", 50, 50, true},
		{"2X2", 2, 2, true},
		{"1x10", 0, 0, false},
		{"10x4001", 0, 0, false},
		{"ax3", 0, 0, false},
	}
	for _, tc := range tests {
		nx, ny, err := ParseGrid(tc.in)
		if (err == nil) != tc.ok || nx != tc.nx || ny != tc.ny {
			t.Errorf("%q: got %d %d %v", tc.in, nx, ny, err)
		}
	}
}
