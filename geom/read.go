package geom

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"regexp"
	"sort"
	"strconv"
	"strings"

	"github.com/paulmach/orb"
	"github.com/paulmach/orb/geojson"
	"gonum.org/v1/gonum/spatial/r2"
)

// Limits and tolerances of the reader.
const (
	// readMaxCoord is the largest |x| or |y| accepted, in metres: anything
	// farther from the origin is a wrong unit or a map grid, not a section.
	readMaxCoord = 1e7
	// readCoincident is the coincidence tolerance relative to the scene's
	// bounding-box diagonal (Contract 1 of the design).
	readCoincident = CoincidenceTol
)

// readUnits maps the coordinate units of Contract 1 to metres per unit. The
// inch and the foot are exact by definition: 1 in = 0.0254 m, 1 ft =
// 0.3048 m (NIST Special Publication 811, 2008 edition, Appendix B.8).
var readUnits = map[string]float64{
	"m":  1,
	"cm": 0.01,
	"mm": 0.001,
	"um": 1e-6,
	"km": 1000,
	"in": 0.0254,
	"ft": 0.3048,
}

// readUnitAlias maps spellings of the units to the name a scene file uses.
var readUnitAlias = map[string]string{
	"m": "m", "meter": "m", "metre": "m", "meters": "m", "metres": "m",
	"cm": "cm", "centimeter": "cm", "centimetre": "cm", "centimeters": "cm", "centimetres": "cm",
	"mm": "mm", "millimeter": "mm", "millimetre": "mm", "millimeters": "mm", "millimetres": "mm",
	"um": "um", "micron": "um", "microns": "um", "micrometer": "um", "micrometre": "um", "micrometers": "um", "micrometres": "um",
	"km": "km", "kilometer": "km", "kilometre": "km", "kilometers": "km", "kilometres": "km",
	"in": "in", "inch": "in", "inches": "in", `"`: "in",
	"ft": "ft", "foot": "ft", "feet": "ft", "'": "ft",
}

// readUnitList is the allowed units in the order error messages list them.
const readUnitList = `"m", "cm", "mm", "um", "km", "in" or "ft"`

// Keys of the scene file.
var (
	readPropertyKeys = []string{"part", "name", "potential", "flux", "floating", "net_inflow",
		"k", "kx", "ky", "permittivity", "breakdown_field", "kutta"}
	readProblemKeys = []string{"physics", "unit", "open", "background_permittivity",
		"background_k", "unit_weight_water", "critical_gradient", "stream", "chord", "density", "ground"}
	readPhysicsNames = []string{"laplace", "electrostatic", "seepage", "flow"}
	readPartNames    = []string{"body", "region", "edge"}
	readGeomTypes    = []string{"Point", "MultiPoint", "LineString", "MultiLineString",
		"Polygon", "MultiPolygon", "GeometryCollection"}
)

// Read reads a scene file (Contract 1 of the design: a GeoJSON
// FeatureCollection with a "problem" member), validates it and returns the
// scene in SI units: coordinates in metres, outer rings counter-clockwise and
// holes clockwise, materials as conductivity tensors, defaults filled in.
//
// Bad input gives an *Error naming the feature, the member and the fix; only
// the first problem found is reported. Unknown property keys are not errors
// (GIS tools add their own) but a sentence each in Scene.Warnings, except
// near misses of a known key ("potental"), which are errors.
//
// Read checks each feature on its own (geometry types, closed and simple
// rings, holes inside their outer ring, conditions and materials) and the
// scene as a whole where no arrangement is needed (a reference potential in a
// closed scene, the grounded plane below every feature). Checks that need the
// planar arrangement (overlapping regions, edges off every boundary) belong
// to Scene.Layout.
func Read(r io.Reader) (*Scene, error) {
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, fmt.Errorf("geom: reading the scene: %w", err)
	}
	// Some editors start UTF-8 files with a byte order mark; JSON has none.
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	rd := &sceneReader{data: data, sc: &Scene{}}
	if err := rd.read(); err != nil {
		return nil, err
	}
	return rd.sc, nil
}

// ReadFile reads the scene file at path with Read. Validation errors are
// *Error with File set to path.
func ReadFile(path string) (*Scene, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("geom: %w", err)
	}
	defer f.Close()
	sc, err := Read(f)
	if err != nil {
		var e *Error
		if errors.As(err, &e) {
			e.File = path
			return nil, e
		}
		return nil, fmt.Errorf("geom: %s: %w", path, err)
	}
	return sc, nil
}

// sceneReader holds the state of one Read.
type sceneReader struct {
	data  []byte
	sc    *Scene
	scale float64
	// open is problem.open when openSet.
	open, openSet bool
	feats         []*readFeature
	names         map[string]int // body and edge names -> feature index
	warnings      []*readWarning
	warnIndex     map[string]*readWarning
	lo, hi        r2.Vec // bounding box of every position, metres
	tol           float64
}

// readFeature is one feature between decoding and shaping.
type readFeature struct {
	index int
	part  Part
	name  string
	multi bool
	// polys holds a body's or region's rings in metres as given, closing
	// vertex included; lines holds an edge's lines.
	polys [][][]r2.Vec
	lines [][]r2.Vec
	// shaped geometry
	polygons []Polygon
	shaped   []Line
	// sheet: a body drawn as lines (shaped holds them).
	sheet bool

	cond      Condition
	kutta     *Kutta
	mat       Material
	perm      float64
	breakdown float64
}

// readWarning gathers the features that share one unknown key.
type readWarning struct {
	first int
	name  string
	key   string
	more  int
}

func (rd *sceneReader) errf(feature int, name, member, format string, args ...any) error {
	return &Error{Feature: feature, Name: name, Member: member, Msg: fmt.Sprintf(format, args...)}
}

func (rd *sceneReader) read() error {
	raws, err := rd.top()
	if err != nil {
		return err
	}
	for i, raw := range raws {
		if err := rd.precheck(i, raw); err != nil {
			return err
		}
	}
	fc, err := geojson.UnmarshalFeatureCollection(rd.data)
	if err != nil {
		// Find the feature at fault, if one is.
		for i, raw := range raws {
			if _, ferr := geojson.UnmarshalFeature(raw); ferr != nil {
				return rd.errf(i, "", "", "cannot be read as a GeoJSON Feature (%v); fix it to follow RFC 7946", ferr)
			}
		}
		return rd.errf(-1, "", "", "the file cannot be read as a GeoJSON FeatureCollection (%v); fix it to follow RFC 7946", err)
	}
	if err := rd.problem(fc.ExtraMembers["problem"]); err != nil {
		return err
	}
	rd.names = make(map[string]int)
	first := true
	for i, f := range fc.Features {
		rf, err := rd.feature(i, f, &first)
		if err != nil {
			return err
		}
		rd.feats = append(rd.feats, rf)
	}
	diag := r2.Sub(rd.hi, rd.lo)
	d := math.Hypot(diag.X, diag.Y)
	if !(d > 0) {
		return rd.errf(-1, "", "", "every feature lies at the one point (%s, %s); the scene has no extent: check the coordinates and problem.unit",
			rd.unitFmt(rd.lo.X), rd.unitFmt(rd.lo.Y))
	}
	rd.tol = readCoincident * d
	for _, rf := range rd.feats {
		if err := rd.shape(rf); err != nil {
			return err
		}
	}
	return rd.finish()
}

