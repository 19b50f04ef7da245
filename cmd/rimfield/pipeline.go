package main

import (
	"errors"
	"fmt"
	"os"

	"github.com/rimfield/rimfield/geom"
	"github.com/rimfield/rimfield/mesh"
)

// prepare reads and validates the scene at path, lays it out and meshes it
// with about panels panels (0: automatic). Scene errors are *geom.Error
// naming the file, the feature and the member.
func prepare(path string, panels int) (*geom.Scene, *mesh.Mesh, error) {
	info, err := os.Stat(path)
	if err != nil {
		return nil, nil, fmt.Errorf("cannot read scene: %w", err)
	}
	if info.IsDir() {
		return nil, nil, fmt.Errorf("scene %s is a directory; give the scene file (for example %s/scene.geojson)", path, path)
	}
	sc, err := geom.ReadFile(path)
	if err != nil {
		return nil, nil, err
	}
	lay, err := sc.Layout()
	if err != nil {
		var ge *geom.Error
		if errors.As(err, &ge) && ge.File == "" {
			ge.File = path
		}
		return nil, nil, err
	}
	m, err := mesh.Build(lay, mesh.Options{Panels: panels})
	if err != nil {
		return nil, nil, fmt.Errorf("%s: %w", path, err)
	}
	return sc, m, nil
}
