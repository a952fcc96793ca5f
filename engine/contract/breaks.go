package contract

// Break is a date at which a test placed a shift (a structural break or
// a regime shift): Label names what chose it ("ADF*"), Date is the first
// date of the new regime as the data write it, Index its zero-based
// position in the test's sample.
type Break struct {
	Label string `json:"label"`
	Date  string `json:"date"`
	Index int    `json:"index"`
}

// BreaksKey is the Outcome.Extra key under which a test stores its
// breaks; they then appear in the results file as "breaks".
const BreaksKey = "breaks"

// Breaks returns the break dates an outcome carries (nil if none), so
// that a figure or a comparison can mark them without knowing the test.
func (o *Outcome) Breaks() []Break {
	if o == nil {
		return nil
	}
	b, _ := o.Extra[BreaksKey].([]Break)
	return b
}