// top checks the file as a whole and returns the raw features.
func (rd *sceneReader) top() ([]json.RawMessage, error) {
	const shape = `a scene is {"type": "FeatureCollection", "problem": {"physics": ...}, "features": [...]}`
	if len(bytes.TrimSpace(rd.data)) == 0 {
		return nil, rd.errf(-1, "", "", "the file is empty; %s", shape)
	}
	var top map[string]json.RawMessage
	if err := json.Unmarshal(rd.data, &top); err != nil {
		var se *json.SyntaxError
		var te *json.UnmarshalTypeError
		switch {
		case errors.As(err, &se):
			line, col := readLineCol(rd.data, se.Offset)
			return nil, rd.errf(-1, "", "", "invalid JSON at line %d, column %d (byte %d): %s; look for a missing comma, bracket, brace or quote just before there",
				line, col, se.Offset, strings.TrimPrefix(se.Error(), "json: "))
		case errors.As(err, &te):
			return nil, rd.errf(-1, "", "", "the file holds a JSON %s, not a GeoJSON FeatureCollection object; %s", te.Value, shape)
		}
		return nil, rd.errf(-1, "", "", "invalid JSON: %v", err)
	}
	if top == nil {
		return nil, rd.errf(-1, "", "", "the file holds JSON null, not a GeoJSON FeatureCollection; %s", shape)
	}
	var typ any
	if raw, ok := top["type"]; !ok {
		return nil, rd.errf(-1, "", "type", `missing; %s`, shape)
	} else if json.Unmarshal(raw, &typ) != nil {
		return nil, rd.errf(-1, "", "type", `cannot be read; %s`, shape)
	}
	switch typ {
	case "FeatureCollection":
	case "Feature":
		return nil, rd.errf(-1, "", "type", `the file holds a single Feature; put it in a FeatureCollection: {"type": "FeatureCollection", "problem": {...}, "features": [ your feature ]}`)
	default:
		return nil, rd.errf(-1, "", "type", `must be "FeatureCollection", got %s; %s`, readDescribe(typ), shape)
	}
	keys := make([]string, 0, len(top))
	for k := range top {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		switch k {
		case "type", "features", "bbox", "problem":
			continue
		}
		if s, ok := readNearMiss(k, []string{"problem", "features"}); ok {
			return nil, rd.errf(-1, "", k, "unknown member; did you mean %q?", s)
		}
	}
	if raw, ok := top["bbox"]; ok {
		var v any
		dec := json.NewDecoder(bytes.NewReader(raw))
		dec.UseNumber()
		if dec.Decode(&v) == nil {
			if msg := readCheckBBox(v); msg != "" {
				return nil, rd.errf(-1, "", "bbox", "%s", msg)
			}
		}
	}
	rawFeatures, ok := top["features"]
	if !ok || string(bytes.TrimSpace(rawFeatures)) == "null" {
		return nil, rd.errf(-1, "", "features", "missing; add a \"features\" array with at least one body, region or edge")
	}
	var raws []json.RawMessage
	if err := json.Unmarshal(rawFeatures, &raws); err != nil {
		return nil, rd.errf(-1, "", "features", "must be an array of GeoJSON Features")
	}
	rawProblem, ok := top["problem"]
	if !ok {
		return nil, rd.errf(-1, "", "problem", `missing; add "problem": {"physics": "laplace"} (or "electrostatic", "seepage", "flow") beside "features"`)
	}
	var probe any
	if json.Unmarshal(rawProblem, &probe) == nil {
		if _, isObj := probe.(map[string]any); !isObj {
			return nil, rd.errf(-1, "", "problem", `must be an object such as {"physics": "laplace", "unit": "m"}, got %s`, readDescribe(probe))
		}
	} else if msg := readBadNumber(rawProblem); msg != "" {
		return nil, rd.errf(-1, "", "problem", "%s", msg)
	}
	if len(raws) == 0 {
		return nil, rd.errf(-1, "", "features", "the scene has no features; add at least one body, region or edge")
	}
	return raws, nil
}

// readLineCol turns a byte offset into a 1-based line and column.
func readLineCol(data []byte, off int64) (line, col int) {
	if off > int64(len(data)) {
		off = int64(len(data))
	}
	if off < 0 {
		off = 0
	}
	before := data[:off]
	line = 1 + bytes.Count(before, []byte("\n"))
	col = int(off) - bytes.LastIndexByte(before, '\n')
	return line, col
}

// readBadNumber reports a number in raw JSON that does not fit a float64.
func readBadNumber(raw json.RawMessage) string {
	var v any
	dec := json.NewDecoder(bytes.NewReader(raw))
	dec.UseNumber()
	if err := dec.Decode(&v); err != nil {
		return fmt.Sprintf("cannot be read: %v", err)
	}
	if p, n := readFindBadNumber(v, ""); n != "" {
		return fmt.Sprintf("number %s at %s is out of range; write finite numbers", readClip(n), p)
	}
	return ""
}

// readFindBadNumber walks a value decoded with UseNumber and returns the
// path and text of the first number that does not fit a float64.
func readFindBadNumber(v any, path string) (string, string) {
	switch v := v.(type) {
	case json.Number:
		if _, err := strconv.ParseFloat(string(v), 64); err != nil {
			return path, string(v)
		}
	case []any:
		for i, e := range v {
			if p, n := readFindBadNumber(e, fmt.Sprintf("%s[%d]", path, i)); n != "" {
				return p, n
			}
		}
	case map[string]any:
		keys := make([]string, 0, len(v))
		for k := range v {
			keys = append(keys, k)
		}
		sort.Strings(keys)
		for _, k := range keys {
			p := k
			if path != "" {
				p = path + "." + k
			}
			if p, n := readFindBadNumber(v[k], p); n != "" {
				return p, n
			}
		}
	}
	return "", ""
}

// geometry nesting depth of positions per GeoJSON type
var readDepth = map[string]int{
	"Point": 0, "MultiPoint": 1, "LineString": 1, "MultiLineString": 2, "Polygon": 2, "MultiPolygon": 3,
}

// precheck checks the JSON structure of one feature where orb/geojson would
// fail without saying which feature, or would accept bad positions quietly.
func (rd *sceneReader) precheck(i int, raw json.RawMessage) error {
	var v any
	dec := json.NewDecoder(bytes.NewReader(raw))
	dec.UseNumber()
	if err := dec.Decode(&v); err != nil {
		return rd.errf(i, "", "", "cannot be read: %v", err)
	}
	obj, ok := v.(map[string]any)
	if !ok {
		return rd.errf(i, "", "", `must be a GeoJSON Feature object {"type": "Feature", "properties": {...}, "geometry": {...}}, got %s`, readDescribe(v))
	}
	name := ""
	props, _ := obj["properties"].(map[string]any)
	if s, ok := props["name"].(string); ok {
		name = s
	}
	if p, n := readFindBadNumber(obj, ""); n != "" {
		member := p
		switch {
		case strings.HasPrefix(p, "properties."):
			member = strings.TrimPrefix(p, "properties.")
			if j := strings.IndexAny(member, ".["); j > 0 {
				member = member[:j]
			}
		case strings.HasPrefix(p, "geometry.coordinates"):
			member = "coordinates"
		}
		return rd.errf(i, name, member, "number %s at %s is out of range; write finite numbers", readClip(n), p)
	}
	switch t := obj["type"]; t {
	case "Feature":
	case nil:
		return rd.errf(i, name, "type", `missing; a feature is {"type": "Feature", "properties": {...}, "geometry": {...}}`)
	default:
		return rd.errf(i, name, "type", `must be "Feature", got %s`, readDescribe(t))
	}
	if msg := readCheckBBox(obj["bbox"]); msg != "" {
		return rd.errf(i, name, "bbox", "%s", msg)
	}
	if p, ok := obj["properties"]; ok && p != nil && props == nil {
		return rd.errf(i, name, "properties", `must be an object such as {"part": "body", "potential": 1}, got %s`, readDescribe(p))
	}
	g, ok := obj["geometry"]
	if !ok || g == nil {
		return nil // reported with the part in mind later
	}
	gm, ok := g.(map[string]any)
	if !ok {
		return rd.errf(i, name, "geometry", `must be a GeoJSON geometry object such as {"type": "Polygon", "coordinates": [...]}, got %s`, readDescribe(g))
	}
	gt, _ := gm["type"].(string)
	depth, known := readDepth[gt]
	switch {
	case gt == "GeometryCollection":
		return rd.errf(i, name, "geometry", "a GeometryCollection is not supported; use a Polygon or MultiPolygon for a body or region, a LineString or MultiLineString for an edge or a sheet body")
	case gm["type"] == nil:
		return rd.errf(i, name, "geometry", `has no "type"; add "type": "Polygon" (or MultiPolygon, LineString, MultiLineString)`)
	case !known:
		hint := ""
		if s, ok := readNearMiss(gt, readGeomTypes); ok {
			hint = fmt.Sprintf("; did you mean %q?", s)
		}
		return rd.errf(i, name, "geometry", "unknown geometry type %s%s", readDescribe(gm["type"]), hint)
	}
	c, ok := gm["coordinates"]
	if !ok || c == nil {
		return rd.errf(i, name, "coordinates", "missing; a %s needs its coordinates", gt)
	}
	if msg := readCheckPositions(c, depth, "coordinates"); msg != "" {
		return rd.errf(i, name, "coordinates", "%s", msg)
	}
	return nil
}

