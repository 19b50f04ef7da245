package geom

import "fmt"

// Error is an error in a scene, naming the feature and the member at fault.
// Feature is the index of the feature in the file, or -1 for an error that
// belongs to no one feature (the problem member, the scene as a whole).
type Error struct {
	Feature int
	Name    string // the feature's name
	Member  string // the member at fault ("geometry", a property key, ...)
	Msg     string // what is wrong and the fix
}

// Error formats the error as
//
//	geom: feature 3 ("gate"), member "geometry": <Msg>
//
// or, for Feature -1, as "geom: <Msg>".
func (e *Error) Error() string {
	if e.Feature < 0 {
		return "geom: " + e.Msg
	}
	if e.Member == "" {
		return fmt.Sprintf("geom: feature %d (%q): %s", e.Feature, e.Name, e.Msg)
	}
	return fmt.Sprintf("geom: feature %d (%q), member %q: %s", e.Feature, e.Name, e.Member, e.Msg)
}
