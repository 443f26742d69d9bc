package tui

import (
	"regexp"
	"testing"
	"time"

	tea "charm.land/bubbletea/v2"

	"drawdown/model"
)

// asciiSign is an ASCII hyphen-minus used as a sign (after a space, an
// opening bracket, "=" or the start of a line, before a digit); a mixed
// number's hyphen ("11-1/2 in") and a key range ("1-9") are not signs.
var asciiSign = regexp.MustCompile(`(^|[\s(=])-\d`)

// ungrouped is a volume of five digits or more without grouping.
var ungrouped = regexp.MustCompile(`\d{5,}(\.\d+)? (L|gal|m³|Mgal)\b`)

// TestFiguresReadTheSame: no frame of any pane shows a negative figure with
// the ASCII hyphen (every figure carries the one minus sign, U+2212) or a
// volume without digit grouping, for jobs with negative heights and large
// volumes in both unit systems, at 80×24 and 120×40.
func TestFiguresReadTheSame(t *testing.T) {
	jobs := map[string]func(j *model.Job){
		"demo": nil,
		// A pond of several thousand cubic metres (invented), its outlet
		// well below the floor: long negative heights, big volumes.
		"pond": func(j *model.Job) {
			j.Inputs[model.FieldTankShape] = "sloped-pit"
			j.Inputs[model.FieldTankLength] = "40 m"
			j.Inputs[model.FieldTankWidth] = "25 m"
			j.Inputs[model.FieldTankSlope] = "2"
			j.Inputs[model.FieldTankHeight] = "3 m"
			j.Inputs[model.FieldTankLevel] = "2.5 m"
			j.Inputs[model.FieldHoseID] = "100 mm"
			j.Inputs[model.FieldHoseLength] = "40 m"
			j.Inputs[model.FieldDrop] = "4 m"
		},
	}
	for name, edit := range jobs {
		for _, sys := range []model.System{model.SI, model.US} {
			for _, size := range [][2]int{{80, 24}, {120, 40}} {
				j := model.DemoJob()
				if edit != nil {
					edit(&j)
				}
				j.Units = sys
				m := New(Options{Start: Start{Job: j}, NoSave: true, Now: func() time.Time { return testClock }, Loc: time.UTC})
				m = send(t, m, tea.WindowSizeMsg{Width: size[0], Height: size[1]})
				for p := PaneID(0); p < paneCount; p++ {
					m = press(t, m, m.keys.PaneKeys[p].Keys()[0])
					f := frame(m)
					if s := asciiSign.FindString(f); s != "" {
						t.Errorf("%s %v %dx%d %v: ASCII minus %q in\n%s", name, sys, size[0], size[1], p, s, f)
					}
					if s := ungrouped.FindString(f); s != "" {
						t.Errorf("%s %v %dx%d %v: ungrouped volume %q in\n%s", name, sys, size[0], size[1], p, s, f)
					}
				}
			}
		}
	}
}