// readCheckBBox checks an optional GeoJSON bbox member (decoded with
// UseNumber): Read ignores it, but it must still be an array of numbers.
func readCheckBBox(v any) string {
	if v == nil {
		return ""
	}
	arr, ok := v.([]any)
	if ok {
		for _, c := range arr {
			if _, isNum := c.(json.Number); !isNum {
				ok = false
			}
		}
	}
	if !ok {
		return fmt.Sprintf("must be an array of numbers [min x, min y, max x, max y], got %s; fix it or remove it (rimfield does not use it)", readDescribe(v))
	}
	return ""
}

// readCheckPositions checks that v nests arrays depth deep around positions
// [x, y] of numbers.
func readCheckPositions(v any, depth int, path string) string {
	arr, ok := v.([]any)
	if depth == 0 {
		if !ok || len(arr) < 2 {
			return fmt.Sprintf("%s must be a position [x, y], got %s", path, readDescribe(v))
		}
		for j, c := range arr {
			if _, ok := c.(json.Number); !ok {
				return fmt.Sprintf("%s[%d] must be a number, got %s; positions are [x, y] of plain numbers", path, j, readDescribe(c))
			}
		}
		return ""
	}
	if !ok {
		what := "positions"
		if depth > 1 {
			what = "arrays of positions"
		}
		return fmt.Sprintf("%s must be an array of %s, got %s", path, what, readDescribe(v))
	}
	for j, e := range arr {
		if msg := readCheckPositions(e, depth-1, fmt.Sprintf("%s[%d]", path, j)); msg != "" {
			return msg
		}
	}
	return ""
}

// readDescribe names a decoded JSON value for an error message.
func readDescribe(v any) string {
	switch v := v.(type) {
	case nil:
		return "null"
	case string:
		return strconv.Quote(readClip(v))
	case bool:
		return strconv.FormatBool(v)
	case float64:
		return strconv.FormatFloat(v, 'g', -1, 64)
	case json.Number:
		return readClip(string(v))
	case []any:
		return fmt.Sprintf("an array of length %d", len(v))
	case map[string]any:
		return "an object"
	}
	return fmt.Sprintf("%T", v)
}

// readClip shortens a long string for a message.
func readClip(s string) string {
	const max = 40
	if len(s) <= max {
		return s
	}
	r := []rune(s)
	if len(r) <= max {
		return s
	}
	return string(r[:max]) + "..."
}

// problem decodes the problem member.
func (rd *sceneReader) problem(v any) error {
	m, ok := v.(map[string]any)
	if !ok {
		return rd.errf(-1, "", "problem", `must be an object such as {"physics": "laplace", "unit": "m"}, got %s`, readDescribe(v))
	}
	pe := func(member, format string, args ...any) error {
		return rd.errf(-1, "", "problem."+member, format, args...)
	}
	p := &rd.sc.Problem
	ph, ok := m["physics"]
	if !ok {
		if k, near := readNearKey(m, "physics"); near {
			return pe(k, `unknown key; did you mean "physics"?`)
		}
		return pe("physics", `missing; add "physics": "laplace", "electrostatic", "seepage" or "flow"`)
	}
	{
		s, isStr := ph.(string)
		if !isStr {
			return pe("physics", `must be a string: "laplace", "electrostatic", "seepage" or "flow"; got %s`, readDescribe(ph))
		}
		switch s {
		case "laplace":
			p.Physics = Laplace
		case "electrostatic":
			p.Physics = Electrostatic
		case "seepage":
			p.Physics = Seepage
		case "flow":
			p.Physics = Flow
		default:
			hint := ""
			if g, ok := readNearMiss(s, readPhysicsNames); ok {
				hint = fmt.Sprintf(" (did you mean %q?)", g)
			}
			return pe("physics", `unknown physics %q%s; use "laplace", "electrostatic", "seepage" or "flow"`, readClip(s), hint)
		}
	}
	for _, k := range readSortedKeys(m) {
		val := m[k]
		if !readKnown(k, readProblemKeys) {
			if g, near := readNearMiss(k, readProblemKeys); near {
				return pe(k, "unknown key; did you mean %q?", g)
			}
			rd.warn(-1, "", k)
			continue
		}
		if uses := readProblemPhysics[k]; uses != nil && !readHas(uses, p.Physics) {
			return pe(k, "is used in %s scenes, not in %s; remove it%s", readPhysicsList(uses), p.Physics, readProblemHint[k+"/"+p.Physics.String()])
		}
		switch k {
		case "unit":
			s, isStr := val.(string)
			if !isStr {
				return pe(k, "must be a string, one of %s; got %s", readUnitList, readDescribe(val))
			}
			if s == "µm" || s == "μm" {
				s = "um"
			}
			if _, known := readUnits[s]; !known {
				hint := ""
				if g, ok := readUnitAlias[strings.ToLower(strings.TrimSpace(s))]; ok {
					hint = fmt.Sprintf(" (did you mean %q?)", g)
				}
				return pe(k, "unknown unit %q%s; use one of %s", readClip(s), hint, readUnitList)
			}
			p.Unit = s
		case "open":
			b, isBool := val.(bool)
			if !isBool {
				return pe(k, "must be true or false, got %s", readDescribe(val))
			}
			rd.open, rd.openSet = b, true
		case "stream":
			s, err := rd.stream(val)
			if err != nil {
				return err
			}
			p.Stream = s
		case "ground":
			g, isObj := val.(map[string]any)
			if !isObj {
				return pe(k, `must be an object {"y": y0} (the grounded plane y = y0 in scene units), got %s`, readDescribe(val))
			}
			for _, gk := range readSortedKeys(g) {
				if gk != "y" {
					return pe(k, `unknown key %q; the grounded plane is {"y": y0}`, readClip(gk))
				}
			}
			yv, has := g["y"]
			if !has {
				return pe(k, `missing "y"; write {"y": y0}, the height of the grounded plane in scene units`)
			}
			y, isNum := yv.(float64)
			if !isNum {
				return pe("ground.y", "%s", readNumberMsg(yv))
			}
			p.Ground = &Ground{Y: y} // scaled below
		}
	}
	if p.Unit == "" {
		p.Unit = "m"
	}
	rd.scale = readUnits[p.Unit]
	p.Scale = rd.scale
	positive := func(k string, def float64, what string) (float64, error) {
		val, has := m[k]
		if !has {
			return def, nil
		}
		x, isNum := val.(float64)
		if !isNum {
			return 0, pe(k, "%s", readNumberMsg(val))
		}
		if !(x > 0) || math.IsInf(x, 0) {
			return 0, pe(k, "must be positive, got %g; give %s", x, what)
		}
		return x, nil
	}
	var err error
	switch p.Physics {
	case Electrostatic:
		if p.BackgroundPermittivity, err = positive("background_permittivity", 1, "the relative permittivity of the background (1 for air)"); err != nil {
			return err
		}
		eps := Eps0 * p.BackgroundPermittivity
		p.Background = Material{Kx: eps, Ky: eps}
	default:
		k, err := positive("background_k", 1, "the conductivity of the background")
		if err != nil {
			return err
		}
		p.Background = Material{Kx: k, Ky: k}
	}
	if p.Physics == Seepage {
		if p.UnitWeightWater, err = positive("unit_weight_water", 9.81, "the unit weight of water in kN/m^3 (9.81)"); err != nil {
			return err
		}
		if p.CriticalGradient, err = positive("critical_gradient", 1.0, "the critical hydraulic gradient (about 1 for most soils)"); err != nil {
			return err
		}
	}
	if p.Physics == Flow {
		c, err := positive("chord", 0, "the reference chord in scene units")
		if err != nil {
			return err
		}
		p.Chord = c * rd.scale
		// Air at sea level in the International Standard Atmosphere (ISO
		// 2533:1975; common practice).
		if p.Density, err = positive("density", 1.225, "the fluid density in kg/m^3 (1.225 for air at sea level, about 1000 for water)"); err != nil {
			return err
		}
	}
	if p.Ground != nil {
		p.Ground.Y *= rd.scale
		if y := p.Ground.Y; math.IsInf(y, 0) || math.Abs(y) > readMaxCoord {
			return pe("ground.y", "the plane lies %g m from the origin, beyond the %g m limit; check problem.unit", math.Abs(y), readMaxCoord)
		}
	}
	return nil
}

