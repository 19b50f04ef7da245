package main

import (
	"encoding/json"
	"fmt"
	"math"
	"reflect"
	"strings"

	"github.com/rimfield/rimfield/geom"
)

// number is a float64 that JSON writes at full precision, and as null when it
// is NaN or infinite (JSON has no such numbers). finiteCheck turns every
// null into a warning naming the key.
type number float64

// MarshalJSON writes the shortest decimal that reads back as the same
// float64, or null.
func (n number) MarshalJSON() ([]byte, error) {
	f := float64(n)
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return []byte("null"), nil
	}
	return json.Marshal(f)
}

// results is the content of results.json. The keys physics, panels,
// unit_system and boundaries are a contract read by other programs; the rest
// may grow. Every quantity is SI; the units of the physics-dependent ones
// are listed under "units".
type results struct {
	Physics    string     `json:"physics"`
	Panels     int        `json:"panels"`
	UnitSystem string     `json:"unit_system"`
	Boundaries []boundary `json:"boundaries"`

	Scene string `json:"scene"` // the scene file as given on the command line
	Unit  string `json:"unit"`  // the coordinate unit of the scene file
	Open  bool   `json:"open"`
	// PotentialAtInfinity is the potential far away, for open scenes only.
	PotentialAtInfinity *number       `json:"potential_at_infinity,omitempty"`
	Units               quantityUnits `json:"units"`
	Regions             []regionInfo  `json:"regions"`
	Solver              solverInfo    `json:"solver"`
	Warnings            []string      `json:"warnings"`
	Cautions            []caution     `json:"cautions"`

	Electrostatic *electrostaticSection `json:"electrostatic,omitempty"`
	Seepage       *seepageSection       `json:"seepage,omitempty"`
	Flow          *flowSection          `json:"flow,omitempty"`
	// FlowNet holds the flow net's numbers (images.go), when flux flows.
	FlowNet *flowNetInfo `json:"flow_net,omitempty"`

	// Files lists every file this run wrote into the output directory,
	// results.json included; the next run replaces or removes them.
	Files   []string `json:"files"`
	Version string   `json:"rimfield_version"`
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
	// Kx and Ky are the conductivities along x and y (units.conductivity):
	// absolute permittivity in electrostatics, hydraulic conductivity in
	// seepage.
	Kx number `json:"kx"`
	Ky number `json:"ky"`
}

type solverInfo struct {
	Kind string `json:"kind"` // "dense"
	// ConditionEstimate is the estimated 1-norm condition number of the
	// scaled system.
	ConditionEstimate number `json:"condition_estimate"`
	Unknowns          int    `json:"unknowns"`
}

// caution is a limit of the model that applies to this scene; CAUTIONS.md
// explains each topic.
type caution struct {
	Topic string `json:"topic"` // "2d_idealisation", "singular_corners", ...
	Text  string `json:"text"`
	// Where lists points in metres the caution concerns, if any.
	Where []location `json:"where,omitempty"`
}

// location is a point in metres, with the boundary it lies on.
type location struct {
	X        number `json:"x"`
	Y        number `json:"y"`
	Boundary string `json:"boundary,omitempty"`
}

// electrostaticSection is filled by the electrostatic physics hook.
type electrostaticSection struct {
	Capacitance *capacitance `json:"capacitance,omitempty"`
	PeakField   *peakField   `json:"peak_field,omitempty"`
	// The keys of the hook's extras (electro.go) sit beside the contract's
	// in the same JSON object.
	*electroExtras
}

// capacitance is the Maxwell capacitance matrix per metre: entry (i, j) is
// the charge per metre on conductor i with 1 V on j and 0 V on the others.
type capacitance struct {
	Conductors []string   `json:"conductors"`
	Matrix     [][]number `json:"matrix"` // F/m
}

// peakField is the largest field strength on a conductor.
type peakField struct {
	Value    number `json:"value"` // V/m
	X        number `json:"x"`     // m
	Y        number `json:"y"`     // m
	Boundary string `json:"boundary"`
}

// seepageSection is filled by the seepage physics hook.
type seepageSection struct {
	Discharge    number        `json:"discharge"` // m^2/s per metre width
	ExitGradient *exitGradient `json:"exit_gradient,omitempty"`
	PipingSafety *number       `json:"piping_safety,omitempty"`
	Structures   []structure   `json:"structures"`
}

type exitGradient struct {
	Value number `json:"value"` // 1
	X     number `json:"x"`     // m
	Y     number `json:"y"`     // m
}

// structure is the uplift on one body.
type structure struct {
	Name        string `json:"name"`
	UpliftForce number `json:"uplift_force"` // kN/m
	UpliftX     number `json:"uplift_x"`     // m, line of action
}

