package job

import (
	"github.com/rimfield/rimfield/bem"
	"github.com/rimfield/rimfield/bem/draw"
	"github.com/rimfield/rimfield/bem/grid"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
	"gonum.org/v1/gonum/spatial/r2"
)

// Job is one physics: everything the command line needs to check, solve
// and write a scene of it. A Job value holds the values of its Options; a
// new one comes from the constructor in the command line's table.
type Job interface {
	// Words are the trade's names and the units of this physics.
	Words() *Words
	// Options are the job's own flags, bound to fields of the Job.
	Options() []Option
	// Check describes a meshed scene without solving it.
	Check(s *Setup) (*Checked, error)
	// Solve solves the scene and gathers its results.
	Solve(s *Setup) (*Outcome, error)
}

// Setup is a meshed scene ready to solve.
type Setup struct {
	Scene *geom.Scene
	Mesh  *mesh.Mesh // Mesh.Layout is the scene's layout
	// MeshOptions are the options Mesh was built with; refinement studies
	// start from them.
	MeshOptions mesh.Options
	// Settings for assembly (progress, workers); nil: defaults.
	Settings *bem.Settings
}

// Option is one flag of a job. Value points at the field that holds it,
// with its default already in place: a *bool, *int, *float64 or *string.
type Option struct {
	Name  string // without dashes: "air-breakdown"
	Usage string // what it does, with its unit
	Value any
}

// Checked is what a job adds to the summary of a meshed scene.
type Checked struct {
	// Lines are extra lines of the summary ("ground plane y = 0 m at 0 V").
	Lines []string
	// Cautions are the limits of the model that apply to the scene,
	// CommonCautions included.
	Cautions []Caution
	// Refusal, when not nil, is why Solve would refuse the scene.
	Refusal error
}

// Outcome is a solved scene with everything the writers of results need.
type Outcome struct {
	// System is the factorised system of Solution (nil when the job has
	// none to offer).
	System *bem.System
	// Solution is the solution that results.json, boundary.csv and the
	// pictures show.
	Solution *bem.Solution
	// Solver names the method that ran ("dense").
	Solver string
	// Section is the job's section of results.json; nil for none.
	Section *Section
	// Warnings are the job's concerns, one sentence each; they also go
	// into the top-level list of results.json.
	Warnings []string
	// Cautions are the limits of the model that apply to the scene,
	// CommonCautions included.
	Cautions []Caution
	// Columns are extra columns of boundary.csv, one value per panel.
	Columns []Column
	// Headline is the scene's main result for titles, without the scene's
	// name: "C = 97.04 pF/m between "pin" and "bore"" ("" for none).
	Headline string
	// Lines follow the headline in the pictures and the report.
	Lines []string
	// Results is the heading of the report's part for Tables
	// ("Electrostatic results").
	Results string
	// Tables are the job's parts of the report, in order.
	Tables []Table
	// Regions, when not nil, replaces the report's generic table of the
	// regions and their conductivities.
	Regions *Table
	// Charts are added to boundary.png below the potential and the inflow
	// density, with arc lengths in metres (the writer scales them).
	Charts []*draw.Chart
	// Peak, when not nil, is the surface peak of |grad u| that field.png
	// marks instead of the largest value on its sampling grid.
	Peak *Mark
	// Marks are more points that both maps show (stagnation points, exit
	// points), with their text.
	Marks []Mark
	// Levels, when not nil, chooses the contour levels from the range of
	// the sampled potential (lo, hi) and the count asked for (--levels);
	// nil means k levels evenly spaced between the lowest and highest
	// potential on the boundary.
	Levels func(lo, hi float64, k int) []float64
	// FluxLines, when not nil, draws the lines over the potential map
	// instead of the flow net traced from the sources: given the window and
	// the number of equipotentials asked for, it returns the lines in
	// metres (a flow's velocity equipotentials, seeded where the stream
	// enters the window). No flow net is counted then.
	FluxLines func(w grid.Window, k int) [][]r2.Vec
	// Window, when not nil, is the area the pictures and contours cover by
	// default (--window overrides it): the job's view of what matters (the
	// structures of a long seepage section and the soil around them).
	Window *grid.Window
	// Overlays are named lines drawn over both maps (water levels above
	// the beds), and Extent points the pictures' default window must take
	// in (the water levels above a section).
	Overlays []draw.Overlay
	Extent   []r2.Vec
	// Plots are pictures of the job's own (a chart against something else
	// than the arc length), each written as NAME.png (and .svg).
	Plots []Plot
	// Files are more files of the job's own (a sweep's table), written
	// into the output directory as they are.
	Files []File
}

// Plot is one picture of a job's own: charts drawn one above the other.
type Plot struct {
	Name    string // file name without extension: "pressure"
	Caption string // what it shows, for the report
	Charts  draw.Charts
}

// File is a file of a job's own: its name in the output directory and its
// content.
type File struct {
	Name string // "sweep.csv"
	Data []byte
}

