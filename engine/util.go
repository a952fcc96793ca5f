package engine

import (
	"math"
	"strconv"
)

func sqrt(x float64) float64 { return math.Sqrt(x) }

func isNaN(x float64) bool { return math.IsNaN(x) }

func itoa(i int) string { return strconv.Itoa(i) }
