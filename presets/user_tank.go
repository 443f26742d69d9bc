package presets

import (
	"errors"
	"fmt"
	"sort"
	"strings"
)

// Decoder of the [[tank]] entries.

func (p *parser) tank(i int, id string, d tankDoc) (TankTemplate, error) {
	t := TankTemplate{ID: id, Name: orDefault(d.Name, id), Shape: d.Shape, ConfinedSpace: d.Confined,
		Source: d.Source, Note: d.Note, Origin: p.origin}
	need, ok := tankShapeSizes[d.Shape]
	if !ok {
		return t, p.errAt("tank", i, id, "shape", fmt.Errorf("%q: use one of %s", d.Shape, strings.Join(TankShapes(), ", ")))
	}
	known := map[string]bool{}
	for _, s := range sizeOrder {
		known[s] = true
	}
	keys := make([]string, 0, len(d.Sizes))
	for k := range d.Sizes {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		if !known[k] {
			return t, p.errAt("tank", i, id, "sizes."+k, fmt.Errorf("unknown size; use %s", strings.Join(sizeOrder, ", ")))
		}
		v := d.Sizes[k]
		lo, hi, unit := 0.001, 1000.0, "m"
		if k == "side-slope" {
			lo, hi, unit = 0, 20, "(run per rise)"
		}
		if err := rangeCheck(v, lo, hi, unit); err != nil {
			return t, p.errAt("tank", i, id, "sizes."+k, err)
		}
	}
	for _, n := range need {
		if _, ok := d.Sizes[n]; !ok {
			return t, p.errAt("tank", i, id, "sizes", fmt.Errorf("shape %s needs %s", d.Shape, strings.Join(need, ", ")))
		}
	}
	if ch, ok := d.Sizes["cone-height"]; ok {
		if h, ok := d.Sizes["height"]; ok && ch > h {
			return t, p.errAt("tank", i, id, "sizes.cone-height", fmt.Errorf("%s m is more than the height %s m", num(ch), num(h)))
		}
	}
	for _, n := range sizeOrder {
		if v, ok := d.Sizes[n]; ok {
			t.Sizes = append(t.Sizes, Size{Name: n, Value: v})
		}
	}
	if strings.TrimSpace(d.Source) == "" {
		return t, p.errAt("tank", i, id, "source", errors.New("missing; say where the sizes come from"))
	}
	return t, nil
}
