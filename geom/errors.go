package geom

import (
	"fmt"
	"strings"
)

// Error is an error in a scene, naming the feature and the member at fault.
// Feature is the index of the feature in the file, or -1 for an error that
// belongs to no one feature (the problem member, the scene as a whole).
// Read, ReadFile and Scene.Layout return it as *Error for bad input, so a
// caller may find the feature with errors.As.
type Error struct {
	Feature int
	Name    string // the feature's name
	Member  string // the member at fault ("geometry", a property key, "problem.unit", ...)
	Msg     string // what is wrong and the fix
	File    string // the scene file's path when known (ReadFile sets it)
}

// Error formats the error as
//
//	geom: feature 3 ("gate"), member "geometry": <Msg>
//
// or, for Feature -1, as "geom: member "problem.unit": <Msg>", or
// "geom: <Msg>" without a member. The file's path, when known, follows
// "geom: ".
func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString("geom: ")
	if e.File != "" {
		b.WriteString(e.File)
		b.WriteString(": ")
	}
	if e.Feature >= 0 {
		fmt.Fprintf(&b, "feature %d", e.Feature)
		if e.Name != "" {
			fmt.Fprintf(&b, " (%q)", e.Name)
		}
		if e.Member != "" {
			fmt.Fprintf(&b, ", member %q", e.Member)
		}
		b.WriteString(": ")
	} else if e.Member != "" {
		fmt.Fprintf(&b, "member %q: ", e.Member)
	}
	b.WriteString(e.Msg)
	return b.String()
}
