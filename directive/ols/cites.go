package ols

import "strings"

// seCites are the works behind the standard errors asked for, as keys of
// galley's reference table (manuscript.MethodBib).
func seCites(se string) []string {
	switch {
	case strings.HasPrefix(se, "hac"):
		return []string{"newey-west-1987"}
	case se == "hc1":
		return []string{"white-1980"}
	}
	return nil
}
