package markdown

import "testing"

// TestCaption: a table or figure without a caption gets its label alone,
// without a dangling period; a caption is escaped.
func TestCaption(t *testing.T) {
	if got := mdCaption("Table 1", ""); got != "**Table 1**" {
		t.Errorf("no caption: %q", got)
	}
	if got := mdCaption("Table A.2", "Tests of *all* series"); got != `**Table A.2.** Tests of \*all\* series` {
		t.Errorf("caption: %q", got)
	}
}
