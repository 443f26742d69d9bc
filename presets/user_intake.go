package presets

import (
	"errors"
	"fmt"
	"strings"

	"drawdown/calc"
)

// Decoder of the [[intake]] entries.

func (p *parser) intake(i int, id string, d intakeDoc) (Intake, error) {
	in := Intake{ID: id, Name: orDefault(d.Name, id), FromMemory: d.FromMemory, Source: d.Source,
		KSource: orDefault(d.KSource, d.Source), Note: d.Note, Origin: p.origin}
	fail := func(key string, err error) (Intake, error) { return in, p.errAt("intake", i, id, key, err) }
	var err error
	if in.Aliases, err = p.aliases("intake", i, id, d.Aliases); err != nil {
		return in, err
	}
	kind, ok := ParseIntakeKind(d.Kind)
	if !ok {
		names := make([]string, 0, len(intakeKindNames))
		for _, k := range IntakeKinds() {
			names = append(names, k.String())
		}
		return fail("kind", fmt.Errorf("%q: use one of %s", d.Kind, strings.Join(names, ", ")))
	}
	in.Kind = kind
	if in.K, err = p.intakeK(i, id, d); err != nil {
		return in, err
	}
	if err := p.intakeGeometry(i, id, d, &in); err != nil {
		return in, err
	}
	if err := p.intakeKindSizes(i, id, d, &in); err != nil {
		return in, err
	}
	if err := p.needSource("intake", i, id, d.Source); err != nil {
		return in, err
	}
	return in, nil
}

// intakeK reads the entrance K and its band.
func (p *parser) intakeK(i int, id string, d intakeDoc) (KRange, error) {
	if d.K == nil {
		return KRange{}, p.errAt("intake", i, id, "k", errors.New("missing; give the entrance loss coefficient"))
	}
	if err := rangeCheck(*d.K, 0, 1000, ""); err != nil {
		return KRange{}, p.errAt("intake", i, id, "k", err)
	}
	k := KRange{Central: *d.K, Low: *d.K, High: *d.K}
	if d.KLow != nil {
		if err := rangeCheck(*d.KLow, 0, *d.K, ""); err != nil {
			return k, p.errAt("intake", i, id, "k_low", err)
		}
		k.Low = *d.KLow
	}
	if d.KHigh != nil {
		if err := rangeCheck(*d.KHigh, *d.K, 1000, ""); err != nil {
			return k, p.errAt("intake", i, id, "k_high", err)
		}
		k.High = *d.KHigh
	}
	return k, nil
}

// optional checks an optional number against its range.
func (p *parser) optional(section string, i int, id, key string, v *float64, lo, hi float64, unit string) (float64, error) {
	if v == nil {
		return 0, nil
	}
	if err := rangeCheck(*v, lo, hi, unit); err != nil {
		return 0, p.errAt(section, i, id, key, err)
	}
	return *v, nil
}

// intakeGeometry reads the face, the mouth and the open area.
func (p *parser) intakeGeometry(i int, id string, d intakeDoc, in *Intake) error {
	type num struct {
		key    string
		v      *float64
		lo, hi float64
		unit   string
		dst    *float64
	}
	var face, mouth float64
	for _, n := range []num{
		{"face_diameter_mm", d.FaceMM, 1, 2000, "mm", &face},
		{"face_diameter_bores", d.FaceBores, 0.5, 20, "bores", &in.FaceBores},
		{"mouth_height_mm", d.MouthMM, 0, 2000, "mm", &mouth},
		{"mouth_height_bores", d.MouthBores, 0, 20, "bores", &in.MouthBores},
		{"open_area_ratio", d.OpenRatio, 0.01, 1, "", &in.OpenRatio},
	} {
		v, err := p.optional("intake", i, id, n.key, n.v, n.lo, n.hi, n.unit)
		if err != nil {
			return err
		}
		*n.dst = v
	}
	in.Face, in.Mouth = calc.Length(face/1000), calc.Length(mouth/1000)
	if d.FaceMM == nil && d.FaceBores == nil {
		in.FaceBores = 1 // the hose end itself
	}
	if in.Kind != FloatingIntake && d.MouthMM == nil && d.MouthBores == nil {
		return p.errAt("intake", i, id, "mouth_height_mm", errors.New("missing; give the height of the top of the opening above the floor (mouth_height_mm or mouth_height_bores)"))
	}
	return nil
}

// intakeKindSizes reads the sizes only some kinds have: a suction plate's
// draw-down level and a floating intake's depth.
func (p *parser) intakeKindSizes(i int, id string, d intakeDoc, in *Intake) error {
	only := func(key string, v *float64, kind IntakeKind) error {
		if v != nil && in.Kind != kind {
			return p.errAt("intake", i, id, key, fmt.Errorf("only for kind %s", kind))
		}
		if v == nil && in.Kind == kind {
			return p.errAt("intake", i, id, key, fmt.Errorf("missing for kind %s", kind))
		}
		return nil
	}
	if err := only("draw_down_mm", d.DrawDownMM, SuctionPlate); err != nil {
		return err
	}
	if err := only("depth_mm", d.DepthMM, FloatingIntake); err != nil {
		return err
	}
	dd, err := p.optional("intake", i, id, "draw_down_mm", d.DrawDownMM, 0, 500, "mm")
	if err != nil {
		return err
	}
	depth, err := p.optional("intake", i, id, "depth_mm", d.DepthMM, 10, 5000, "mm")
	if err != nil {
		return err
	}
	in.DrawDown, in.Depth = calc.Length(dd/1000), calc.Length(depth/1000)
	return nil
}
