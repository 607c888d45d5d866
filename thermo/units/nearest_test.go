package units

import "testing"

func TestOSADistance(t *testing.T) {
	// Distances worked by hand from the definition (Damerau 1964: one transposition is one edit).
	tests := []struct {
		a, b string
		want int
	}{
		{"", "", 0}, {"", "abc", 3}, {"abc", "", 3},
		{"psai", "psia", 1}, {"kitten", "sitting", 3}, {"ca", "abc", 3}, // OSA, not unrestricted (2)
		{"ab", "ba", 1}, {"°C", "°F", 1}, {"flaw", "lawn", 2},
	}
	var rows [3][]int
	for _, tt := range tests {
		if got := osaDistance([]rune(tt.a), []rune(tt.b), &rows); got != tt.want {
			t.Errorf("osaDistance(%q, %q) = %d, want %d", tt.a, tt.b, got, tt.want)
		}
	}
}

func TestNearest(t *testing.T) {
	names := []string{"feedwater", "FW_heater", "deaerator", "condenser", "hp_turbine", "lp_turbine"}
	tests := []struct {
		word, want string
		ok         bool
	}{
		{"feedwatr", "feedwater", true},
		{"FEEDWATER", "feedwater", true},
		{"deareator", "deaerator", true},
		{"lp_turbin", "lp_turbine", true},
		{"mp_turbine", "hp_turbine", true}, // tie with lp_turbine: earlier candidate wins
		{"boiler", "", false},
		{"x", "", false},
		{"", "", false},
	}
	for _, tt := range tests {
		got, ok := Nearest(tt.word, names)
		if got != tt.want || ok != tt.ok {
			t.Errorf("Nearest(%q) = %q, %v; want %q, %v", tt.word, got, ok, tt.want, tt.ok)
		}
	}
	if got, ok := Nearest("abc", nil); ok || got != "" {
		t.Errorf("Nearest with no candidates = %q, %v", got, ok)
	}
}