// Section is the job's part of results.json: Value (a struct with JSON
// tags whose floats are Number) under the key Key ("electrostatic").
type Section struct {
	Key   string
	Value any
}

// Column is one column of boundary.csv: a header with its unit
// ("field_V_per_m") and one value per panel, a number (Values) or, when
// Text is not nil, a word (Text: "upper", "lower").
type Column struct {
	Header string
	Values []float64
	Text   []string
}

// Mark is a point to show on the maps.
type Mark struct {
	At       r2.Vec  // metres
	Value    float64 // the value marked, in Unit
	Unit     string
	Boundary string // the boundary it lies on, if any
	// Text labels the mark on the map ("peak 2.318 kV/mm"), Title names it
	// in the map's title ("exit gradient 0.9021 on "downstream bed"");
	// "" for the defaults "peak <value>" and "peak <value> on <boundary>".
	Text, Title string
	// Caption says what the mark is, for the report's picture caption.
	Caption string
}

// Table is one part of the report: a title, a header row (with units) and
// rows of cells, already formatted for people.
type Table struct {
	Title string
	// Head holds the column headers; with Head empty the rows are pairs of
	// a name and a value.
	Head []string
	Rows [][]string
	// Num marks the columns that hold numbers (right-aligned).
	Num []bool
	// Alarm is a cell text to highlight ("EXCEEDED"); "" for none.
	Alarm string
	// Notes are small print below the table; Warnings are highlighted
	// below it.
	Notes, Warnings []string
}

// Caution is a limit of the model that applies to a scene; CAUTIONS.md
// explains each topic.
type Caution struct {
	Topic string `json:"topic"` // "2d_idealisation", "singular_corners", ...
	Text  string `json:"text"`
	// Where lists the points, in metres, the caution concerns, if any.
	Where []Location `json:"where,omitempty"`
}

// Location is a point in metres, with the boundary it lies on and, at a
// singular corner, the exponent the field grows with (r^exponent).
type Location struct {
	X        Number  `json:"x"`
	Y        Number  `json:"y"`
	Boundary string  `json:"boundary,omitempty"`
	Exponent *Number `json:"exponent,omitempty"`
}

// Units names the SI units of the solved quantities of a physics, for
// people (results.json "units", summaries) and for CSV column names, where
// "/" and "^" are spelt "_per_" and a digit.
type Units struct {
	Potential     string `json:"potential"`      // the potential u
	InflowDensity string `json:"inflow_density"` // k du/dn, per metre of boundary
	Inflow        string `json:"inflow"`         // inflow per metre of length of the cross-section
	Conductivity  string `json:"conductivity"`   // k of a region
	Length        string `json:"length"`

	PotentialCSV string `json:"-"` // CSV spelling of Potential ("" when it has no unit)
	DensityCSV   string `json:"-"` // CSV spelling of InflowDensity
}

// Words are the names a trade gives the shared parts of the outputs. Each
// string is lower case, as it reads within a sentence.
type Words struct {
	Units Units
	// Potential names u ("potential", "total head").
	Potential string
	// Field names |grad u| and FieldUnit gives its SI unit ("field
	// strength |E|", "V/m"; "hydraulic gradient |i|", "1").
	Field, FieldUnit string
	// Inflow names a boundary's total inflow ("charge", "inflow"), and
	// InflowDensity the inflow density along it ("surface charge density").
	Inflow, InflowDensity string
	// InflowNote explains the inflow column of the report's table of
	// boundaries, a sentence.
	InflowNote string
	// Conductivity names the material's k ("permittivity ε").
	Conductivity string
	// Material describes a region's material with its unit, for summaries.
	Material func(geom.Material) string
	// Condition describes a boundary condition with its unit, for summaries.
	Condition func(geom.Condition) string
	// Net names the flow net ("flow net", "field plot"; "" when the lines
	// form none worth counting), FluxLines its
	// lines of flux ("flow lines", "field lines"), Channels the tubes
	// between them ("flow channels", "flux tubes"), Drops the steps between
	// equipotentials ("equipotential drops") and ShapeFactor what the
	// ratio of channels to drops equals ("q/(k H)", "C/ε").
	Net, FluxLines, Channels, Drops, ShapeFactor string
	// Ground labels a grounded plane on the maps ("ground plane, 0 V").
	Ground string
	// Contours names the contours of the potential ("streamlines" for a
	// stream function); "" means "equipotentials".
	Contours string
	// Unoriented is true when the flux lines have no direction worth an
	// arrow (the equipotentials of a flow, drawn over its stream function).
	// With Net empty no flow net is counted (results.json has no flow_net).
	Unoriented bool
	// ContoursOnField draws the contours over the map of |grad u| too (a
	// flow's streamlines over its speed).
	ContoursOnField bool
}

// ContourName returns Contours, or "equipotentials".
func (w *Words) ContourName() string {
	if w.Contours == "" {
		return "equipotentials"
	}
	return w.Contours
}
