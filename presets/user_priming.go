package presets

import (
	"errors"

	"drawdown/calc"
)

// Decoders of the [[priming]] and [[priming_aid]] entries.

func (p *parser) priming(i int, id string, d primingDoc) (PrimingMethod, error) {
	hz, err := p.hazards("priming", i, id, "not_for", d.NotFor)
	if err != nil {
		return PrimingMethod{}, err
	}
	if err := p.needSource("priming", i, id, d.Source); err != nil {
		return PrimingMethod{}, err
	}
	return PrimingMethod{ID: id, Name: orDefault(d.Name, id), Summary: d.Summary,
		NotFor: hz, Caution: d.Caution, Source: d.Source, Origin: p.origin}, nil
}

func (p *parser) aid(i int, id string, d aidDoc) (PrimingAid, error) {
	a := PrimingAid{ID: id, Name: orDefault(d.Name, id), Source: d.Source, Note: d.Note, Origin: p.origin}
	if d.StrokeLow == nil || d.StrokeHigh == nil {
		return a, p.errAt("priming_aid", i, id, "stroke_low_ml", errors.New("stroke_low_ml and stroke_high_ml are both needed"))
	}
	if err := rangeCheck(*d.StrokeLow, 0.1, 1e5, "mL"); err != nil {
		return a, p.errAt("priming_aid", i, id, "stroke_low_ml", err)
	}
	if err := rangeCheck(*d.StrokeHigh, *d.StrokeLow, 1e5, "mL"); err != nil {
		return a, p.errAt("priming_aid", i, id, "stroke_high_ml", err)
	}
	if err := p.needSource("priming_aid", i, id, d.Source); err != nil {
		return a, err
	}
	a.StrokeLow, a.StrokeHigh = calc.Volume(*d.StrokeLow*1e-6), calc.Volume(*d.StrokeHigh*1e-6)
	return a, nil
}
