package manuscript

import (
	"errors"
	"fmt"
)

// PosError is an error at a place in an input file.
type PosError struct {
	File string
	Line int // 1-based; 0 if unknown
	Msg  string
	Err  error
}

func (e *PosError) Error() string {
	loc := e.File
	if e.Line > 0 {
		loc = fmt.Sprintf("%s:%d", e.File, e.Line)
	}
	if e.Err != nil && e.Msg == "" {
		return loc + ": " + e.Err.Error()
	}
	if e.Err != nil {
		return loc + ": " + e.Msg + ": " + e.Err.Error()
	}
	return loc + ": " + e.Msg
}

func (e *PosError) Unwrap() error { return e.Err }

func ErrAt(file string, line int, format string, args ...any) error {
	return &PosError{File: file, Line: line, Msg: fmt.Sprintf(format, args...)}
}

// WrapAt attaches a position to err unless it already carries one.
func WrapAt(file string, line int, err error) error {
	var pe *PosError
	if errors.As(err, &pe) {
		return err
	}
	return &PosError{File: file, Line: line, Err: err}
}
