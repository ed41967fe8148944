package scenario

import (
	"os"
	"regexp"
	"strings"
	"testing"
)

// TestSchemaDocument checks SCHEMA.md against the code: every TOML block
// in it decodes, the complete example also validates, and every key of
// every table is documented.
func TestSchemaDocument(t *testing.T) {
	doc, err := os.ReadFile("SCHEMA.md")
	if err != nil {
		t.Fatal(err)
	}
	blocks := regexp.MustCompile("(?s)```toml\n(.*?)```").FindAllStringSubmatch(string(doc), -1)
	if len(blocks) < 3 {
		t.Fatalf("found %d TOML blocks in SCHEMA.md; want the example and the fragments", len(blocks))
	}
	for i, b := range blocks {
		src := b[1]
		complete := strings.Contains(src, "schema = ")
		if !complete {
			src = "schema = 1\n" + src
		}
		s, err := Decode(strings.NewReader(src), "SCHEMA.md")
		if err != nil {
			t.Errorf("block %d: %v", i+1, err)
			continue
		}
		if complete {
			if err := s.Validate(); err != nil {
				t.Errorf("block %d does not validate: %v", i+1, err)
			}
		}
	}
	var s Scenario
	var tables []bool
	for table, b := range bindings(&s, &tables) {
		for _, key := range keysOf(b) {
			if !strings.Contains(string(doc), "| `"+key+"` |") {
				t.Errorf("key %s.%s is not in a table of SCHEMA.md", table, key)
			}
		}
	}
}
