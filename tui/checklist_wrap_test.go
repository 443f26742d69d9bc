package tui

import (
	"math/rand/v2"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// TestCkWrapN: the first n lines made from the head of a text are the
// first n lines of the whole text wrapped, for texts of short and long
// words, runs of spaces, line breaks and wide characters.
func TestCkWrapN(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	words := []string{"a", "gas", "reading", "0", "%", "LEL", "permit", "4411-B", "crew", "briefed;",
		strings.Repeat("x", 30), "日本", "°C", "\n", "  ", "\t"}
	for i := 0; i < 2000; i++ {
		var b strings.Builder
		for k := r.IntN(80); k > 0; k-- {
			b.WriteString(words[r.IntN(len(words))])
			if r.IntN(4) > 0 {
				b.WriteByte(' ')
			}
		}
		s := b.String()
		w, n := 4+r.IntN(40), 1+r.IntN(8)
		all := ckWrap(s, w)
		want := all[:min(n, len(all))]
		if got := ckWrapN(s, w, n); !slices.Equal(got, want) {
			t.Fatalf("ckWrapN(%q, %d, %d) =\n%q\nwant\n%q", s, w, n, got, want)
		}
	}
}

// BenchmarkChecklistLongNote: the checklist drawn with a note of 100 bytes,
// 10 KB and 100 KB on the selected step; past a screenful of note the cost
// does not grow with its size.
func BenchmarkChecklistLongNote(b *testing.B) {
	for _, size := range []int{100, 10 << 10, 100 << 10} {
		b.Run(strconv.Itoa(size), func(b *testing.B) {
			cl := ckDemo()
			cl.Steps[0].Note = strings.Repeat("gas reading 0 % LEL at the rim; ", size/32)
			v := NewChecklistView(NewStyles(true), DefaultKeyMap(), nil)
			v.SetSize(120, 18)
			v.SetChecklist(cl)
			v.Focus()
			b.ReportAllocs()
			for b.Loop() {
				paneSink = v.View()
			}
		})
	}
}
