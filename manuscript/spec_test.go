package manuscript

import (
	"reflect"
	"strings"
	"testing"

	"gopkg.in/yaml.v3"
)

type FormerInner struct {
	Count *int `yaml:"count" formerly:"n, num"`
}

type formerOuter struct {
	FormerInner `yaml:",inline"`
	Name        string `yaml:"name"`
}

// TestFormerKeys: a key's former names (the formerly tag, through
// ",inline") are refused with an error at their line naming the current
// key; an unknown key still gets the list of valid keys.
func TestFormerKeys(t *testing.T) {
	if got := FormerKeys(reflect.TypeOf(&formerOuter{})); !reflect.DeepEqual(got, map[string]string{"n": "count", "num": "count"}) {
		t.Fatalf("FormerKeys = %v", got)
	}
	for _, c := range []struct{ src, want string }{
		{"name: a\nnum: 3\n", `line 2: the key "num" is now called "count"`},
		{"n: 3\n", `line 1: the key "n" is now called "count"`},
		{"nmae: a\n", `line 1: unknown key "nmae"`},
	} {
		var n yaml.Node
		if err := yaml.Unmarshal([]byte(c.src), &n); err != nil {
			t.Fatal(err)
		}
		err := CheckKeys(n.Content[0], &formerOuter{})
		if err == nil || !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("%q: error %v, want %q", c.src, err, c.want)
		}
	}
}
