package main

import (
	"io"
	"net"
	"net/http"
	"net/url"
	"strings"
	"testing"
	"time"
)

// TestPreviewServer: the preview server answers a real HTTP client
// (net/http's, as a browser would be) on each route, leaves the body out
// for HEAD and 204, refuses other methods, malformed request lines,
// absolute-form targets and oversized headers, and closes promptly with
// a connection open that never sends a request.
func TestPreviewServer(t *testing.T) {
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	var seen []string
	s := newPreviewServer(ln, func(path string, q url.Values) previewResponse {
		switch path {
		case "/":
			return previewResponse{status: 200, ctype: "text/html; charset=utf-8", body: []byte("<p>page</p>")}
		case "/seen":
			seen = append(seen, q.Get("v"))
			return previewResponse{status: 204}
		}
		return previewResponse{status: 404, ctype: "text/plain; charset=utf-8", body: []byte("404 page not found\n")}
	})
	served := make(chan error, 1)
	go func() { served <- s.serve() }()
	base := "http://" + ln.Addr().String()

	get := func(method, path string) (*http.Response, string) {
		t.Helper()
		req, _ := http.NewRequest(method, base+path, nil)
		resp, err := http.DefaultClient.Do(req)
		if err != nil {
			t.Fatalf("%s %s: %v", method, path, err)
		}
		defer resp.Body.Close()
		b, _ := io.ReadAll(resp.Body)
		return resp, string(b)
	}
	if resp, body := get("GET", "/"); resp.StatusCode != 200 || body != "<p>page</p>" ||
		resp.Header.Get("Content-Type") != "text/html; charset=utf-8" || resp.Header.Get("Cache-Control") != "no-store" {
		t.Errorf("GET /: %d %q %v", resp.StatusCode, body, resp.Header)
	}
	if resp, body := get("HEAD", "/"); resp.StatusCode != 200 || body != "" || resp.ContentLength != int64(len("<p>page</p>")) {
		t.Errorf("HEAD /: %d %q length %d", resp.StatusCode, body, resp.ContentLength)
	}
	if resp, body := get("GET", "/seen?v=7"); resp.StatusCode != 204 || body != "" || len(seen) != 1 || seen[0] != "7" {
		t.Errorf("GET /seen?v=7: %d %q, seen %v", resp.StatusCode, body, seen)
	}
	if resp, _ := get("GET", "/elsewhere"); resp.StatusCode != 404 {
		t.Errorf("GET /elsewhere: %d", resp.StatusCode)
	}
	if resp, _ := get("POST", "/"); resp.StatusCode != 405 || resp.Header.Get("Allow") != "GET, HEAD" {
		t.Errorf("POST /: %d %v", resp.StatusCode, resp.Header)
	}

	raw := func(req string) string {
		t.Helper()
		c, err := net.Dial("tcp", ln.Addr().String())
		if err != nil {
			t.Fatal(err)
		}
		defer c.Close()
		c.SetDeadline(time.Now().Add(5 * time.Second))
		io.WriteString(c, req)
		b, _ := io.ReadAll(c)
		return string(b)
	}
	for _, req := range []string{
		"GET /\r\n\r\n",
		"GET / HTTP/2.0 extra\r\n\r\n",
		"GET http://example.org/ HTTP/1.1\r\n\r\n",
		"GET / HTTP/1.1\r\nX: " + strings.Repeat("a", previewMaxHeader) + "\r\n\r\n",
	} {
		if got := raw(req); !strings.HasPrefix(got, "HTTP/1.1 400 ") {
			t.Errorf("%.40q: got %.60q, want 400", req, got)
		}
	}

	idle, err := net.Dial("tcp", ln.Addr().String())
	if err != nil {
		t.Fatal(err)
	}
	defer idle.Close()
	time.Sleep(20 * time.Millisecond) // accepted, waiting for a request
	start := time.Now()
	s.close()
	if err := <-served; err != errPreviewClosed {
		t.Errorf("serve returned %v after close", err)
	}
	if d := time.Since(start); d > 2*time.Second {
		t.Errorf("close took %v with an idle connection open", d)
	}
}