// readProblemPhysics lists the physics that use a physics-specific problem member.
var readProblemPhysics = map[string][]Physics{
	"background_permittivity": {Electrostatic},
	"background_k":            {Laplace, Seepage, Flow},
	"unit_weight_water":       {Seepage},
	"critical_gradient":       {Seepage},
	"stream":                  {Flow},
	"chord":                   {Flow},
	"density":                 {Flow},
	"ground":                  {Electrostatic, Flow},
}

// readProblemHint adds the right member for a common mix-up.
var readProblemHint = map[string]string{
	"background_k/electrostatic":      ` (the background of an electrostatic scene is "background_permittivity", relative)`,
	"background_permittivity/laplace": ` (use "background_k")`,
	"background_permittivity/seepage": ` (use "background_k" in m/s)`,
	"background_permittivity/flow":    ` (use "background_k")`,
}

func (rd *sceneReader) stream(val any) (*Stream, error) {
	pe := func(member, format string, args ...any) error {
		return rd.errf(-1, "", "problem."+member, format, args...)
	}
	m, ok := val.(map[string]any)
	if !ok {
		return nil, pe("stream", `must be an object {"speed": U, "angle_deg": alpha}, got %s`, readDescribe(val))
	}
	for _, k := range readSortedKeys(m) {
		if k != "speed" && k != "angle_deg" {
			hint := ""
			if g, near := readNearMiss(k, []string{"speed", "angle_deg"}); near {
				hint = fmt.Sprintf("; did you mean %q?", g)
			}
			return nil, pe("stream", `unknown key %q%s; the stream is {"speed": U (m/s), "angle_deg": alpha}`, readClip(k), hint)
		}
	}
	sv, has := m["speed"]
	if !has {
		return nil, pe("stream.speed", "missing; give the speed of the uniform stream in m/s")
	}
	s := &Stream{}
	speed, isNum := sv.(float64)
	if !isNum {
		return nil, pe("stream.speed", "%s", readNumberMsg(sv))
	}
	if !(speed > 0) {
		return nil, pe("stream.speed", "must be positive, got %g; give the speed of the uniform stream in m/s", speed)
	}
	s.Speed = speed
	if av, has := m["angle_deg"]; has {
		a, isNum := av.(float64)
		if !isNum {
			return nil, pe("stream.angle_deg", "%s", readNumberMsg(av))
		}
		s.AngleDeg = a
	}
	return s, nil
}

var readNumberPrefix = regexp.MustCompile(`^\s*[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?`)

// readNumberMsg explains that v must be a number and how to write it.
func readNumberMsg(v any) string {
	s, isStr := v.(string)
	if !isStr {
		return fmt.Sprintf("must be a number, got %s", readDescribe(v))
	}
	if c := strings.Replace(strings.TrimSpace(s), ",", ".", 1); c != strings.TrimSpace(s) {
		if x, err := strconv.ParseFloat(c, 64); err == nil {
			return fmt.Sprintf("must be a number, got %q; write it as %s, with a decimal point and without quotes", readClip(s), readFmt(x))
		}
	}
	if m := readNumberPrefix.FindString(s); m != "" {
		x, err := strconv.ParseFloat(strings.TrimSpace(strings.TrimPrefix(strings.TrimSpace(m), "+")), 64)
		if err == nil {
			if strings.TrimSpace(s[len(m):]) == "" {
				return fmt.Sprintf("must be a number, got %q; write it as %s, without quotes", readClip(s), readFmt(x))
			}
			return fmt.Sprintf("must be a number, got %q; write it as %s (a plain number in SI units, no unit text)", readClip(s), readFmt(x))
		}
	}
	return fmt.Sprintf("must be a number, got %q; write a plain number such as 1.5", readClip(s))
}

// readFmt formats a number compactly for messages.
func readFmt(x float64) string { return strconv.FormatFloat(x, 'g', 10, 64) }

// unitFmt formats a length in metres in the scene's unit.
func (rd *sceneReader) unitFmt(x float64) string { return readFmt(x / rd.scale) }

func (rd *sceneReader) pointFmt(p r2.Vec) string {
	return "(" + rd.unitFmt(p.X) + ", " + rd.unitFmt(p.Y) + ")"
}

func readSortedKeys(m map[string]any) []string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	return keys
}

func readKnown(k string, known []string) bool {
	for _, s := range known {
		if k == s {
			return true
		}
	}
	return false
}

func readHas(list []Physics, p Physics) bool {
	for _, q := range list {
		if q == p {
			return true
		}
	}
	return false
}

func readPhysicsList(list []Physics) string {
	names := make([]string, len(list))
	for i, p := range list {
		names[i] = p.String()
	}
	switch len(names) {
	case 1:
		return names[0]
	case 2:
		return names[0] + " and " + names[1]
	}
	return strings.Join(names[:len(names)-1], ", ") + " and " + names[len(names)-1]
}

// readNearKey reports whether m holds a near miss of key (so that a missing
// key is reported as the misspelling the user wrote).
func readNearKey(m map[string]any, key string) (string, bool) {
	for _, k := range readSortedKeys(m) {
		if k == key {
			continue
		}
		if g, ok := readNearMiss(k, []string{key}); ok && g == key {
			return k, true
		}
	}
	return "", false
}

// warn records an unknown key, one warning per key.
func (rd *sceneReader) warn(feature int, name, key string) {
	id := fmt.Sprintf("%t/%s", feature < 0, key)
	if w, ok := rd.warnIndex[id]; ok {
		w.more++
		return
	}
	if rd.warnIndex == nil {
		rd.warnIndex = make(map[string]*readWarning)
	}
	w := &readWarning{first: feature, name: name, key: key}
	rd.warnIndex[id] = w
	rd.warnings = append(rd.warnings, w)
}

func (w *readWarning) String() string {
	if w.first < 0 {
		return fmt.Sprintf("problem: unknown member %q ignored.", readClip(w.key))
	}
	s := fmt.Sprintf("feature %d (%q): unknown property %q ignored", w.first, w.name, readClip(w.key))
	switch w.more {
	case 0:
		return s + "."
	case 1:
		return s + " (also on 1 other feature)."
	}
	return s + fmt.Sprintf(" (also on %d other features).", w.more)
}

// readNorm lower-cases a key and drops separators, so that "Net-Inflow"
// and "net_inflow" compare equal.
func readNorm(s string) []rune {
	out := make([]rune, 0, len(s))
	for _, r := range strings.ToLower(s) {
		switch r {
		case '_', '-', ' ', '.':
			continue
		}
		out = append(out, r)
	}
	return out
}

// readNearMiss returns the known key that s is a near miss of: equal up to
// case and separators, or within an edit distance (optimal string
// alignment: insertions, deletions, substitutions and transpositions of
// neighbours) of 2 when both are at least 5 characters long, of 1 when both
// are at least 2 long. One-letter keys ("x", "z") are near misses only of
// the same letter in another case, so GIS attributes are not taken for "k".
func readNearMiss(s string, known []string) (string, bool) {
	ns := readNorm(s)
	for _, k := range known {
		if string(ns) == string(readNorm(k)) && s != k {
			return k, true
		}
	}
	best, bestD := "", 3
	for _, k := range known {
		nk := readNorm(k)
		n := min(len(ns), len(nk))
		limit := 0
		switch {
		case n >= 5:
			limit = 2
		case n >= 2:
			limit = 1
		}
		if limit == 0 || len(ns)-len(nk) > limit || len(nk)-len(ns) > limit {
			continue
		}
		if d := readEditDistance(ns, nk); d <= limit && d < bestD {
			best, bestD = k, d
		}
	}
	return best, best != ""
}

