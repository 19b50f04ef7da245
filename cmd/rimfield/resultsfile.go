package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"reflect"
	"strings"

	"github.com/rimfield/rimfield/bem/job"
)

// number is the float type of results.json: null when not finite.
type number = job.Number

// results is the content of results.json. The keys physics, panels,
// unit_system and boundaries are a contract read by other programs; the rest
// may grow. Every quantity is SI; the units of the physics-dependent ones
// are listed under "units". The job's section sits between the head and the
// tail, under its own key.
type results struct {
	resultsHead
	Section *job.Section
	resultsTail
}

// resultsHead holds the keys before the job's section.
type resultsHead struct {
	Physics    string     `json:"physics"`
	Panels     int        `json:"panels"`
	UnitSystem string     `json:"unit_system"`
	Boundaries []boundary `json:"boundaries"`

	Scene string `json:"scene"` // the scene file as given on the command line
	Unit  string `json:"unit"`  // the coordinate unit of the scene file
	Open  bool   `json:"open"`
	// PotentialAtInfinity is the potential far away, for open scenes only.
	PotentialAtInfinity *number       `json:"potential_at_infinity,omitempty"`
	Units               job.Units     `json:"units"`
	Regions             []regionInfo  `json:"regions"`
	Solver              solverInfo    `json:"solver"`
	Warnings            []string      `json:"warnings"`
	Cautions            []job.Caution `json:"cautions"`
}

// resultsTail holds the keys after the job's section.
type resultsTail struct {
	// FlowNet holds the flow net's numbers (images.go), when flux flows.
	FlowNet *flowNetInfo `json:"flow_net,omitempty"`
	// Files lists every file this run wrote into the output directory,
	// results.json included; the next run replaces or removes them.
	Files   []string `json:"files"`
	Version string   `json:"rimfield_version"`
}

// marshal writes results.json: the head's keys, the section's, the tail's,
// indented by two spaces, with a final newline.
func (r *results) marshal() ([]byte, error) {
	parts := []any{r.resultsHead}
	var keys []string
	if r.Section != nil && r.Section.Value != nil {
		parts = append(parts, r.Section.Value)
		keys = append(keys, r.Section.Key)
	}
	parts = append(parts, r.resultsTail)
	var b bytes.Buffer
	b.WriteByte('{')
	for i, p := range parts {
		data, err := json.Marshal(p)
		if err != nil {
			return nil, err
		}
		if i > 0 {
			b.WriteByte(',')
		}
		if i == 1 && len(keys) == 1 {
			k, _ := json.Marshal(keys[0])
			b.Write(k)
			b.WriteByte(':')
			b.Write(data)
			continue
		}
		// An object's members without its braces.
		b.Write(bytes.TrimSuffix(bytes.TrimPrefix(data, []byte("{")), []byte("}")))
	}
	b.WriteByte('}')
	var out bytes.Buffer
	if err := json.Indent(&out, b.Bytes(), "", "  "); err != nil {
		return nil, err
	}
	out.WriteByte('\n')
	return out.Bytes(), nil
}

// boundary is the result on one body or edge, all its pieces together.
type boundary struct {
	Name      string `json:"name"`
	Part      string `json:"part"`      // "body" or "edge"
	Condition string `json:"condition"` // "potential", "flux" or "floating"
	// Potential is the length-weighted mean potential (units.potential).
	Potential number `json:"potential"`
	// Inflow is the total flux into the domain per metre of cross-section
	// length (units.inflow), with the sign of the scene's flux condition.
	Inflow number `json:"inflow"`
	// Length is the length of the pieces that bound the domain, metres.
	Length number `json:"length"`
}

// regionInfo describes one region of the domain and its material.
type regionInfo struct {
	Name       string `json:"name"`
	Background bool   `json:"background"`
	// Kx and Ky are the conductivities along x and y, in the job's
	// units.conductivity.
	Kx number `json:"kx"`
	Ky number `json:"ky"`
}

type solverInfo struct {
	Kind string `json:"kind"` // "dense" or "fast": the solver that ran
	// ConditionEstimate is the estimated 1-norm condition number of the
	// scaled system (dense LU); 0 when the fast solver ran, which
	// estimates none.
	ConditionEstimate number `json:"condition_estimate"`
	Unknowns          int    `json:"unknowns"`
	// Iterations is the number of GMRES iterations of the solution shown
	// (0 for the dense solver).
	Iterations int `json:"iterations"`
	// Residual is its relative residual ||b - A x|| / ||b|| in the scaled
	// equations, computed from the solution.
	Residual number `json:"residual"`
	// Solves is the number of right-hand sides solved on the system (a
	// capacitance matrix needs one per conductor, a sweep one per angle).
	Solves int `json:"solves"`
	// Bytes is the memory the system held (matrices and factors, or trees,
	// near blocks and the Krylov basis).
	Bytes   int          `json:"bytes"`
	Timings solverTiming `json:"timings"`
}

// solverTiming is the wall-clock time of a solve's stages, in seconds.
type solverTiming struct {
	Prepare number `json:"prepare_s"` // read, lay out and mesh the scene
	Setup   number `json:"setup_s"`   // assemble and factorise, or build the fast solver's trees and preconditioner
	Solves  number `json:"solves_s"`  // every right-hand side on that system
	Solve   number `json:"solve_s"`   // the job's whole solve: setup, solves, refinement studies and analysis
	Outputs number `json:"outputs_s"` // sampling, pictures and files
	Total   number `json:"total_s"`
}

var numberType = reflect.TypeFor[number]()

// nonFinite returns the JSON keys ("boundaries[2].inflow") of the numbers
// in v that are NaN or infinite.
func nonFinite(v reflect.Value, path string) []string {
	switch v.Kind() {
	case reflect.Pointer, reflect.Interface:
		if v.IsNil() {
			return nil
		}
		return nonFinite(v.Elem(), path)
	case reflect.Struct:
		var out []string
		t := v.Type()
		for i := range t.NumField() {
			f := t.Field(i)
			if f.Anonymous {
				// An embedded struct's keys are promoted into this object.
				out = append(out, nonFinite(v.Field(i), path)...)
				continue
			}
			if !f.IsExported() {
				continue
			}
			name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
			if name == "-" {
				continue
			}
			if name == "" {
				name = f.Name
			}
			if path != "" {
				name = path + "." + name
			}
			out = append(out, nonFinite(v.Field(i), name)...)
		}
		return out
	case reflect.Slice, reflect.Array:
		var out []string
		for i := range v.Len() {
			out = append(out, nonFinite(v.Index(i), fmt.Sprintf("%s[%d]", path, i))...)
		}
		return out
	case reflect.Float64:
		if v.Type() == numberType {
			f := v.Float()
			if math.IsNaN(f) || math.IsInf(f, 0) {
				return []string{path}
			}
		}
	}
	return nil
}

// flowNetInfo is the flow net of results.json: with equipotentials at
// equal potential drops and flux lines at equal flux k dH the net is made of
// curvilinear squares, and q = k H channels/drops.
type flowNetInfo struct {
	Channels     number `json:"channels"`     // 1: inflow over the flux per channel k dH
	Drops        int    `json:"drops"`        // potential drops: --levels + 1
	ShapeFactor  number `json:"shape_factor"` // 1: channels/drops = inflow/(k H)
	Inflow       number `json:"inflow"`       // units.inflow: through fixed-potential and flux boundaries
	Head         number `json:"head"`         // units.potential: highest minus lowest boundary potential
	Conductivity number `json:"conductivity"` // units.conductivity: sqrt(kx ky) of the net's region
}
