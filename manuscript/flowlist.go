package manuscript

import (
	"strings"

	"gopkg.in/yaml.v3"
)

// RejoinFlowLists mends the expression lists that YAML's flow syntax cuts
// apart: in `x: [dlog(y), lag(dlog(c), 1)]` the comma inside lag(…) ends
// an item for YAML, which reads "lag(dlog(c)" and "1)". Researchers write
// exactly this, so every flow sequence of plain scalars whose items do
// not balance their parentheses has consecutive items joined (with ", ")
// until each balances. It walks the whole tree in place.
func RejoinFlowLists(n *yaml.Node) {
	if n == nil {
		return
	}
	for _, c := range n.Content {
		RejoinFlowLists(c)
	}
	if n.Kind != yaml.SequenceNode || n.Style&yaml.FlowStyle == 0 {
		return
	}
	var out []*yaml.Node
	for i := 0; i < len(n.Content); i++ {
		c := n.Content[i]
		if c.Kind != yaml.ScalarNode || c.Style != 0 || depth(c.Value) <= 0 {
			out = append(out, c)
			continue
		}
		joined := *c
		j := i + 1
		for ; j < len(n.Content) && depth(joined.Value) > 0; j++ {
			next := n.Content[j]
			if next.Kind != yaml.ScalarNode || next.Style != 0 {
				break
			}
			joined.Value += ", " + next.Value
		}
		if depth(joined.Value) != 0 {
			out = append(out, c) // cannot mend: leave it for the expression parser to report
			continue
		}
		joined.Tag = "!!str"
		out = append(out, &joined)
		i = j - 1
	}
	n.Content = out
}

// depth is the count of "(" less the count of ")".
func depth(s string) int { return strings.Count(s, "(") - strings.Count(s, ")") }
