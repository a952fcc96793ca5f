package engine

import (
	"bytes"
	"crypto/sha256"
	"encoding/binary"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strings"

	"github.com/galley-econ/galley/analysis/series"
	"github.com/galley-econ/galley/dataio"
	"github.com/galley-econ/galley/internal/atomicfile"
	"github.com/galley-econ/galley/manuscript"
	"github.com/galley-econ/galley/resultsfile"
)

// dataStore loads each data alias once per build and remembers the
// files read, with their hashes, for the results file.
type dataStore struct {
	doc    *Document
	frames map[string]*series.Frame
	errs   map[string]error
	read   map[string]string // relative path → sha256
	alias  map[string]string // relative path → the alias that named it
	files  map[string]*dataFile
	sums   map[string]*dataSums
}

func newDataStore(d *Document) *dataStore {
	return &dataStore{doc: d, frames: map[string]*series.Frame{}, errs: map[string]error{}, read: map[string]string{},
		alias: map[string]string{}, files: map[string]*dataFile{}, sums: map[string]*dataSums{}}
}

// dataFile is the file behind an alias as read in this build.
type dataFile struct {
	ref     manuscript.DataRef
	full    string // the path opened
	display string // the path in messages
	raw     []byte // dropped once the frame is parsed
	sum     string // sha256 of raw
}

// file reads the file behind alias once per build and records its hash
// for the results file.
func (s *dataStore) file(alias string) (*dataFile, error) {
	if df, ok := s.files[alias]; ok {
		return df, nil
	}
	ref, rel, err := s.path(alias)
	if err != nil {
		return nil, err
	}
	full, err := confine(s.doc.Dir, rel, s.doc.opts.AllowOutside)
	if err != nil {
		return nil, fmt.Errorf("data alias %q: %w", alias, err)
	}
	raw, err := dataio.ReadFile(full, dataio.MaxDataBytes)
	if err != nil {
		return nil, fmt.Errorf("data alias %q: %w", alias, err)
	}
	df := &dataFile{ref: ref, full: full, display: filepath.Join(s.doc.Dir, rel), raw: raw, sum: s.doc.opts.reads.noteBytes(full, raw)}
	s.read[filepath.ToSlash(rel)] = df.sum
	if a, ok := s.alias[filepath.ToSlash(rel)]; !ok || alias < a {
		s.alias[filepath.ToSlash(rel)] = alias
	}
	s.files[alias] = df
	return df, nil
}

// dataSums are what the cache and the checks need of a parsed file: its
// column names and the hash of each column and of its date axis (key
// ""). They are stored under the cache folder, keyed by the file's
// content hash and how it is read (dataSumsKey), so that a build whose
// results all come from the cache never parses the file.
type dataSums struct {
	Names  []string          `json:"names"`
	Hashes map[string]string `json:"hashes"`
}

// dataSumsKey names the stored sums of a file: its content hash, its
// format, sheet and declared frequency, and the hash rule's version.
func dataSumsKey(df *dataFile) string {
	h := sha256.New()
	for _, s := range []string{"galley-data-sums-2", df.sum, strings.ToLower(filepath.Ext(df.full)), df.ref.Sheet, df.ref.Freq().String()} {
		h.Write([]byte(s))
		h.Write([]byte{0})
	}
	return hex.EncodeToString(h.Sum(nil))
}

func (s *dataStore) sumsPath(df *dataFile) string {
	c := s.doc.opts.Cache
	if c == nil || c.Dir == "" {
		return ""
	}
	k := dataSumsKey(df)
	return filepath.Join(c.Dir, "data", k[:2], k+".json")
}

// columnSums returns the names and hashes of the data behind alias: from
// the frame if it is parsed, else from the stored sums of the same file,
// else by parsing it (and storing the sums).
func (s *dataStore) columnSums(alias string) (*dataSums, error) {
	if ds, ok := s.sums[alias]; ok {
		return ds, nil
	}
	if _, parsed := s.frames[alias]; !parsed {
		df, err := s.file(alias)
		if err != nil {
			return nil, err
		}
		if p := s.sumsPath(df); p != "" {
			if b, err := os.ReadFile(p); err == nil {
				var ds dataSums
				if json.Unmarshal(b, &ds) == nil && ds.Hashes != nil {
					s.sums[alias] = &ds
					return &ds, nil
				}
			}
		}
	}
	f, err := s.frame(alias)
	if err != nil {
		return nil, err
	}
	ds := &dataSums{Names: f.Names, Hashes: make(map[string]string, len(f.Names)+1)}
	ds.Hashes[""] = hashDates(f)
	for _, n := range f.Names {
		v, _ := f.Column(n)
		ds.Hashes[n] = hashValues(v)
	}
	s.sums[alias] = ds
	if p := s.sumsPath(s.files[alias]); p != "" {
		if b, err := json.Marshal(ds); err == nil {
			_ = atomicfile.WriteUnsynced(p, b, 0o644) // a failure costs a parse next time
		}
	}
	return ds, nil
}

