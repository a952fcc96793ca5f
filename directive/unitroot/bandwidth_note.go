package unitroot

import (
	"fmt"

	"github.com/galley-econ/galley/analysis/unitroot"
)

// bandwidthText describes how the Bartlett lag L of a PP or KPSS test was
// set, for the table note: the rule by name, and for the automatic rules
// the method and that L is the integer part of the chosen bandwidth.
func bandwidthText(b unitroot.Bandwidth, l int) string {
	switch b.Rule {
	case unitroot.AutoNeweyWest:
		return fmt.Sprintf("%d Bartlett lags, chosen automatically by Newey and West's (1994) rule from the residuals (preliminary lag ⌊4(T/100)^(2/9)⌋; the lag is the integer part of the estimated bandwidth)", l)
	case unitroot.AutoHobijn:
		return fmt.Sprintf("%d Bartlett lags, chosen automatically by the rule of Hobijn, Franses and Ooms (1998) from the residuals (Newey and West's 1994 method with preliminary lag ⌊T^(2/9)⌋; the lag is the integer part of the estimated bandwidth)", l)
	case unitroot.Schwert4:
		return fmt.Sprintf("%d Bartlett lags (⌊4(T/100)^(1/4)⌋)", l)
	case unitroot.Schwert12:
		return fmt.Sprintf("%d Bartlett lags (⌊12(T/100)^(1/4)⌋)", l)
	}
	return fmt.Sprintf("%d Bartlett lags (as given)", l)
}
