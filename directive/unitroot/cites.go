package unitroot

// testCites are the works behind each test and its critical values, as
// keys of galley's reference table (manuscript.MethodBib).
var testCites = map[string][]string{
	"adf":      {"dickey-fuller-1979", "said-dickey-1984", "mackinnon-2010", "mackinnon-1994"},
	"pp":       {"phillips-perron-1988", "mackinnon-2010", "mackinnon-1994", "newey-west-1994"},
	"kpss":     {"kpss-1992", "newey-west-1994"},
	"dfgls":    {"ers-1996"},
	"za":       {"zivot-andrews-1992"},
	"ngperron": {"ng-perron-2001"},
}

// citesOf joins the works behind several tests, each once.
func citesOf(tests []string) []string {
	var out []string
	seen := map[string]bool{}
	for _, t := range tests {
		for _, k := range testCites[t] {
			if !seen[k] {
				seen[k] = true
				out = append(out, k)
			}
		}
	}
	return out
}
