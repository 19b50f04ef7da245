package job

import (
	"encoding/json"
	"math"
)

// Number is a float64 that JSON writes at full precision, and as null when
// it is NaN or infinite (JSON has no such numbers).
type Number float64

// MarshalJSON writes the shortest decimal that reads back as the same
// float64, or null.
func (n Number) MarshalJSON() ([]byte, error) {
	f := float64(n)
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return []byte("null"), nil
	}
	return json.Marshal(f)
}

// Numbers converts a slice of float64.
func Numbers(v []float64) []Number {
	out := make([]Number, len(v))
	for i, x := range v {
		out[i] = Number(x)
	}
	return out
}

// Numbers2 converts a matrix of float64, row by row.
func Numbers2(m [][]float64) [][]Number {
	out := make([][]Number, len(m))
	for i, row := range m {
		out[i] = Numbers(row)
	}
	return out
}
