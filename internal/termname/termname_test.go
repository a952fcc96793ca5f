package termname

import "testing"

func TestFromSuffix(t *testing.T) {
	for in, want := range map[string]string{
		"ect(-1)": "lag(ect,1)", "d.log(north)": "diff(log(north))", "d.x(-2)": "lag(diff(x),2)",
		"d.x(+1)": "lead(diff(x),1)", "y(-1)": "lag(y,1)", "log(fuel)": "log(fuel)", "const": "const",
	} {
		got, ok := FromSuffix(in)
		if got != want || ok != (got != in) {
			t.Errorf("%s: %q %v, want %q", in, got, ok, want)
		}
	}
}

func TestBalanced(t *testing.T) {
	for s, want := range map[string]bool{"": true, "x": true, "diff(x)": true, "lag(diff(x), 2)": true, "(": false, ")(": false, "a)": false, "((a)": false} {
		if got := Balanced(s); got != want {
			t.Errorf("Balanced(%q) = %v, want %v", s, got, want)
		}
	}
}
