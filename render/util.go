package render

import (
	"math"
	"strconv"
)

func sqrt(x float64) float64 { return math.Sqrt(x) }

func itoa(i int) string { return strconv.Itoa(i) }
