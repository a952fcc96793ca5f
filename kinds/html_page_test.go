package kinds

import (
	"strings"
	"testing"

	"github.com/galley-econ/galley/engine"
	"github.com/galley-econ/galley/write/html"
)

// TestHTMLPageBodyOnce: the body is spliced into the page template
// after it runs; a title and an abstract that spell the template's
// placeholder for the body reach the page escaped, and the body appears
// once, between the front matter and the end of the article.
func TestHTMLPageBodyOnce(t *testing.T) {
	t.Parallel()
	doc := "---\ntitle: \"A <!--galley:body--> title\"\nabstract: \"<!--galley:body-->\"\n---\n\nThe one paragraph of the body.\n"
	p := writeProject(t, doc, nil)
	d, err := engine.Parse(p, engine.Options{})
	if err != nil {
		t.Fatal(err)
	}
	if err := d.Run(); err != nil {
		t.Fatal(err)
	}
	b, err := html.Write(d, html.Options{Script: "<script>/*hook*/</script>"})
	if err != nil {
		t.Fatal(err)
	}
	page := string(b)
	if strings.Contains(page, "<!--galley:body-->") {
		t.Error("the placeholder reached the page unescaped")
	}
	if n := strings.Count(page, "The one paragraph of the body."); n != 1 {
		t.Fatalf("the body appears %d times", n)
	}
	body, front, hook := strings.Index(page, "The one paragraph"), strings.Index(page, "</header>"), strings.Index(page, "/*hook*/")
	if !(front < body && body < strings.Index(page, "</article>") && strings.Index(page, "</article>") < hook) {
		t.Errorf("the body is out of place:\n%s", page[front:])
	}
}
