package unitroot

// citesOf joins the works behind several tests, each once.
func citesOf(tests []string) []string {
	var out []string
	seen := map[string]bool{}
	for _, t := range tests {
		for _, k := range lookupTest(t).Cites {
			if !seen[k] {
				seen[k] = true
				out = append(out, k)
			}
		}
	}
	return out
}
