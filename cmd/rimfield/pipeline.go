package main

import (
	"errors"
	"fmt"
	"os"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
)

// prepare reads and validates the scene at path, lays it out and meshes it
// with about panels panels (0: automatic), and returns the options it
// meshed with. Scene errors are *geom.Error naming the file, the feature
// and the member.
func prepare(path string, panels int) (*geom.Scene, *mesh.Mesh, mesh.Options, error) {
	info, err := os.Stat(path)
	if err != nil {
		return nil, nil, mesh.Options{}, fmt.Errorf("cannot read scene: %w", err)
	}
	if info.IsDir() {
		return nil, nil, mesh.Options{}, fmt.Errorf("scene %s is a directory; give the scene file (for example %s/scene.geojson)", path, path)
	}
	sc, err := geom.ReadFile(path)
	if err != nil {
		return nil, nil, mesh.Options{}, err
	}
	lay, err := sc.Layout()
	if err != nil {
		var ge *geom.Error
		if errors.As(err, &ge) && ge.File == "" {
			ge.File = path
		}
		return nil, nil, mesh.Options{}, err
	}
	o := mesh.Options{Panels: panels}
	m, err := mesh.Build(lay, o)
	if err != nil {
		return nil, nil, mesh.Options{}, fmt.Errorf("%s: %w", path, err)
	}
	return sc, m, o, nil
}

// sceneUnit returns the coordinate unit of the scene, "m" when not given.
func sceneUnit(sc *geom.Scene) string {
	if sc.Problem.Unit == "" {
		return "m"
	}
	return sc.Problem.Unit
}
