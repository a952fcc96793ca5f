package manuscript

import (
	"fmt"

	"gopkg.in/yaml.v3"
)

// NameList is one name or a list of names.
type NameList []string

func (l *NameList) UnmarshalYAML(n *yaml.Node) error {
	switch n.Kind {
	case yaml.ScalarNode:
		*l = NameList{n.Value}
		return nil
	case yaml.SequenceNode:
		var s []string
		if err := n.Decode(&s); err != nil {
			return err
		}
		*l = s
		return nil
	}
	return fmt.Errorf("line %d: write one name or a list of names", n.Line)
}