// readEditDistance is the optimal string alignment distance of a and b.
func readEditDistance(a, b []rune) int {
	prev2 := make([]int, len(b)+1)
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
			if i > 1 && j > 1 && a[i-1] == b[j-2] && a[i-2] == b[j-1] {
				cur[j] = min(cur[j], prev2[j-2]+1)
			}
		}
		prev2, prev, cur = prev, cur, prev2
	}
	return prev[len(b)]
}

// Which parts and physics use each property key.
var (
	readCondKeys     = []string{"potential", "flux", "floating"}
	readMaterialKeys = map[string]bool{"k": true, "kx": true, "ky": true, "permittivity": true, "breakdown_field": true}
)

// feature decodes the properties and geometry of one feature.
func (rd *sceneReader) feature(i int, f *geojson.Feature, first *bool) (*readFeature, error) {
	if f == nil {
		return nil, rd.errf(i, "", "", "is null; remove it or write a Feature")
	}
	props := map[string]any(f.Properties)
	rf := &readFeature{index: i}
	if v, ok := props["name"]; ok {
		s, isStr := v.(string)
		if !isStr {
			return nil, rd.errf(i, "", "name", "must be a string, got %s", readDescribe(v))
		}
		if strings.TrimSpace(s) == "" {
			return nil, rd.errf(i, "", "name", "is empty; give a name or remove the key to get the default name")
		}
		rf.name = s
	}
	ef := func(member, format string, args ...any) error {
		return rd.errf(i, rf.name, member, format, args...)
	}
	pv, ok := props["part"]
	if !ok {
		if k, near := readNearKey(props, "part"); near {
			return nil, ef(k, `unknown key; did you mean "part"?`)
		}
		return nil, ef("part", `missing; add "part": "body", "region" or "edge"`)
	}
	ps, isStr := pv.(string)
	if !isStr {
		return nil, ef("part", `must be "body", "region" or "edge", got %s`, readDescribe(pv))
	}
	switch ps {
	case "body":
		rf.part = PartBody
	case "region":
		rf.part = PartRegion
	case "edge":
		rf.part = PartEdge
	default:
		hint := ""
		if g, near := readNearMiss(ps, readPartNames); near {
			hint = fmt.Sprintf(" (did you mean %q?)", g)
		}
		return nil, ef("part", `unknown part %q%s; use "body" (not part of the domain: conductor, obstacle, structure), "region" (material of the domain) or "edge" (a stretch of boundary with its own condition)`, readClip(ps), hint)
	}
	if rf.name == "" {
		rf.name = fmt.Sprintf("%s%d", rf.part, i)
	}
	physics := rd.sc.Problem.Physics
	for _, k := range readSortedKeys(props) {
		switch {
		case k == "part" || k == "name":
		case k == "net_inflow" || readKnown(k, readCondKeys):
			if rf.part == PartRegion {
				return nil, ef(k, "a region carries no boundary condition; put %q on a body, or on an edge along the region's boundary", k)
			}
			if physics == Flow && rf.part == PartBody {
				return nil, ef(k, `in flow scenes every body is a wall with no condition of its own; remove %q (a body may carry "kutta" to fix its circulation)`, k)
			}
		case k == "kutta":
			if physics != Flow {
				return nil, ef(k, "is used in flow scenes, not in %s; remove it", physics)
			}
			if rf.part != PartBody {
				return nil, ef(k, "belongs on a flow body (the one with the sharp trailing edge), not on %s; remove it", readArticle(rf.part))
			}
		case readMaterialKeys[k]:
			electro := k == "permittivity" || k == "breakdown_field"
			if electro && physics != Electrostatic {
				hint := ""
				if k == "permittivity" {
					hint = ` (regions take "k" or "kx" and "ky")`
				}
				return nil, ef(k, "is used in electrostatic scenes, not in %s; remove it%s", physics, hint)
			}
			if !electro && physics == Electrostatic {
				return nil, ef(k, `is used in laplace, seepage and flow scenes, not in electrostatic; give the region's relative permittivity as "permittivity"`)
			}
			if rf.part != PartRegion {
				return nil, ef(k, "material belongs on a region; %s is not part of the domain and has no material: remove %q", readArticle(rf.part), k)
			}
		default:
			if g, near := readNearMiss(k, readPropertyKeys); near {
				return nil, ef(k, "unknown key; did you mean %q?", g)
			}
			rd.warn(i, rf.name, k)
		}
	}
	var err error
	switch rf.part {
	case PartBody, PartEdge:
		err = rd.condition(rf, props, ef)
	case PartRegion:
		err = rd.material(rf, props, ef)
	}
	if err != nil {
		return nil, err
	}
	if rf.part != PartRegion {
		if j, dup := rd.names[rf.name]; dup {
			if _, named := props["name"]; !named {
				return nil, ef("name", "this feature's default name %q is already the name of feature %d; give this feature a \"name\" of its own", rf.name, j)
			}
			return nil, ef("name", "%q is also the name of feature %d; bodies and edges need unique names (results are reported by name): rename one of them", rf.name, j)
		}
		rd.names[rf.name] = i
	}
	if err := rd.positions(rf, f.Geometry, ef, first); err != nil {
		return nil, err
	}
	return rf, nil
}

// condition decodes the boundary condition of a body or edge.
func (rd *sceneReader) condition(rf *readFeature, props map[string]any, ef func(string, string, ...any) error) error {
	var set []string
	for _, k := range readCondKeys {
		if _, ok := props[k]; ok {
			set = append(set, k)
		}
	}
	if len(set) > 1 {
		return ef(set[1], "%q and %q are both set; %s takes one condition: keep one of them", set[0], set[1], readArticle(rf.part))
	}
	number := func(k string) (float64, error) {
		v := props[k]
		x, ok := v.(float64)
		if !ok {
			return 0, ef(k, "%s", readNumberMsg(v))
		}
		return x, nil
	}
	_, hasNet := props["net_inflow"]
	switch {
	case len(set) == 0:
		if hasNet {
			return ef("net_inflow", `is used only with "floating": true; add "floating": true or remove "net_inflow"`)
		}
		if rf.part == PartEdge {
			return ef("", `an edge must set a condition; add "potential": v, "flux": g or "floating": true`)
		}
		rf.cond = Insulated
	case set[0] == "potential":
		x, err := number("potential")
		if err != nil {
			return err
		}
		rf.cond = Condition{Kind: Potential, Value: x}
	case set[0] == "flux":
		x, err := number("flux")
		if err != nil {
			return err
		}
		rf.cond = Condition{Kind: Flux, Value: x}
	case set[0] == "floating":
		v := props["floating"]
		b, ok := v.(bool)
		if !ok {
			return ef("floating", "must be true, got %s", readDescribe(v))
		}
		if !b {
			if rf.part == PartBody {
				return ef("floating", `"floating": false means nothing; remove it (a body with no condition is insulated)`)
			}
			return ef("floating", `"floating": false means nothing; remove it and set "potential" or "flux"`)
		}
		rf.cond = Condition{Kind: Floating}
		if hasNet {
			x, err := number("net_inflow")
			if err != nil {
				return err
			}
			rf.cond.NetInflow = x
		}
	}
	if set != nil && set[0] != "floating" && hasNet {
		return ef("net_inflow", `is used only with "floating": true; remove it`)
	}
	kv, has := props["kutta"]
	if !has {
		return nil
	}
	switch v := kv.(type) {
	case bool:
		if !v {
			return ef("kutta", `"kutta": false means nothing; remove it`)
		}
		rf.kutta = &Kutta{Auto: true}
	case []any:
		x, okx := readFloat(v, 0)
		y, oky := readFloat(v, 1)
		if len(v) != 2 || !okx || !oky {
			return ef("kutta", "must be true or a point [x, y] in scene units, got %s", readDescribe(kv))
		}
		p := r2.Vec{X: x * rd.scale, Y: y * rd.scale}
		if !readFinite(p) || math.Max(math.Abs(p.X), math.Abs(p.Y)) > readMaxCoord {
			return ef("kutta", "the point lies beyond %g m from the origin; check the point and problem.unit", readMaxCoord)
		}
		rf.kutta = &Kutta{Point: p}
	default:
		return ef("kutta", "must be true (trailing edge found automatically) or a point [x, y] in scene units, got %s", readDescribe(kv))
	}
	return nil
}

