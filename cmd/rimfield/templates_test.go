package main

import (
	"math"
	"path/filepath"
	"strings"
	"testing"

	"github.com/rimfield/rimfield/geom"
)

// Each registered template, written with rimfield new and solved with
// rimfield solve, gives the capacitance of its closed form (sources in the
// comments of geom/template's tests; values in REFERENCES.md): the wiring
// from flags to scene to results. 128 vertices per circle keep the test
// quick; a 128-gon's logarithmic capacity is 2e-4 below the circle's, so the
// tolerance is 1e-3 as for the default mesh.
func TestNewTemplatesSolve(t *testing.T) {
	cases := []struct {
		args []string
		// want is C11/eps0 of the Maxwell matrix.
		want float64
	}{
		// Eccentric coaxial a=1, b=3, d=1 in air: 6.528503.
		{[]string{"coaxial", "--inner", "1", "--outer", "3", "--offset", "1", "--permittivity", "1"}, 6.528503},
		// Two wires a=1, D=4: pi / acosh(2) = 2.385492, in cm.
		{[]string{"two-wire", "--radius", "1", "--spacing", "4", "--unit", "cm"}, 2.385492},
		// Wire a=1 at h=2 over ground, eps_r 2: 2 x 4.770984.
		{[]string{"wire-over-ground", "--radius", "1", "--height", "2", "--permittivity", "2"}, 2 * 4.770984},
		// Shielded pair a=0.05, s=1, R=3, eps_r 2, thin-wire images
		// (see geom/template): C11 = p11 / (p11^2 - p12^2).
		{[]string{"shielded-pair", "--radius", "0.05", "--spacing", "2", "--shield", "3", "--permittivity", "2"}, func() float64 {
			p11 := math.Log((9-1)/(0.05*3)) / (2 * math.Pi * 2)
			p12 := math.Log((9+1)/(2*3.0)) / (2 * math.Pi * 2)
			return p11 / (p11*p11 - p12*p12)
		}()},
	}
	for _, c := range cases {
		t.Run(c.args[0], func(t *testing.T) {
			dir := t.TempDir()
			scene := filepath.Join(dir, "scene.geojson")
			args := append(append([]string{"new"}, c.args...), "--sides", "128", "-o", scene)
			if _, _, err := runArgs(t, args...); err != nil {
				t.Fatal(err)
			}
			out := filepath.Join(dir, "out")
			if _, _, err := runArgs(t, "solve", scene, "-o", out, "--quiet", "--no-images"); err != nil {
				t.Fatal(err)
			}
			r := readJSON(t, filepath.Join(out, "results.json"))
			got := num(t, r, "electrostatic", "capacitance", "matrix", 0, 0) / geom.Eps0
			if math.Abs(got-c.want) > 1e-3*c.want {
				t.Errorf("C11/eps0 = %.6f, want %.6f", got, c.want)
			}
		})
	}
}

// A bad flag value is a usage error naming the flag.
func TestNewTemplateErrors(t *testing.T) {
	for _, c := range []struct {
		args []string
		want []string
	}{
		{[]string{"new", "coaxial", "--inner", "5"}, []string{"new coaxial", "--outer", "reaches the shield"}},
		{[]string{"new", "two-wire", "--radius", "-1"}, []string{"new two-wire", "--radius", "positive length in mm"}},
		{[]string{"new", "wire-over-ground", "--unit", "furlong"}, []string{"--unit", "furlong"}},
		{[]string{"new", "shielded-pair", "--sides", "4"}, []string{"--sides", "at least 16"}},
	} {
		_, _, err := runArgs(t, c.args...)
		wantUsageError(t, err, c.want...)
	}
	out, _, err := runArgs(t, "new", "shielded-pair", "--help")
	for _, w := range []string{"--spacing", "--shield", "in --unit", "volts"} {
		if err != nil || !strings.Contains(out, w) {
			t.Errorf("help lacks %q: %v\n%s", w, err, out)
		}
	}
}
