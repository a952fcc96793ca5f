package dataio

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"syscall"
)

// Size limits of what galley reads. A data file of the limit's size is
// far beyond any time series a paper analyses (the CSV of a million
// rows of two columns is 16 MB); the limit only stops a runaway read.
const (
	// MaxDataBytes bounds a data file (CSV or XLSX) as stored on disk.
	MaxDataBytes = 256 << 20
	// MaxTextBytes bounds a manuscript or a results file.
	MaxTextBytes = 32 << 20
)

// OpenRegular opens path for reading, refusing anything that is not a
// regular file: a directory, a device such as /dev/zero, a named pipe
// (FIFO) or a socket. The file is opened without blocking (a FIFO with
// no writer would otherwise block the open forever) and its type is
// taken from the opened descriptor, so a file swapped after a check
// cannot slip through. A regular file larger than limit is refused.
func OpenRegular(path string, limit int64) (*os.File, error) {
	fh, err := os.OpenFile(path, os.O_RDONLY|syscall.O_NONBLOCK, 0)
	if err != nil {
		return nil, err
	}
	fi, err := fh.Stat()
	if err != nil {
		fh.Close()
		return nil, err
	}
	if err := regular(path, fi, limit); err != nil {
		fh.Close()
		return nil, err
	}
	return fh, nil
}

// CheckRegular is OpenRegular's test without reading: path must name a
// regular file of at most limit bytes (symbolic links are followed).
// It does not open the file, so it cannot block on a FIFO.
func CheckRegular(path string, limit int64) error {
	fi, err := os.Stat(path)
	if err != nil {
		return err
	}
	return regular(path, fi, limit)
}

func regular(path string, fi os.FileInfo, limit int64) error {
	m := fi.Mode()
	if !m.IsRegular() {
		what := "not a regular file"
		switch {
		case m.IsDir():
			what = "a folder, not a file"
		case m&os.ModeNamedPipe != 0:
			what = "a named pipe (FIFO), not a regular file"
		case m&os.ModeSocket != 0:
			what = "a socket, not a regular file"
		case m&os.ModeDevice != 0:
			what = "a device, not a regular file"
		}
		return fmt.Errorf("%s is %s; galley reads only ordinary files", path, what)
	}
	if fi.Size() > limit {
		return tooLarge(path, limit)
	}
	return nil
}

func tooLarge(path string, limit int64) error {
	return fmt.Errorf("%s is larger than %d MB, the most galley reads from one file", path, limit>>20)
}

// ReadFile reads a whole regular file of at most limit bytes (see
// OpenRegular). A file that grows past the limit while it is read is
// refused too.
func ReadFile(path string, limit int64) ([]byte, error) {
	fh, err := OpenRegular(path, limit)
	if err != nil {
		return nil, err
	}
	defer fh.Close()
	// One buffer of the file's size, from make: a large one comes from
	// fresh pages the runtime need not clear, where bytes.Buffer's Grow
	// clears what it allocates (a non-preemptible pass that a collection
	// waits on; at 118 MB it cost half a second) and io.ReadAll grows by
	// doubling, copying and clearing each time. The byte past the size
	// tells a file that grew while it was read.
	size := int64(bytes.MinRead)
	if fi, err := fh.Stat(); err == nil && fi.Size() <= limit {
		size = fi.Size() + 1
	}
	b := make([]byte, 0, size)
	for {
		n, err := fh.Read(b[len(b):cap(b)])
		b = b[:len(b)+n]
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		if int64(len(b)) > limit {
			return nil, tooLarge(path, limit)
		}
		if len(b) == cap(b) { // grew (or no size): room for more
			b = append(b, 0)[:len(b)]
		}
	}
	if int64(len(b)) > limit {
		return nil, tooLarge(path, limit)
	}
	return b, nil
}