// flowSection is filled by the flow physics hook.
type flowSection struct {
	LiftCoefficient   number `json:"lift_coefficient"`
	Circulation       number `json:"circulation"` // m^2/s
	MomentCoefficient number `json:"moment_coefficient"`
	ReferenceChord    number `json:"reference_chord"` // m
}

// physicsHook adds what one physics computes beyond potential and inflow:
// its section of results.json and its columns of boundary.csv. Physics
// adapters register one in an init function of their own file.
type physicsHook struct {
	// results fills the physics section of r (r.Electrostatic, ...).
	results func(j *job, r *results) error
	// columns returns extra boundary.csv columns, one value per panel.
	columns func(j *job) ([]csvColumn, error)
}

// physicsHooks holds the hook of each physics that has one.
var physicsHooks = map[geom.Physics]physicsHook{}

// pendingPhysics says what results.json lacks for a physics whose results
// hook is not written yet. A blocking entry means the plain potential
// solution would mislead, so solve refuses the scene instead.
var pendingPhysics = map[geom.Physics]struct {
	msg      string
	blocking bool
}{
	geom.Seepage: {msg: "the seepage section (discharge, exit gradient, uplift) is not computed by this version yet"},
	geom.Flow:    {msg: "flow scenes cannot be solved by this version yet: the uniform stream and the Kutta condition are not applied (rimfield check validates the scene)", blocking: true},
}

// unsupported returns an error when a physics cannot be solved yet.
func unsupported(p geom.Physics) error {
	if _, ok := physicsHooks[p]; ok {
		return nil
	}
	if pp, ok := pendingPhysics[p]; ok && pp.blocking {
		return fmt.Errorf("solve: %s", pp.msg)
	}
	return nil
}

// buildResults gathers results.json for a solved job.
func buildResults(j *job) (*results, error) {
	sc, lay, sol := j.scene, j.mesh.Layout, j.sol
	units := unitsOf(sc.Problem.Physics)
	r := &results{
		Physics:    sc.Problem.Physics.String(),
		Panels:     len(j.mesh.Panels),
		UnitSystem: "SI",
		Scene:      j.scenePath,
		Unit:       sceneUnit(sc),
		Open:       lay.Open,
		Units:      units,
		Solver: solverInfo{
			Kind:              j.solverKind,
			ConditionEstimate: number(sol.Cond),
			Unknowns:          j.unknowns,
		},
		Version: version(),
	}
	owners := sol.Owners()
	if len(owners) != len(lay.Owners) {
		return nil, fmt.Errorf("internal error: %d owner results for %d bodies and edges", len(owners), len(lay.Owners))
	}
	r.Boundaries = make([]boundary, len(owners))
	for i, o := range owners {
		r.Boundaries[i] = boundary{
			Name:      o.Name,
			Part:      lay.Owners[i].Part.String(),
			Condition: lay.Owners[i].Cond.Kind.String(),
			Potential: number(o.Potential),
			Inflow:    number(o.Inflow),
			Length:    number(o.Length),
		}
	}
	r.Regions = make([]regionInfo, len(lay.Regions))
	for i, d := range lay.Regions {
		r.Regions[i] = regionInfo{Name: d.Name, Background: d.Background, Kx: number(d.Material.Kx), Ky: number(d.Material.Ky)}
	}
	if lay.Open {
		v := number(math.NaN())
		for i, d := range lay.Regions {
			if d.Background && i < len(sol.Const) {
				v = number(sol.Const[i])
			}
		}
		r.PotentialAtInfinity = &v
	}

	r.Warnings = append(r.Warnings, sc.Warnings...)
	r.Warnings = append(r.Warnings, sol.Warnings...)
	r.Cautions = cautionsFor(sc, j.mesh)

	if h, ok := physicsHooks[sc.Problem.Physics]; ok && h.results != nil {
		if err := h.results(j, r); err != nil {
			return nil, err
		}
	} else if pp, ok := pendingPhysics[sc.Problem.Physics]; ok {
		r.Warnings = append(r.Warnings, pp.msg)
	}

	for _, key := range nonFinite(reflect.ValueOf(r), "") {
		r.Warnings = append(r.Warnings, fmt.Sprintf("%s is not a finite number (written as null); refine the mesh near it or check the scene", key))
	}
	if r.Warnings == nil {
		r.Warnings = []string{}
	}
	if r.Cautions == nil {
		r.Cautions = []caution{}
	}
	return r, nil
}

// sceneUnit returns the coordinate unit of the scene, "m" when not given.
func sceneUnit(sc *geom.Scene) string {
	if sc.Problem.Unit == "" {
		return "m"
	}
	return sc.Problem.Unit
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