func readFloat(a []any, i int) (float64, bool) {
	if i >= len(a) {
		return 0, false
	}
	x, ok := a[i].(float64)
	return x, ok
}

func readFinite(p r2.Vec) bool {
	return !math.IsNaN(p.X) && !math.IsNaN(p.Y) && !math.IsInf(p.X, 0) && !math.IsInf(p.Y, 0)
}

// material decodes the material of a region.
func (rd *sceneReader) material(rf *readFeature, props map[string]any, ef func(string, string, ...any) error) error {
	get := func(k, what string) (float64, bool, error) {
		v, has := props[k]
		if !has {
			return 0, false, nil
		}
		x, isNum := v.(float64)
		if !isNum {
			return 0, true, ef(k, "%s", readNumberMsg(v))
		}
		if !(x > 0) || math.IsInf(x, 0) {
			return 0, true, ef(k, "must be positive, got %s; give %s", readFmt(x), what)
		}
		return x, true, nil
	}
	physics := rd.sc.Problem.Physics
	if physics == Electrostatic {
		eps, has, err := get("permittivity", "the relative permittivity (1 for air, about 4 for FR-4)")
		if err != nil {
			return err
		}
		if !has {
			eps = 1
		}
		rf.perm = eps
		rf.mat = Material{Kx: Eps0 * eps, Ky: Eps0 * eps}
		if rf.breakdown, _, err = get("breakdown_field", "the dielectric strength in V/m"); err != nil {
			return err
		}
		return nil
	}
	what := "the conductivity"
	if physics == Seepage {
		what = "the hydraulic conductivity in m/s, such as 1e-5"
	}
	k, hasK, err := get("k", what)
	if err != nil {
		return err
	}
	kx, hasKx, err := get("kx", what+" along x")
	if err != nil {
		return err
	}
	ky, hasKy, err := get("ky", what+" along y")
	if err != nil {
		return err
	}
	switch {
	case hasK && (hasKx || hasKy):
		member := "kx"
		if !hasKx {
			member = "ky"
		}
		return ef(member, `"k" and %q are both set; give "k" for an isotropic material or "kx" and "ky" together for an anisotropic one`, member)
	case hasKx != hasKy:
		have, miss := "kx", "ky"
		if hasKy {
			have, miss = "ky", "kx"
		}
		return ef(have, `is set without %q; give "kx" and "ky" together (or "k" alone if the material is isotropic)`, miss)
	case hasKx:
		rf.mat = Material{Kx: kx, Ky: ky}
	case hasK:
		rf.mat = Material{Kx: k, Ky: k}
	case physics == Seepage:
		return ef("k", `missing; a seepage region needs its hydraulic conductivity in m/s: add "k": 1e-5 (or "kx" and "ky")`)
	default:
		rf.mat = Material{Kx: 1, Ky: 1}
	}
	return nil
}

// positions converts a feature's geometry to metres and checks its type
// for the part, its emptiness and the size of its coordinates.
func (rd *sceneReader) positions(rf *readFeature, g orb.Geometry, ef func(string, string, ...any) error, first *bool) error {
	polyPart := rf.part == PartBody || rf.part == PartRegion
	typ := "null"
	if g != nil {
		typ = g.GeoJSONType()
	}
	switch {
	case g == nil && rf.part == PartBody:
		return ef("geometry", "missing; a body needs a Polygon or MultiPolygon geometry (a solid), or a LineString or MultiLineString (a sheet of zero thickness)")
	case g == nil && polyPart:
		return ef("geometry", "missing; %s needs a Polygon or MultiPolygon geometry", readArticle(rf.part))
	case g == nil:
		return ef("geometry", "missing; an edge needs a LineString or MultiLineString geometry")
	}
	var polys []orb.Polygon
	var lines []orb.LineString
	switch g := g.(type) {
	case orb.Polygon:
		polys = []orb.Polygon{g}
	case orb.MultiPolygon:
		polys = g
		rf.multi = true
	case orb.LineString:
		lines = []orb.LineString{g}
	case orb.MultiLineString:
		lines = g
		rf.multi = true
	}
	// A body drawn as lines is a sheet: zero thickness, its condition on
	// both faces.
	rf.sheet = rf.part == PartBody && lines != nil
	switch {
	case rf.part == PartBody && polys == nil && lines == nil:
		return ef("geometry", "a body must be a Polygon or MultiPolygon (a solid) or a LineString or MultiLineString (a sheet of zero thickness), got %s; points carry no boundary: draw the body's outline or its line", typ)
	case rf.part == PartRegion && polys == nil:
		hint := "points carry no boundary: draw the outline as a Polygon"
		if lines != nil {
			hint = "a region is material with an area: close the line into a Polygon ring; a line inside the domain with its own condition is a body (a sheet)"
		}
		return ef("geometry", "%s must be a Polygon or MultiPolygon, got %s; %s", readArticle(rf.part), typ, hint)
	case rf.part == PartEdge && lines == nil:
		hint := "points carry no boundary: draw the stretch as a LineString"
		if polys != nil {
			hint = "write the ring as a closed LineString, or put the condition on the body itself"
		}
		return ef("geometry", "an edge must be a LineString or MultiLineString, got %s; %s", typ, hint)
	}
	empty := func() error {
		return ef("coordinates", "the %s is empty; add its coordinates or remove the feature", typ)
	}
	conv := func(pt orb.Point, path string) (r2.Vec, error) {
		p := r2.Vec{X: pt[0] * rd.scale, Y: pt[1] * rd.scale}
		if !readFinite(p) || math.Abs(p.X) > readMaxCoord || math.Abs(p.Y) > readMaxCoord {
			return p, ef("coordinates", "position %s = [%s, %s] lies beyond %g m from the origin; check problem.unit (now %q) and that the coordinates are plane x, y near the origin, not longitude/latitude or a map grid (shift the drawing toward (0, 0))",
				path, readFmt(pt[0]), readFmt(pt[1]), readMaxCoord, rd.sc.Problem.Unit)
		}
		if *first {
			rd.lo, rd.hi = p, p
			*first = false
		} else {
			rd.lo = r2.Vec{X: math.Min(rd.lo.X, p.X), Y: math.Min(rd.lo.Y, p.Y)}
			rd.hi = r2.Vec{X: math.Max(rd.hi.X, p.X), Y: math.Max(rd.hi.Y, p.Y)}
		}
		return p, nil
	}
	if len(polys) == 0 && len(lines) == 0 {
		return empty()
	}
	for pi, poly := range polys {
		if len(poly) == 0 {
			return empty()
		}
		var rings [][]r2.Vec
		for ri, ring := range poly {
			pts := make([]r2.Vec, len(ring))
			for vi, pt := range ring {
				path := fmt.Sprintf("coordinates[%d][%d]", ri, vi)
				if rf.multi {
					path = fmt.Sprintf("coordinates[%d][%d][%d]", pi, ri, vi)
				}
				p, err := conv(pt, path)
				if err != nil {
					return err
				}
				pts[vi] = p
			}
			rings = append(rings, pts)
		}
		rf.polys = append(rf.polys, rings)
	}
	for li, line := range lines {
		pts := make([]r2.Vec, len(line))
		for vi, pt := range line {
			path := fmt.Sprintf("coordinates[%d]", vi)
			if rf.multi {
				path = fmt.Sprintf("coordinates[%d][%d]", li, vi)
			}
			p, err := conv(pt, path)
			if err != nil {
				return err
			}
			pts[vi] = p
		}
		rf.lines = append(rf.lines, pts)
	}
	return nil
}

