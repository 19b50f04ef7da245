package main

import (
	"fmt"
	"math"
	"reflect"

	"github.com/rimfield/rimfield/bem/job"
)

// buildResults gathers results.json for a solved task.
func buildResults(t *task) (*results, error) {
	sc, lay, sol, out := t.scene, t.mesh.Layout, t.sol(), t.out
	r := &results{resultsHead: resultsHead{
		Physics:    sc.Problem.Physics.String(),
		Panels:     len(t.mesh.Panels),
		UnitSystem: "SI",
		Scene:      t.scenePath,
		Unit:       sceneUnit(sc),
		Open:       lay.Open,
		Units:      t.words.Units,
		Solver:     solverInfo{Kind: out.Solver, ConditionEstimate: number(sol.Cond)},
	}, Section: out.Section, resultsTail: resultsTail{Version: version()}}
	if out.System != nil {
		r.Solver.Unknowns = out.System.Unknowns()
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
	r.Warnings = append(r.Warnings, lay.Warnings...)
	r.Warnings = append(r.Warnings, sol.Warnings...)
	r.Warnings = append(r.Warnings, out.Warnings...)
	r.Cautions = out.Cautions

	keys := nonFinite(reflect.ValueOf(r.resultsHead), "")
	if r.Section != nil {
		keys = append(keys, nonFinite(reflect.ValueOf(r.Section.Value), r.Section.Key)...)
	}
	for _, key := range keys {
		r.Warnings = append(r.Warnings, fmt.Sprintf("%s is not a finite number (written as null); refine the mesh near it or check the scene", key))
	}
	if r.Warnings == nil {
		r.Warnings = []string{}
	}
	if r.Cautions == nil {
		r.Cautions = []job.Caution{}
	}
	return r, nil
}
