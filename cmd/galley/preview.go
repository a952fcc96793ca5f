package main

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"net"
	"net/url"
	"strconv"
	"sync"
	"time"
)

// previewServer answers the watch preview's requests on a loopback
// listener: GET (or HEAD) of a few fixed paths, one request per
// connection, over the subset of HTTP/1.1 (RFC 9112) that a browser's
// page load and fetch calls need. It replaces net/http's server, whose
// package initialisation (with crypto/tls and x509 behind it) every
// galley command paid at start-up, watch or not.
//
// A request's line and headers must arrive within previewReadTimeout
// and fit in previewMaxHeader bytes; anything else closes the
// connection. Each response says Connection: close.
type previewServer struct {
	ln    net.Listener
	route func(path string, query url.Values) previewResponse

	mu     sync.Mutex
	conns  map[net.Conn]struct{}
	closed bool
	wg     sync.WaitGroup
}

// previewResponse is what a route answers.
type previewResponse struct {
	status int    // 200, 204 or 404
	ctype  string // Content-Type, empty for none
	body   []byte
}

const (
	previewReadTimeout = 10 * time.Second
	previewMaxHeader   = 8 << 10
)

var errPreviewClosed = errors.New("preview server closed")

func newPreviewServer(ln net.Listener, route func(string, url.Values) previewResponse) *previewServer {
	return &previewServer{ln: ln, route: route, conns: map[net.Conn]struct{}{}}
}

// serve accepts connections until close is called (then it returns
// errPreviewClosed) or accepting fails.
func (s *previewServer) serve() error {
	for {
		c, err := s.ln.Accept()
		if err != nil {
			s.mu.Lock()
			closed := s.closed
			s.mu.Unlock()
			if closed {
				return errPreviewClosed
			}
			var ne net.Error
			if errors.As(err, &ne) && ne.Timeout() {
				time.Sleep(10 * time.Millisecond)
				continue
			}
			return err
		}
		s.mu.Lock()
		if s.closed {
			s.mu.Unlock()
			c.Close()
			return errPreviewClosed
		}
		s.conns[c] = struct{}{}
		s.wg.Add(1)
		s.mu.Unlock()
		go func() {
			defer s.wg.Done()
			s.handle(c)
			s.mu.Lock()
			delete(s.conns, c)
			s.mu.Unlock()
			c.Close()
		}()
	}
}

// close stops accepting, closes the open connections and waits for
// their handlers.
func (s *previewServer) close() {
	s.mu.Lock()
	s.closed = true
	s.ln.Close() // an error means it was closed already: what is wanted
	for c := range s.conns {
		c.Close()
	}
	s.mu.Unlock()
	s.wg.Wait()
}

// handle reads one request from c and writes its response.
func (s *previewServer) handle(c net.Conn) {
	c.SetDeadline(time.Now().Add(previewReadTimeout))
	method, target, ok := readPreviewRequest(bufio.NewReaderSize(c, 1024))
	if !ok {
		writePreviewResponse(c, false, previewResponse{status: 400, ctype: "text/plain; charset=utf-8", body: []byte("bad request\n")})
		return
	}
	head := method == "HEAD"
	if method != "GET" && !head {
		writePreviewResponse(c, false, previewResponse{status: 405, ctype: "text/plain; charset=utf-8", body: []byte("method not allowed\n")})
		return
	}
	u, err := url.ParseRequestURI(target)
	if err != nil || u.Host != "" || u.Scheme != "" {
		writePreviewResponse(c, head, previewResponse{status: 400, ctype: "text/plain; charset=utf-8", body: []byte("bad request\n")})
		return
	}
	q, _ := url.ParseQuery(u.RawQuery)
	writePreviewResponse(c, head, s.route(u.Path, q))
}

// readPreviewRequest reads the request line and the header lines up to
// the blank line that ends them, at most previewMaxHeader bytes, and
// returns the method and the request target.
func readPreviewRequest(r *bufio.Reader) (method, target string, ok bool) {
	n := 0
	line := func() ([]byte, bool) {
		var out []byte
		for {
			frag, err := r.ReadSlice('\n')
			n += len(frag)
			if n > previewMaxHeader {
				return nil, false
			}
			out = append(out, frag...)
			if err == nil {
				return bytes.TrimRight(out, "\r\n"), true
			}
			if !errors.Is(err, bufio.ErrBufferFull) {
				return nil, false
			}
		}
	}
	first, ok := line()
	if !ok {
		return "", "", false
	}
	parts := bytes.Split(first, []byte(" "))
	if len(parts) != 3 || !bytes.HasPrefix(parts[2], []byte("HTTP/1.")) || len(parts[0]) == 0 || len(parts[1]) == 0 {
		return "", "", false
	}
	for {
		h, ok := line()
		if !ok {
			return "", "", false
		}
		if len(h) == 0 {
			return string(parts[0]), string(parts[1]), true
		}
	}
}

var previewStatus = map[int]string{200: "OK", 204: "No Content", 400: "Bad Request", 404: "Not Found", 405: "Method Not Allowed"}

// writePreviewResponse writes resp (its body left out for HEAD and for
// 204) with Cache-Control: no-store and Connection: close.
func writePreviewResponse(c net.Conn, head bool, resp previewResponse) {
	var b bytes.Buffer
	fmt.Fprintf(&b, "HTTP/1.1 %d %s\r\n", resp.status, previewStatus[resp.status])
	if resp.ctype != "" {
		fmt.Fprintf(&b, "Content-Type: %s\r\nX-Content-Type-Options: nosniff\r\n", resp.ctype)
	}
	if resp.status == 405 {
		b.WriteString("Allow: GET, HEAD\r\n")
	}
	if resp.status != 204 {
		b.WriteString("Content-Length: " + strconv.Itoa(len(resp.body)) + "\r\n")
	}
	b.WriteString("Cache-Control: no-store\r\nConnection: close\r\n\r\n")
	if !head && resp.status != 204 {
		b.Write(resp.body)
	}
	c.Write(b.Bytes())
}
