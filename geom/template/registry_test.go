package template

import (
	"bytes"
	"testing"

	"github.com/rimfield/rimfield/geom"
)

// Every registered template builds a scene that geom reads back, with its
// defaults and after a parameter changes; parameter names are unique and
// every usage text says something.
func TestEntries(t *testing.T) {
	entries := Entries()
	if len(entries) == 0 {
		t.Fatal("no templates registered")
	}
	for i, e := range entries {
		if i > 0 && entries[i-1].Name >= e.Name {
			t.Errorf("entries out of order: %s before %s", entries[i-1].Name, e.Name)
		}
		if got, ok := Lookup(e.Name); !ok || got.Name != e.Name {
			t.Errorf("Lookup(%q) = %v, %v", e.Name, got.Name, ok)
		}
		params, build := e.New()
		seen := map[string]bool{}
		for _, p := range params {
			if seen[p.Name] || p.Usage == "" {
				t.Errorf("%s: parameter %q repeated or without usage", e.Name, p.Name)
			}
			seen[p.Name] = true
		}
		def, err := build()
		if err != nil {
			t.Fatalf("%s with defaults: %v", e.Name, err)
		}
		if _, err := geom.Read(bytes.NewReader(def)); err != nil {
			t.Errorf("%s: %v", e.Name, err)
		}
		// The builder reads the parameters when called, not when made: the
		// first non-zero number made a tenth larger changes the scene.
		changed := ""
		for _, p := range params {
			if v, ok := p.Value.(*float64); ok && *v != 0 {
				*v *= 1.1
				changed = p.Name
				break
			}
		}
		if again, err := build(); changed == "" || err != nil || bytes.Equal(again, def) {
			t.Errorf("%s: --%s did not reach the builder (%v)", e.Name, changed, err)
		}
	}
}

func TestRegisterTwice(t *testing.T) {
	defer func() {
		if recover() == nil {
			t.Error("a second template of the same name was accepted")
		}
	}()
	register(Entry{Name: Entries()[0].Name})
}
