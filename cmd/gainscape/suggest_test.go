package main

import "testing"

func TestEditDistance(t *testing.T) {
	tests := []struct {
		a, b string
		want int
	}{
		{"", "", 0},
		{"map", "map", 0},
		{"", "map", 3},
		{"mpa", "map", 1},     // neighbouring letters swapped
		{"prob", "probe", 1},  // one letter missing
		{"plnat", "plant", 1}, // swapped
		{"kitten", "sitting", 3},
		{"ca", "abc", 3}, // the alignment distance, not the unrestricted one (2)
	}
	for _, tt := range tests {
		if got := editDistance(tt.a, tt.b); got != tt.want {
			t.Errorf("editDistance(%q, %q) = %d, want %d", tt.a, tt.b, got, tt.want)
		}
	}
}

func TestSuggest(t *testing.T) {
	flags := []string{"plant", "ctrl", "grid", "set", "sample", "scenario"}
	tests := []struct {
		word       string
		candidates []string
		want       string
	}{
		{"mpa", commands, `; did you mean "map"?`},
		{"prob", commands, `; did you mean "probe"?`},
		{"compaer", commands, `; did you mean "compare"?`},
		{"xyz", commands, ""},
		{"--plnt", flags, "; did you mean --plant?"},
		{"--smaple", flags, "; did you mean --sample?"},
		{"--zzzzzz", flags, ""},
	}
	for _, tt := range tests {
		if got := suggest(tt.word, tt.candidates); got != tt.want {
			t.Errorf("suggest(%q) = %q, want %q", tt.word, got, tt.want)
		}
	}
}