// shape cleans and checks a feature's rings and lines with the scene's
// coincidence tolerance and normalises ring orientation.
func (rd *sceneReader) shape(rf *readFeature) error {
	ef := func(format string, args ...any) error {
		return rd.errf(rf.index, rf.name, "coordinates", format, args...)
	}
	tol := rd.tol
	for pi, rings := range rf.polys {
		path := func(ri int) string {
			if rf.multi {
				return fmt.Sprintf("ring coordinates[%d][%d]", pi, ri)
			}
			return fmt.Sprintf("ring coordinates[%d]", ri)
		}
		poly := make(Polygon, len(rings))
		for ri, raw := range rings {
			what := path(ri)
			if ri > 0 {
				what += " (a hole)"
			}
			if len(raw) == 0 {
				return ef("%s is empty; remove it or give its positions", what)
			}
			if len(raw) == 1 {
				return ef("%s has a single position; a ring needs at least 3 distinct vertices and the closing repeat of the first", what)
			}
			if r2.Norm(r2.Sub(raw[0], raw[len(raw)-1])) > tol {
				last := raw[len(raw)-1]
				return ef("%s is not closed: it starts at %s and ends at %s; GeoJSON repeats the first position at the end of a ring: append %s",
					what, rd.pointFmt(raw[0]), rd.pointFmt(last), readBracket(rd, raw[0]))
			}
			ring := readDedupe(raw[:len(raw)-1], tol)
			for len(ring) > 1 && r2.Norm(r2.Sub(ring[len(ring)-1], ring[0])) <= tol {
				ring = ring[:len(ring)-1]
			}
			if len(ring) < 3 {
				return ef("%s has only %s; a ring needs at least 3 (plus the closing repeat of the first)", what, readVertices(len(ring)))
			}
			if readCollinear(ring, tol) {
				return ef("%s encloses no area (its vertices lie on one line); remove it or give it some thickness", what)
			}
			poly[ri] = ring
		}
		if c, found := readFirstContact(poly, tol); found {
			switch {
			case c.ringA == c.ringB && c.fold:
				return ef("%s doubles back on itself at %s (two successive sides overlap); remove the spike", path(c.ringA), rd.pointFmt(c.at))
			case c.ringA == c.ringB:
				return ef("%s crosses or touches itself near %s; reorder its vertices so that it does not, or split it into separate polygons of a MultiPolygon", path(c.ringA), rd.pointFmt(c.at))
			case c.ringA == 0:
				return ef("%s (a hole) crosses or touches the outer ring near %s; a hole must lie strictly inside its outer ring", path(c.ringB), rd.pointFmt(c.at))
			default:
				return ef("holes %s and %s cross or touch near %s; keep holes apart, or merge them into one hole", path(c.ringA)[5:], path(c.ringB)[5:], rd.pointFmt(c.at))
			}
		}
		for ri, ring := range poly {
			if area, perim := readAreaPerimeter(ring); math.Abs(area) <= 0.5*tol*perim {
				return ef("%s is thinner than the coincidence tolerance (%s) and encloses no area; remove it or give it some thickness", path(ri), rd.unitFmt(tol))
			}
		}
		boxes := make([][2]r2.Vec, len(poly))
		for ri, ring := range poly {
			lo, hi := ring[0], ring[0]
			for _, v := range ring {
				lo = r2.Vec{X: math.Min(lo.X, v.X), Y: math.Min(lo.Y, v.Y)}
				hi = r2.Vec{X: math.Max(hi.X, v.X), Y: math.Max(hi.Y, v.Y)}
			}
			boxes[ri] = [2]r2.Vec{lo, hi}
		}
		inBox := func(p r2.Vec, rj int) bool {
			b := boxes[rj]
			return p.X >= b[0].X && p.X <= b[1].X && p.Y >= b[0].Y && p.Y <= b[1].Y
		}
		for ri := 1; ri < len(poly); ri++ {
			if !poly[0].Contains(poly[ri][0]) {
				return ef("%s (a hole) lies outside its outer ring %s; in GeoJSON the first ring of a polygon is its outline and the others are holes inside it: put a separate outline in a MultiPolygon, or in a feature of its own", path(ri), path(0)[5:])
			}
			for rj := 1; rj < len(poly); rj++ {
				if rj != ri && inBox(poly[ri][0], rj) && poly[rj].Contains(poly[ri][0]) {
					return ef("%s (a hole) lies inside %s, another hole of the same polygon; remove the inner hole, or give it a feature of its own", path(ri), path(rj)[5:])
				}
			}
		}
		for ri, ring := range poly {
			a, _ := readAreaPerimeter(ring)
			if (ri == 0) != (a > 0) {
				readReverse(ring)
			}
		}
		rf.polygons = append(rf.polygons, poly)
	}
	for li, raw := range rf.lines {
		what := "the line"
		if rf.multi {
			what = fmt.Sprintf("line coordinates[%d]", li)
		}
		if len(raw) == 0 {
			return ef("%s is empty; remove it or give its positions", what)
		}
		if rf.sheet {
			if err := rd.sheetSegments(raw, what, ef); err != nil {
				return err
			}
		}
		closed := len(raw) > 2 && r2.Norm(r2.Sub(raw[0], raw[len(raw)-1])) <= tol
		line := readDedupe(raw, tol)
		if closed {
			line = readDedupe(raw[:len(raw)-1], tol)
			if len(line) < 3 {
				return ef("%s is closed but has only %s; a closed line needs at least 3", what, readVertices(len(line)))
			}
			line = append(line, line[0])
		} else if len(line) < 2 {
			return ef("%s has no length (all its positions coincide); %s needs at least 2 distinct positions", what, readArticle(rf.part))
		}
		rf.shaped = append(rf.shaped, Line(line))
	}
	if rf.sheet {
		if c, found := readSheetOverlap(rf.shaped, tol); found {
			return ef("the sheet overlaps itself along %s (%s and %s run over the same stretch); a sheet's faces would coincide there: remove the repeated stretch", rd.pointFmt(c.at), c.a, c.b)
		}
	}
	return nil
}

// readBracket writes a point in scene units as a GeoJSON position.
func readBracket(rd *sceneReader, p r2.Vec) string {
	return "[" + rd.unitFmt(p.X) + ", " + rd.unitFmt(p.Y) + "]"
}

// readDedupe drops vertices within tol of the previous one kept, and the
// last ones within tol of the first (the ring or line is handled as open).
func readDedupe(pts []r2.Vec, tol float64) []r2.Vec {
	out := make([]r2.Vec, 0, len(pts))
	for _, p := range pts {
		if len(out) > 0 && r2.Norm(r2.Sub(p, out[len(out)-1])) <= tol {
			continue
		}
		out = append(out, p)
	}
	return out
}

// readAreaPerimeter returns the signed area (positive counter-clockwise) and
// the perimeter of a ring without closing vertex.
func readAreaPerimeter(ring []r2.Vec) (area, perim float64) {
	o := ring[0]
	for i := range ring {
		a := r2.Sub(ring[i], o)
		b := r2.Sub(ring[(i+1)%len(ring)], o)
		area += a.X*b.Y - a.Y*b.X
		perim += r2.Norm(r2.Sub(ring[(i+1)%len(ring)], ring[i]))
	}
	// A ring that is one vertex and its repeat, or collinear, gives 0.
	return area / 2, perim
}

// readCollinear reports whether every vertex of ring lies within tol of the
// line through its first vertex and the vertex farthest from it.
func readCollinear(ring []r2.Vec, tol float64) bool {
	o, far, dmax := ring[0], ring[0], 0.0
	for _, v := range ring {
		if d := r2.Norm(r2.Sub(v, o)); d > dmax {
			far, dmax = v, d
		}
	}
	if dmax <= tol {
		return true
	}
	u := r2.Scale(1/dmax, r2.Sub(far, o))
	for _, v := range ring {
		if math.Abs(r2.Cross(u, r2.Sub(v, o))) > tol {
			return false
		}
	}
	return true
}

// readVertices counts distinct vertices in words.
func readVertices(n int) string {
	if n == 1 {
		return "1 distinct vertex"
	}
	return fmt.Sprintf("%d distinct vertices", n)
}

// readArticle names a part with its indefinite article.
func readArticle(p Part) string {
	if p == PartEdge {
		return "an edge"
	}
	return "a " + p.String()
}

// readReverse reverses a ring in place.
func readReverse(ring Ring) {
	for i, j := 0, len(ring)-1; i < j; i, j = i+1, j-1 {
		ring[i], ring[j] = ring[j], ring[i]
	}
}

// readContact is where two sides of a polygon's rings meet.
type readContact struct {
	ringA, ringB int
	fold         bool // successive sides of one ring overlap
	at           r2.Vec
}

type readSeg struct {
	a, b       r2.Vec
	ring, idx  int
	minX, maxX float64
	minY, maxY float64
}

