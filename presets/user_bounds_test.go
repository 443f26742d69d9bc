package presets

import (
	"errors"
	"os"
	"strings"
	"testing"
	"time"

	"github.com/BurntSushi/toml"
)

// Deep files of every kind the decoder nests (issue 16: nested inline
// tables 16,000 deep cost 42 s and 7 GB): refused with a short message, on
// the right line, before decoding, in well under a second.
func TestBoundsRefuse(t *testing.T) {
	deep := func(kind string, n int) string {
		switch kind {
		case "inline":
			return "x = " + strings.Repeat("{a=", n) + "1" + strings.Repeat("}", n) + "\n"
		case "array":
			return "x = " + strings.Repeat("[", n) + "1" + strings.Repeat("]", n) + "\n"
		case "dotted":
			return strings.Repeat("a.", n) + "a = 1\n"
		case "header":
			return "[" + strings.Repeat("a.", n) + "a]\n"
		case "inline-dotted":
			return "x = {" + strings.Repeat("a.", n) + "a = 1}\n"
		case "tables-in-array":
			return "x = [" + strings.Repeat("{a=[", n) + strings.Repeat("]}", n) + "]\n"
		}
		panic(kind)
	}
	for _, kind := range []string{"inline", "array", "dotted", "header", "inline-dotted", "tables-in-array"} {
		src := "# my presets\n\n" + deep(kind, 16000)
		start := time.Now()
		_, err := LoadUser(strings.NewReader(src), "presets.toml")
		d := time.Since(start)
		var pe *ParseError
		if !errors.As(err, &pe) || !errors.Is(err, ErrTooDeep) || pe.Line != 3 {
			t.Errorf("%s: %v", kind, err)
			continue
		}
		if n := len(err.Error()); n > 120 {
			t.Errorf("%s: message of %d characters: %q", kind, n, err)
		}
		if d > time.Second {
			t.Errorf("%s 16,000 deep refused after %v", kind, d)
		}
	}
	// A key path too long: one long name, and a long header with a key.
	for name, src := range map[string]string{
		"long key":    strings.Repeat("k", 1025) + " = 1\n",
		"long header": "[" + strings.Repeat("t", 600) + "]\n" + strings.Repeat("k", 424) + " = 1\n",
		"quoted":      "\"" + strings.Repeat("q", 1100) + "\" = 1\n",
	} {
		_, err := LoadUser(strings.NewReader(src), "presets.toml")
		if !errors.Is(err, ErrKeyPathTooLong) || len(err.Error()) > 120 {
			t.Errorf("%s: %v", name, err)
		}
	}
}

// The limits are where they say: 64 levels and 1,024 characters pass, one
// more is refused.
func TestBoundsLimits(t *testing.T) {
	cases := []struct {
		name string
		src  string
		want error
	}{
		{"inline 64", "x = " + strings.Repeat("{a=", 63) + "1" + strings.Repeat("}", 63), nil},
		{"inline 65", "x = " + strings.Repeat("{a=", 64) + "1" + strings.Repeat("}", 64), ErrTooDeep},
		{"array 64", "x = " + strings.Repeat("[", 63) + "1" + strings.Repeat("]", 63), nil},
		{"array 65", "x = " + strings.Repeat("[", 64) + "1" + strings.Repeat("]", 64), ErrTooDeep},
		{"dotted 64", strings.Repeat("a.", 63) + "a = 1", nil},
		{"dotted 65", strings.Repeat("a.", 64) + "a = 1", ErrTooDeep},
		{"header 63 + key", "[" + strings.Repeat("a.", 62) + "a]\nk = 1", nil},
		{"header 64 + key", "[" + strings.Repeat("a.", 63) + "a]\nk = 1", ErrTooDeep},
		{"key 1024", strings.Repeat("k", 1024) + " = 1", nil},
		{"key 1025", strings.Repeat("k", 1025) + " = 1", ErrKeyPathTooLong},
		{"table.key 1024", "[" + strings.Repeat("t", 500) + "]\n" + strings.Repeat("k", 523) + " = 1", nil},
		{"table.key 1025", "[" + strings.Repeat("t", 500) + "]\n" + strings.Repeat("k", 524) + " = 1", ErrKeyPathTooLong},
		// Brackets in strings and comments are not nesting.
		{"braces in a string", `x = "` + strings.Repeat("{[", 5000) + `"`, nil},
		{"braces in a literal", `x = '` + strings.Repeat("{[", 5000) + `'`, nil},
		{"braces in a multi-line string", "x = \"\"\"\n" + strings.Repeat("{[\n", 5000) + `"""`, nil},
		{"braces in a comment", "# " + strings.Repeat("{[", 5000), nil},
		{"escaped quote", `x = "a\"` + strings.Repeat("{", 100) + `"`, nil},
		{"arrays of tables", strings.Repeat("[[hose]]\nid = \"h\"\n", 2000), nil},
	}
	for _, k := range cases {
		_, err := checkBounds(k.src)
		if k.want == nil && err != nil || k.want != nil && !errors.Is(err, k.want) {
			t.Errorf("%s: %v, want %v", k.name, err, k.want)
		}
	}
	// The shipped files pass.
	for _, f := range []string{"catalogue.toml", "testdata/user.toml"} {
		b, err := os.ReadFile(f)
		if err != nil {
			t.Fatal(err)
		}
		if _, err := checkBounds(string(b)); err != nil {
			t.Errorf("%s: %v", f, err)
		}
	}
}

