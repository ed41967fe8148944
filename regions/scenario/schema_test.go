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
	whole, err := os.ReadFile("SCHEMA.md")
	if err != nil {
		t.Fatal(err)
	}
	// The part before the compare scenario files is about map scenarios.
	doc, _, _ := strings.Cut(string(whole), compareSection)
	blocks := regexp.MustCompile("(?s)```toml\n(.*?)```").FindAllStringSubmatch(doc, -1)
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
			if !strings.Contains(doc, "| `"+key+"` |") {
				t.Errorf("key %s.%s is not in a table of SCHEMA.md", table, key)
			}
		}
	}
}

// compareSection heads the part of SCHEMA.md about compare scenarios.
const compareSection = "## Compare scenario files"

// TestCompareSchemaDocument checks the compare part of SCHEMA.md: its
// example decodes and validates, and every key of every table is
// documented there.
func TestCompareSchemaDocument(t *testing.T) {
	whole, err := os.ReadFile("SCHEMA.md")
	if err != nil {
		t.Fatal(err)
	}
	_, doc, ok := strings.Cut(string(whole), compareSection)
	if !ok {
		t.Fatal("SCHEMA.md has no section on compare scenarios")
	}
	blocks := regexp.MustCompile("(?s)```toml\n(.*?)```").FindAllStringSubmatch(doc, -1)
	if len(blocks) != 1 {
		t.Fatalf("found %d TOML blocks; want the example", len(blocks))
	}
	c, err := DecodeCompare(strings.NewReader(blocks[0][1]), "SCHEMA.md")
	if err != nil {
		t.Fatal(err)
	}
	if err := c.Validate(); err != nil {
		t.Fatal(err)
	}
	for table, b := range compareBindings(&Compare{}) {
		for _, key := range keysOf(b) {
			if !strings.Contains(doc, "`"+key+"`") {
				t.Errorf("key %s.%s is not in the compare part of SCHEMA.md", table, key)
			}
		}
	}
	for _, key := range keysOf(panelBinding(&Panel{}, nil)) {
		if !strings.Contains(doc, "| `"+key+"`") {
			t.Errorf("panel key %s is not in a table of the compare part of SCHEMA.md", key)
		}
	}
}
