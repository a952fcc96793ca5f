// Package kinds is the set of directive families a galley build knows:
// importing it registers every kind with the engine. The command line
// imports it; so do the tests that run whole manuscripts.
package kinds

import (
	_ "github.com/galley-econ/galley/directive/ardl"
	_ "github.com/galley-econ/galley/directive/coint"
	_ "github.com/galley-econ/galley/directive/dynamics"
	_ "github.com/galley-econ/galley/directive/ecm"
	_ "github.com/galley-econ/galley/directive/equation"
	_ "github.com/galley-econ/galley/directive/figure"
	_ "github.com/galley-econ/galley/directive/grid"
	_ "github.com/galley-econ/galley/directive/johansen"
	_ "github.com/galley-econ/galley/directive/longrun"
	_ "github.com/galley-econ/galley/directive/modeltable"
	_ "github.com/galley-econ/galley/directive/ols"
	_ "github.com/galley-econ/galley/directive/revision"
	_ "github.com/galley-econ/galley/directive/summary"
	_ "github.com/galley-econ/galley/directive/unitroot"
)