// hashDates hashes a frame's date axis: its frequency, then each date's
// index on that frequency's time line (series.Date.Index, which numbers
// the dates of one frequency one to one) as 8 bytes.
func hashDates(f *series.Frame) string {
	h := sha256.New()
	h.Write([]byte(f.Freq.String()))
	buf := make([]byte, 0, 8*len(f.Dates))
	for _, dt := range f.Dates {
		buf = binary.LittleEndian.AppendUint64(buf, uint64(dt.Index()))
	}
	h.Write(buf)
	return hex.EncodeToString(h.Sum(nil))
}

// hashValues hashes a column's values as their IEEE 754 bits.
func hashValues(v []float64) string {
	buf := make([]byte, 0, 8*len(v))
	for _, x := range v {
		buf = binary.LittleEndian.AppendUint64(buf, math.Float64bits(x))
	}
	sum := sha256.Sum256(buf)
	return hex.EncodeToString(sum[:])
}

func (s *dataStore) inputs() []resultsfile.Input {
	var out []resultsfile.Input
	for p, h := range s.read {
		out = append(out, resultsfile.Input{Path: p, SHA256: h, Alias: s.alias[p]})
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Path < out[j].Path })
	return out
}

// aliases lists the front matter's data aliases.
func (s *dataStore) aliases() []string {
	var out []string
	for a := range s.doc.Meta.Data {
		out = append(out, a)
	}
	sort.Strings(out)
	return out
}

// path resolves an alias to a file path, honouring the vintage option.
func (s *dataStore) path(alias string) (manuscript.DataRef, string, error) {
	ref, ok := s.doc.Meta.Data[alias]
	if !ok {
		if len(s.doc.Meta.Data) == 0 {
			return ref, "", fmt.Errorf("unknown data alias %q: the front matter has no data: section", alias)
		}
		return ref, "", fmt.Errorf("unknown data alias %q%s; the front matter defines: %s", alias, manuscript.DidYouMean(alias, s.aliases()), strings.Join(s.aliases(), ", "))
	}
	p := ref.Path
	if v := s.doc.opts.Vintage; v != "" && v != "default" && len(ref.Vintage) > 0 {
		vp, ok := ref.Vintage[v]
		if !ok {
			var names []string
			for k := range ref.Vintage {
				names = append(names, k)
			}
			sort.Strings(names)
			return ref, "", fmt.Errorf("data alias %q has no vintage %q (it has %s)", alias, v, strings.Join(names, ", "))
		}
		p = vp
	} else if p == "" && len(ref.Vintage) > 0 {
		var names []string
		for k := range ref.Vintage {
			names = append(names, k)
		}
		sort.Strings(names)
		return ref, "", fmt.Errorf("data alias %q has only vintages (%s): choose one with --vintage", alias, strings.Join(names, ", "))
	}
	return ref, p, nil
}

// vintageOf is the vintage whose file the alias reads in this build, or
// "" when it reads its current (default) file.
func (s *dataStore) vintageOf(alias string) string {
	ref, ok := s.doc.Meta.Data[alias]
	v := s.doc.opts.Vintage
	if !ok || v == "" || v == "default" {
		return ""
	}
	if _, ok := ref.Vintage[v]; ok {
		return v
	}
	return ""
}

// frame loads the data behind an alias (once).
func (s *dataStore) frame(alias string) (*series.Frame, error) {
	if f, ok := s.frames[alias]; ok {
		return f, nil
	}
	if err, ok := s.errs[alias]; ok {
		return nil, err
	}
	f, err := s.load(alias)
	if err != nil {
		s.errs[alias] = err
		return nil, err
	}
	s.frames[alias] = f
	return f, nil
}

func (s *dataStore) load(alias string) (*series.Frame, error) {
	df, err := s.file(alias)
	if err != nil {
		return nil, err
	}
	raw := df.raw
	df.raw = nil // the frame holds what is needed from here on
	var f *series.Frame
	switch strings.ToLower(filepath.Ext(df.full)) {
	case ".xlsx":
		f, err = dataio.ReadXLSXAs(bytes.NewReader(raw), df.display, df.ref.Sheet, df.ref.Freq())
	default:
		if df.ref.Sheet != "" {
			return nil, fmt.Errorf("data alias %q: sheet is only for .xlsx files", alias)
		}
		f, err = series.ReadCSVBytesAs(raw, df.display, df.ref.Freq())
	}
	if err != nil {
		return nil, err
	}
	return f, nil
}