// readFirstContact finds two sides of the polygon's rings that cross, touch
// or overlap within tol, other than successive sides of one ring meeting at
// their shared vertex. Sides are swept in order of their smallest x, so only
// pairs whose x ranges overlap are compared: O(n log n) for ordinary rings,
// O(n^2) at worst.
func readFirstContact(poly Polygon, tol float64) (readContact, bool) {
	var segs []readSeg
	for ri, ring := range poly {
		n := len(ring)
		for i := range ring {
			a, b := ring[i], ring[(i+1)%n]
			segs = append(segs, readSeg{a: a, b: b, ring: ri, idx: i,
				minX: math.Min(a.X, b.X), maxX: math.Max(a.X, b.X),
				minY: math.Min(a.Y, b.Y), maxY: math.Max(a.Y, b.Y)})
		}
		// Successive sides overlap when the turn at their vertex doubles back.
		for i := range ring {
			prev, v, next := ring[(i+n-1)%n], ring[i], ring[(i+1)%n]
			if d, _ := readPointSeg(next, prev, v); d <= tol {
				return readContact{ringA: ri, ringB: ri, fold: true, at: v}, true
			}
			if d, _ := readPointSeg(prev, v, next); d <= tol {
				return readContact{ringA: ri, ringB: ri, fold: true, at: v}, true
			}
		}
	}
	sort.Slice(segs, func(i, j int) bool { return segs[i].minX < segs[j].minX })
	var best readContact
	found := false
	for i := range segs {
		s := &segs[i]
		for j := i + 1; j < len(segs) && segs[j].minX <= s.maxX+tol; j++ {
			t := &segs[j]
			if t.minY > s.maxY+tol || s.minY > t.maxY+tol {
				continue
			}
			if s.ring == t.ring {
				n := len(poly[s.ring])
				if (s.idx+1)%n == t.idx || (t.idx+1)%n == s.idx {
					continue
				}
			}
			d, at := readSegSeg(s.a, s.b, t.a, t.b)
			if d > tol {
				continue
			}
			c := readContact{ringA: min(s.ring, t.ring), ringB: max(s.ring, t.ring), at: at}
			// Report the same contact whatever the sweep order: the one
			// with the smallest rings, then the leftmost.
			if !found || c.ringA < best.ringA || c.ringA == best.ringA && (c.ringB < best.ringB || c.ringB == best.ringB && c.at.X < best.at.X) {
				best, found = c, true
			}
		}
	}
	return best, found
}

// readOrient is twice the signed area of triangle a, b, c.
func readOrient(a, b, c r2.Vec) float64 {
	return (b.X-a.X)*(c.Y-a.Y) - (b.Y-a.Y)*(c.X-a.X)
}

// readPointSeg returns the distance from p to segment ab and the point of
// the segment nearest to p.
func readPointSeg(p, a, b r2.Vec) (float64, r2.Vec) {
	ab := r2.Sub(b, a)
	l2 := ab.X*ab.X + ab.Y*ab.Y
	t := 0.0
	if l2 > 0 {
		t = ((p.X-a.X)*ab.X + (p.Y-a.Y)*ab.Y) / l2
		t = math.Max(0, math.Min(1, t))
	}
	q := r2.Vec{X: a.X + t*ab.X, Y: a.Y + t*ab.Y}
	return r2.Norm(r2.Sub(p, q)), q
}

// readSegSeg returns the distance between segments ab and cd and a point
// where they come closest.
func readSegSeg(a, b, c, d r2.Vec) (float64, r2.Vec) {
	o1, o2 := readOrient(a, b, c), readOrient(a, b, d)
	o3, o4 := readOrient(c, d, a), readOrient(c, d, b)
	if (o1 > 0 && o2 < 0 || o1 < 0 && o2 > 0) && (o3 > 0 && o4 < 0 || o3 < 0 && o4 > 0) {
		t := o3 / (o3 - o4)
		return 0, r2.Vec{X: a.X + t*(b.X-a.X), Y: a.Y + t*(b.Y-a.Y)}
	}
	best, at := math.Inf(1), a
	for _, q := range [4][3]r2.Vec{{c, a, b}, {d, a, b}, {a, c, d}, {b, c, d}} {
		if dist, _ := readPointSeg(q[0], q[1], q[2]); dist < best {
			best, at = dist, q[0]
		}
	}
	return best, at
}

// finish runs the scene-wide checks and builds the scene.
func (rd *sceneReader) finish() error {
	sc := rd.sc
	p := &sc.Problem
	var regions, potentials int
	for _, rf := range rd.feats {
		switch rf.part {
		case PartBody:
			sc.Bodies = append(sc.Bodies, Body{Feature: rf.index, Name: rf.name, Polygons: rf.polygons, Lines: rf.sheetLines(), Cond: rf.cond, Kutta: rf.kutta})
		case PartRegion:
			regions++
			sc.Regions = append(sc.Regions, Region{Feature: rf.index, Name: rf.name, Polygons: rf.polygons,
				Material: rf.mat, Permittivity: rf.perm, BreakdownField: rf.breakdown})
		case PartEdge:
			sc.Edges = append(sc.Edges, Edge{Feature: rf.index, Name: rf.name, Lines: rf.shaped, Cond: rf.cond})
		}
		if rf.part != PartRegion && rf.cond.Kind == Potential {
			potentials++
		}
	}
	p.Open = regions == 0
	if rd.openSet {
		p.Open = rd.open
	}
	if !p.Open && regions == 0 {
		return rd.errf(-1, "", "problem.open", `a closed scene ("open": false) needs a region to be the domain; add a region, or set "open": true`)
	}
	if p.Ground != nil {
		if !p.Open {
			return rd.errf(-1, "", "problem.ground", `a grounded plane bounds an open scene, and this scene is closed (it has regions and no "open": true); set "open": true, or remove "ground" and draw the ground as an edge`)
		}
		for _, rf := range rd.feats {
			low := math.Inf(1)
			for _, poly := range rf.polygons {
				for _, v := range poly[0] {
					low = math.Min(low, v.Y)
				}
			}
			for _, l := range rf.shaped {
				for _, v := range l {
					low = math.Min(low, v.Y)
				}
			}
			// In electrostatics a region (a substrate) and a body (a
			// conductor at 0 V, checked with the layout) may rest on the
			// grounded plane; nothing may reach below it, and an edge or a
			// flow body must stay strictly above.
			rests := p.Physics == Electrostatic && rf.part != PartEdge
			switch {
			case rests && low-p.Ground.Y < -rd.tol:
				return rd.errf(rf.index, rf.name, "coordinates", "reaches down to y = %s, below the grounded plane y = %s of problem.ground; the scene lies above the plane: move the plane down or the feature up",
					rd.unitFmt(low), rd.unitFmt(p.Ground.Y))
			case !rests && low-p.Ground.Y <= rd.tol:
				return rd.errf(rf.index, rf.name, "coordinates", "reaches down to y = %s, not strictly above the grounded plane y = %s of problem.ground; move the plane down or the feature up",
					rd.unitFmt(low), rd.unitFmt(p.Ground.Y))
			}
		}
	}
	if p.Physics == Flow && p.Open && p.Stream == nil {
		return rd.errf(-1, "", "problem.stream", `missing; an open flow scene needs the uniform stream at infinity: add "stream": {"speed": 1, "angle_deg": 0}`)
	}
	if p.Physics == Flow && p.Ground != nil && p.Stream != nil {
		// A slip wall along y = Y0 is a streamline only for a stream
		// along it.
		if a := math.Mod(p.Stream.AngleDeg, 180); a != 0 {
			return rd.errf(-1, "", "problem.stream.angle_deg", "is %s degrees, and over a ground plane the stream must run along it (0 or 180 degrees): set \"angle_deg\": 0 and pitch the section to its angle of attack instead", readFmt(p.Stream.AngleDeg))
		}
	}
	if !p.Open && potentials == 0 {
		return rd.errf(-1, "", "", `no reference potential: a closed scene fixes the potential only up to a constant unless some body or edge has a fixed "potential"; add "potential": 0 to one edge or body`)
	}
	for _, w := range rd.warnings {
		sc.Warnings = append(sc.Warnings, w.String())
	}
	return nil
}
