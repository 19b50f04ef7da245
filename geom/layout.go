package geom

import "gonum.org/v1/gonum/spatial/r2"

// Outside marks the side of a piece that is not part of the domain (inside a
// body, or outside every region of a closed scene).
const Outside = -1

// Piece is a straight stretch of the domain's boundary or of an interface
// between two regions, in metres.
//
// A boundary piece has exactly one side in the domain and is oriented so
// that the domain lies on its Left: walking from A to B the domain is on the
// left, and the outward normal of the domain is the right normal
// (B-A rotated clockwise). Right is Outside.
//
// An interface piece has a region on both sides (Left != Right, both >= 0);
// its Cond is unused.
type Piece struct {
	A, B        r2.Vec
	Left, Right int // indices into Layout.Regions, or Outside
	// Owner is the index into Layout.Owners of the body or edge whose
	// condition the piece carries, or -1 (a region's insulated outer wall,
	// the grounded plane under a region resting on it (Cond a potential of
	// 0), or an interface).
	Owner int
	Cond  Condition // the condition in force on a boundary piece
	// SA and SB are the arc lengths along the owner as drawn at A and B
	// (metres): from the first coordinate of an edge or a sheet, through
	// its lines in order, or from the first vertex of a body's first ring,
	// counter-clockwise, through its rings in order. SB < SA where the
	// piece runs against the drawing. Drawn tells that they are set: false
	// for walls and interfaces.
	SA, SB float64
	Drawn  bool
}

// Interface reports whether both sides of the piece are domain.
func (p Piece) Interface() bool { return p.Left != Outside && p.Right != Outside }

// Part tells a body from an edge.
type Part uint8

const (
	PartBody Part = iota + 1
	PartEdge
	PartRegion
)

// String returns the scene-file name of the part.
func (p Part) String() string {
	switch p {
	case PartBody:
		return "body"
	case PartEdge:
		return "edge"
	case PartRegion:
		return "region"
	}
	return "invalid"
}

// Owner is a named body or edge: the unit results are reported by.
type Owner struct {
	Name    string
	Part    Part
	Feature int // index of the feature in the file
	Index   int // index into Scene.Bodies or Scene.Edges
	Cond    Condition
}

// Domain is one region of the domain with its material.
type Domain struct {
	Name       string
	Feature    int  // feature index, -1 for the background
	Background bool // the unbounded background of an open scene
	Material   Material
}

// Layout is the planar arrangement of a scene: every boundary and interface
// piece with what lies on each side. It is what the mesh and the solver need
// and nothing more.
type Layout struct {
	Pieces []Piece
	// Owners lists the bodies (in scene order) then the edges (in scene order).
	Owners []Owner
	// Regions lists the scene's regions in order, then the background last
	// when the scene is open.
	Regions []Domain
	Open    bool
	Ground  *Ground
	// Diagonal is the length of the scene's bounding-box diagonal in metres.
	Diagonal float64
	// Warnings are what the arrangement noticed that is allowed but may not
	// be meant (a region's hole that nothing fills), one sentence each.
	Warnings []string
	// Twin pairs the two faces of a sheet (a body of zero thickness): when
	// not nil it has one entry per piece, the index of the piece that is
	// the same stretch seen from the other side (its A and B swapped, the
	// same owner and condition), or -1. Both faces of a sheet segment
	// inside the domain are pieces, each with the domain on its Left (the
	// same region on both faces inside a region; the two regions of an
	// interface along which the sheet runs). A sheet face with no domain
	// behind it (a sheet along a region's outer boundary or a body's side)
	// is an ordinary boundary piece without a twin. nil when no piece has
	// a twin.
	Twin []int
}

// TwinOf returns the index of piece i's twin, or -1.
func (l *Layout) TwinOf(i int) int {
	if l.Twin == nil {
		return -1
	}
	return l.Twin[i]
}