// Linear in the depth, counted rather than timed (a timing ratio flakes on a
// loaded machine): the scan of a file 16 times deeper takes 16 times the
// steps, where a quadratic scan would take 256 times. And the real check
// stops at the limit: the 16,000-deep file of the issue is refused at once.
func TestBoundsLinear(t *testing.T) {
	steps := func(src string) int {
		s := &bounds{src: src, line: 1}
		for s.i < len(s.src) {
			s.err = nil
			s.steps++
			if len(s.stack) == 0 {
				s.topLevel()
			} else {
				s.inFrame()
			}
		}
		return s.steps
	}
	small := strings.Repeat("{a=", 16000)
	large := strings.Repeat("{a=", 256000)
	ss, sl := steps(small), steps(large)
	if ratio := float64(sl) / float64(ss); ratio > 16.5 {
		t.Errorf("16,000 deep %d steps, 256,000 deep %d steps: ratio %.1f (linear 16, quadratic 256)", ss, sl, ratio)
	}
	start := time.Now()
	_, err := LoadUser(strings.NewReader("[[liquid]]\nid = "+small), "deep.toml")
	if !errors.Is(err, ErrTooDeep) {
		t.Errorf("the 48 KB file 16,000 deep: %v", err)
	}
	if d := time.Since(start); d > time.Second {
		t.Errorf("refused in %v", d)
	}
}

// A long key path under the limits is cut in the error line.
func TestLongFieldElided(t *testing.T) {
	key := strings.Repeat("k", 900)
	_, err := LoadUser(strings.NewReader("[[hose]]\n"+key+" = 1\n"), "presets.toml")
	if !errors.Is(err, ErrUnknownField) {
		t.Fatalf("%v", err)
	}
	msg := err.Error()
	if len([]rune(msg)) > 120 || !strings.Contains(msg, "…") || strings.Contains(msg, strings.Repeat("k", 100)) {
		t.Errorf("%d characters: %q", len(msg), msg)
	}
	if elide("short", 60) != "short" || len([]rune(elide(strings.Repeat("x", 100), 60))) != 60 {
		t.Error("elide")
	}
}

// FuzzCheckBounds: the scan always ends; when it accepts a file the
// decoder also reads, the decoded tree is no deeper than 64 levels and no
// key path is longer than 1,024 characters (the scan counts at least as
// deep as the decoder nests).
func FuzzCheckBounds(f *testing.F) {
	for _, s := range []string{
		"x = {a={b=1}}", "[a.b]\nc.d = [1, {e = 2}]", `"q.r" = 's'`, "x = \"\"\"\n{\n\"\"\"\ny = [[1],[2]]",
		"[[t]]\n[t.u]\nv = 1", strings.Repeat("a.", 63) + "a = 1", "x = [\n# c\n[1],\n]",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, src string) {
		if len(src) > 1<<12 {
			return
		}
		if _, err := checkBounds(src); err != nil {
			return
		}
		var v map[string]any
		if _, err := toml.Decode(src, &v); err != nil {
			return
		}
		if d, p := treeDepth(v, 0, 0); d > maxNesting || p > maxKeyPath {
			t.Fatalf("accepted, but the decoder nests %d deep with a key path of %d", d, p)
		}
	})
}

// treeDepth returns the depth (map keys and slice levels) and the longest
// key path (keys joined with dots) of a decoded value.
func treeDepth(v any, depth, path int) (int, int) {
	maxD, maxP := depth, path
	switch x := v.(type) {
	case map[string]any:
		for k, e := range x {
			p := path + len(k)
			if path > 0 {
				p++
			}
			d2, p2 := treeDepth(e, depth+1, p)
			maxD, maxP = max(maxD, d2), max(maxP, p2)
		}
	case []map[string]any:
		for _, e := range x {
			d2, p2 := treeDepth(e, depth+1, path)
			maxD, maxP = max(maxD, d2), max(maxP, p2)
		}
	case []any:
		for _, e := range x {
			d2, p2 := treeDepth(e, depth+1, path)
			maxD, maxP = max(maxD, d2), max(maxP, p2)
		}
	}
	return maxD, maxP
}

var sinkLine int

// BenchmarkCheckBounds: the pre-scan of nested inline tables 1,000, 4,000
// and 16,000 deep (it stops at the 64th level) and of the shipped catalogue
// (read whole).
func BenchmarkCheckBounds(b *testing.B) {
	for _, n := range []int{1000, 4000, 16000} {
		src := "x = " + strings.Repeat("{a=", n) + "1" + strings.Repeat("}", n)
		b.Run(strconvG(float64(n)), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				sinkLine, _ = checkBounds(src)
			}
		})
	}
	b.Run("catalogue", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkLine, _ = checkBounds(builtinTOML)
		}
	})
}
