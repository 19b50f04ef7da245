package main

import "github.com/rimfield/rimfield/geom"

// quantityUnits names the SI units of the solved quantities for one physics,
// both for people (results.json "units", the check summary) and for CSV
// column names, where "/" and "^" are spelt "_per_" and a digit.
type quantityUnits struct {
	Potential     string `json:"potential"`      // the potential u
	InflowDensity string `json:"inflow_density"` // k du/dn, per metre of boundary
	Inflow        string `json:"inflow"`         // inflow per metre of length of the cross-section
	Conductivity  string `json:"conductivity"`   // k of a region
	Length        string `json:"length"`

	potentialCol string // CSV spelling of Potential ("" when it has no unit)
	densityCol   string // CSV spelling of InflowDensity
}

// unitsOf returns the units of the quantities for a physics.
//
// Laplace is dimensionless: u and k have no unit, so k du/dn is per metre
// and its integral along the boundary has no unit. Flow works with a
// velocity potential or stream function in m^2/s whose normal derivative is
// a velocity.
func unitsOf(p geom.Physics) quantityUnits {
	switch p {
	case geom.Electrostatic:
		return quantityUnits{"V", "C/m^2", "C/m", "F/m", "m", "V", "C_per_m2"}
	case geom.Seepage:
		return quantityUnits{"m", "m/s", "m^2/s", "m/s", "m", "m", "m_per_s"}
	case geom.Flow:
		return quantityUnits{"m^2/s", "m/s", "m^2/s", "1", "m", "m2_per_s", "m_per_s"}
	}
	return quantityUnits{"1", "1/m", "1", "1", "m", "", "per_m"}
}

// csvHeader joins a quantity and its CSV unit: "potential_V", or "potential"
// for a quantity without a unit.
func csvHeader(quantity, unit string) string {
	if unit == "" {
		return quantity
	}
	return quantity + "_" + unit
}
