package main

import (
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"github.com/rimfield/rimfield/bem/job"
	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
)

const checkAbout = `
Reads and validates the scene, works out the boundaries (bodies subtracted
from regions, interfaces between regions), builds the panels and prints a
summary: physics, unit, open or closed domain, the bodies and edges with
their conditions in SI units and their panel counts, the regions with their
materials, the smallest and largest panel, warnings and cautions. Nothing is
solved and nothing is written. The exit status is 0 for a valid scene that
solve would accept; when solve would refuse a valid scene (a physics this
version cannot solve yet), check prints the summary and the reason and exits
with 1.`

func runCheck(args []string, stdout, stderr io.Writer) error {
	cl := newCommandLine("check", "rimfield check SCENE [flags]", checkAbout)
	panels := cl.fs.Int("panels", 0, "approximate total number of boundary panels, a count `N` (0: chosen automatically), as for solve")
	js := newJobs()
	js.addFlags(cl.fs)
	if helped, err := cl.parse(args, stdout); helped || err != nil {
		return err
	}
	pos, err := cl.positional("SCENE")
	if err != nil {
		return err
	}
	if *panels < 0 {
		return usagef("check: --panels %d is negative; give a panel count, or 0 for automatic", *panels)
	}
	sc, m, mo, err := prepare(pos[0], *panels)
	if err != nil {
		return err
	}
	j, refusal := js.forScene(sc.Problem.Physics)
	c, err := j.Check(&job.Setup{Scene: sc, Mesh: m, MeshOptions: mo})
	if err != nil {
		return err
	}
	if refusal != nil {
		c.Refusal = refusal
	}
	if _, err := io.WriteString(stdout, checkSummary(pos[0], sc, m, j.Words(), c)); err != nil {
		return err
	}
	if c.Refusal != nil {
		return fmt.Errorf("check: the scene is valid, but solve would refuse it: %w", c.Refusal)
	}
	return nil
}

// checkSummary describes a meshed scene for a person, in the job's words,
// with what the job's check adds.
func checkSummary(path string, sc *geom.Scene, m *mesh.Mesh, w *job.Words, c *job.Checked) string {
	lay := m.Layout
	var b strings.Builder
	domain := "closed (bounded by its regions)"
	if lay.Open {
		domain = "open (extends to infinity)"
	}
	fmt.Fprintf(&b, "scene    %s\n", path)
	fmt.Fprintf(&b, "physics  %s\n", sc.Problem.Physics)
	fmt.Fprintf(&b, "unit     %s (coordinates; results are SI)\n", sceneUnit(sc))
	fmt.Fprintf(&b, "domain   %s\n", domain)
	fmt.Fprintf(&b, "features %s, %s, %s\n", plural(len(sc.Bodies), "body", "bodies"),
		plural(len(sc.Regions), "region", "regions"), plural(len(sc.Edges), "edge", "edges"))

	if len(lay.Regions) > 0 {
		b.WriteString("\nregions\n")
		tw := tabwriter.NewWriter(&b, 0, 0, 2, ' ', 0)
		for _, d := range lay.Regions {
			fmt.Fprintf(tw, "  %s\t%s\n", d.Name, w.Material(d.Material))
		}
		tw.Flush()
	}

	sum := m.Summary()
	length := make([]float64, len(lay.Owners))
	for _, p := range m.Panels {
		if p.Owner >= 0 && p.Owner < len(length) && !p.Interface() {
			length[p.Owner] += p.Length()
		}
	}
	if len(lay.Owners) > 0 {
		b.WriteString("\nbodies and edges\n")
		tw := tabwriter.NewWriter(&b, 0, 0, 2, ' ', 0)
		fmt.Fprintf(tw, "  name\tpart\tcondition\tpanels\tlength (m)\n")
		for i, o := range lay.Owners {
			n := 0
			if i < len(sum.PerOwner) {
				n = sum.PerOwner[i].Panels
			}
			fmt.Fprintf(tw, "  %s\t%s\t%s\t%d\t%.6g\n", o.Name, o.Part, w.Condition(o.Cond), n, length[i])
		}
		tw.Flush()
	}
	fmt.Fprintf(&b, "\npanels   %d", sum.Panels)
	if walls := sum.Unowned - sum.Interfaces; walls > 0 || sum.Interfaces > 0 {
		fmt.Fprintf(&b, " (%d on insulated walls, %d on interfaces between regions)", walls, sum.Interfaces)
	}
	b.WriteString("\n")
	if sum.Panels > 0 {
		fmt.Fprintf(&b, "size     nominal %.4g m, smallest %.4g m, largest %.4g m, graded toward %d vertices\n",
			sum.Size, sum.Smallest, sum.Largest, sum.Graded)
	}

	if len(c.Lines) > 0 {
		b.WriteString("\n")
		for _, l := range c.Lines {
			fmt.Fprintf(&b, "%s\n", l)
		}
	}
	if c.Refusal != nil {
		fmt.Fprintf(&b, "\nsolve would refuse this scene: %v\n", c.Refusal)
	}

	b.WriteString("\nwarnings")
	warnings := append(append([]string(nil), sc.Warnings...), lay.Warnings...)
	if len(warnings) == 0 {
		b.WriteString(" none\n")
	} else {
		b.WriteString("\n")
		for _, w := range warnings {
			fmt.Fprintf(&b, "  - %s\n", w)
		}
	}
	b.WriteString("cautions (see CAUTIONS.md)\n")
	for _, cn := range c.Cautions {
		fmt.Fprintf(&b, "  - %s: %s\n", cn.Topic, cn.Text)
		for _, at := range cn.Where {
			x, y := float64(at.X), float64(at.Y)
			if at.Exponent != nil {
				at.Boundary += fmt.Sprintf(", field ~ r^%.2f", float64(*at.Exponent))
			}
			if u := sceneUnit(sc); u != "m" && sc.Problem.Scale > 0 {
				// Also in the scene's unit, as the user drew it.
				fmt.Fprintf(&b, "      at x = %.6g m, y = %.6g m = (%.6g, %.6g) %s (%s)\n", x, y, x/sc.Problem.Scale, y/sc.Problem.Scale, u, at.Boundary)
				continue
			}
			fmt.Fprintf(&b, "      at x = %.6g m, y = %.6g m (%s)\n", x, y, at.Boundary)
		}
	}
	return b.String()
}

func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return fmt.Sprintf("%d %s", n, many)
}