// confine resolves rel against root and refuses a result outside root
// (after following symlinks), unless allow is set.
func confine(root, rel string, allow bool) (string, error) {
	p := rel
	if !filepath.IsAbs(p) {
		p = filepath.Join(root, rel)
	}
	if allow {
		return p, nil
	}
	if filepath.IsAbs(rel) {
		return "", fmt.Errorf("path %q is absolute; data paths must be relative to the manuscript's folder (or pass --allow-outside)", rel)
	}
	absRoot, err := filepath.Abs(root)
	if err != nil {
		return "", err
	}
	realRoot, err := filepath.EvalSymlinks(absRoot)
	if err != nil {
		return "", err
	}
	absP, err := filepath.Abs(p)
	if err != nil {
		return "", err
	}
	if r, err := filepath.Rel(absRoot, absP); err != nil || r == ".." || strings.HasPrefix(r, ".."+string(filepath.Separator)) {
		return "", fmt.Errorf("path %q leads outside the manuscript's folder; refused (pass --allow-outside to permit it)", rel)
	}
	realP, err := filepath.EvalSymlinks(absP)
	if err != nil {
		if os.IsNotExist(err) {
			return "", fmt.Errorf("data file %s does not exist", filepath.Join(root, rel))
		}
		return "", err
	}
	r, err := filepath.Rel(realRoot, realP)
	if err != nil || r == ".." || strings.HasPrefix(r, ".."+string(filepath.Separator)) {
		return "", fmt.Errorf("path %q is a link that leads outside the manuscript's folder; refused (pass --allow-outside to permit it)", rel)
	}
	return realP, nil
}

// maxMagnitude is the largest absolute value an analysis accepts: the
// square of anything larger overflows float64 (about 1.8e308).
const maxMagnitude = 1e150

// Data is a set of aligned series for one analysis: a common sample with
// no missing values.
type Data struct {
	Freq   series.Freq
	Dates  []series.Date
	Cols   [][]float64
	Labels []string // the expressions as written
	Frame  *series.Frame
	// Dropped are the dates inside the sample left out for missing values
	// (with missing: drop).
	Dropped []series.Date
	// Clipped says how the sample window was cut to the data of an
	// earlier vintage ("" when it was not).
	Clipped string
}

// N is the number of observations.
func (d *Data) N() int { return len(d.Dates) }

// Range is "FIRST–LAST" of the sample.
func (d *Data) Range() string {
	if len(d.Dates) == 0 {
		return "empty"
	}
	return d.Dates[0].String() + "–" + d.Dates[len(d.Dates)-1].String()
}

// SampleNote is "Sample 2004-01–2025-12, N = 264." and, when
// observations with missing values were dropped, which ones.
func (d *Data) SampleNote() string {
	s := fmt.Sprintf("Sample %s, N = %d.", d.Range(), d.N())
	if len(d.Dropped) > 0 {
		var ds []string
		for _, x := range d.Dropped {
			ds = append(ds, x.String())
		}
		s += fmt.Sprintf(" %d observations with missing values inside the sample were left out (%s); lags and differences span the gaps as if the remaining observations were consecutive.", len(d.Dropped), strings.Join(ds, ", "))
	}
	if d.Clipped != "" {
		s += " " + d.Clipped
	}
	return s
}

// Data evaluates expressions on the data behind alias, restricts them to
// sample (may be ""), and aligns them on their common non-missing span.
// dataKey, exprKey and sampleKey name the YAML keys for error positions.
func (c *Context) Data(alias string, exprs []string, sample string) (*Data, error) {
	return c.DataUsing(alias, exprs, sample, c.b.dir.Base().Missing)
}

// DataUsing is Data with the missing-value rule given ("error" or "",
// or "drop") instead of the directive's own: a directive that builds on
// another's relation reads the data as that directive did.
func (c *Context) DataUsing(alias string, exprs []string, sample, missing string) (*Data, error) {
	f, err := c.doc.data.frame(alias)
	if err != nil {
		return nil, c.Wrap("data", err)
	}
	ss := make([]*series.Series, len(exprs))
	c.b.deps.col(alias, "")
	for i, s := range exprs {
		e, err := series.ParseExpr(s)
		if err != nil {
			return nil, c.Errorf(c.exprKey(s), "%v", err)
		}
		for _, col := range e.Columns() {
			c.b.deps.col(alias, col)
		}
		v, err := series.Eval(e, f)
		if err != nil {
			return nil, c.Errorf(c.exprKey(s), "%v", err)
		}
		v.Name = s
		ss[i] = v
	}
	clipped := ""
	if sample != "" {
		w, err := series.ParseWindow(sample)
		if err != nil {
			return nil, c.Errorf("sample", "sample %q: %v", sample, err)
		}
		// A sample written for the current data may reach past an
		// earlier, shorter vintage: in a build on that vintage it is cut
		// to the data, and the sample note says so.
		vintage := c.doc.data.vintageOf(alias)
		if vintage != "" {
			if cw, moved := w.Clip(f.Dates); moved {
				clipped = fmt.Sprintf("Warning: the sample %s reaches past the data of vintage %q (%s to %s) and was cut to %s.", w, vintage, f.Dates[0], f.Dates[len(f.Dates)-1], cw)
				w = cw
			}
		}
		for i := range ss {
			if ss[i], err = w.Apply(ss[i]); err != nil {
				if vintage != "" {
					return nil, c.Errorf("sample", "%v (in the build on vintage %q of data alias %q)", err, vintage, alias)
				}
				return nil, c.Errorf("sample", "%v", err)
			}
		}
	}
	// the series were evaluated for this call alone: Owned
	al, err := series.AlignWith(ss, series.AlignOptions{Frame: f, DropMissing: missing == "drop", Owned: true})
	if err != nil {
		return nil, c.Errorf("", "%v", err)
	}
	for j, col := range al.Values {
		for i, v := range col {
			if math.Abs(v) > maxMagnitude {
				return nil, c.Errorf(c.exprKey(exprs[j]), "%s: %s is %g on %s (line %d): values this large overflow sums of squares; rescale the series (divide by a power of ten, or take logs)",
					f.Source, exprs[j], v, al.Dates[i], f.LineOf(al.Dates[i]))
			}
		}
	}
	return &Data{Freq: f.Freq, Dates: al.Dates, Cols: al.Values, Labels: exprs, Frame: f, Dropped: al.Dropped, Clipped: clipped}, nil
}

// CheckData validates an alias, expressions and a sample without running.
func (c *Context) CheckData(alias string, exprs []string, sample string) error {
	if alias == "" {
		if len(c.doc.Meta.Data) == 1 {
			return nil
		}
		return c.Errorf("", "galley %s: the key \"data\" is required", c.b.kind.Name)
	}
	// The column names only: from the stored sums of the same file when
	// there are some, so that a check does not parse the data.
	sums, err := c.doc.data.columnSums(alias)
	if err != nil {
		return c.Wrap("data", err)
	}
	names := &series.Frame{Names: sums.Names}
	for _, s := range exprs {
		e, err := series.ParseExpr(s)
		if err != nil {
			return c.Errorf(c.exprKey(s), "%v", err)
		}
		for _, col := range e.Columns() {
			if !names.Has(col) {
				hint := ""
				if cl := names.Closest(col); cl != "" {
					hint = " (did you mean " + cl + "?)"
				}
				return c.Errorf(c.exprKey(s), "series %q: %s has no column %q%s", s, c.doc.data.files[alias].display, col, hint)
			}
		}
	}
	if sample != "" {
		if _, err := series.ParseWindow(sample); err != nil {
			return c.Errorf("sample", "sample %q: %v", sample, err)
		}
	}
	return nil
}

// DataAlias returns alias, or the only alias when alias is "".
func (c *Context) DataAlias(alias string) string {
	if alias == "" && len(c.doc.Meta.Data) == 1 {
		for a := range c.doc.Meta.Data {
			return a
		}
	}
	return alias
}

// exprKey finds the YAML key whose value mentions the expression, for the
// error position; falls back to the fence line.
func (c *Context) exprKey(expr string) string {
	n := c.b.node
	if n == nil {
		return ""
	}
	for i := 0; i+1 < len(n.Content); i += 2 {
		v := n.Content[i+1]
		if v.Value == expr {
			return n.Content[i].Value
		}
		for _, e := range v.Content {
			if e.Value == expr {
				return n.Content[i].Value
			}
		}
	}
	return ""
}

// Constant reports whether column j takes one value at every
// observation of the sample (and there is more than one).
func (d *Data) Constant(j int) bool {
	col := d.Cols[j]
	if len(col) < 2 {
		return false
	}
	for _, v := range col[1:] {
		if v != col[0] {
			return false
		}
	}
	return true
}

// RefuseConstant returns an error for the first of the columns cols of
// d (every column when cols is empty) that is constant over the sample:
// a regression on it, or of it, is degenerate, and its statistics are
// rounding noise. The error is at key, or at the key whose value names
// the column's expression when key is ""; why says what the directive
// cannot do with it.
func (c *Context) RefuseConstant(d *Data, key, why string, cols ...int) error {
	if len(cols) == 0 {
		for j := range d.Cols {
			cols = append(cols, j)
		}
	}
	for _, j := range cols {
		if !d.Constant(j) {
			continue
		}
		k := key
		if k == "" {
			k = c.exprKey(d.Labels[j])
		}
		return c.Errorf(k, "%s is constant (%.6g at all %d observations, %s): %s", d.Labels[j], d.Cols[j][0], d.N(), d.Range(), why)
	}
	return nil
}
