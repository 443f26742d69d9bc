package calc

import (
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"
)

// sentinels are every sentinel error calc exports.
var sentinels = []error{ErrOutOfRange, ErrNotFinite, ErrBoiling, ErrGeometry, ErrNoTank}

// TestEveryValidatorNamesItsQuantity walks each validator of calc with a bad
// input and checks that the error is a *RangeError whose typed What names
// the input (never QuantityUnknown), that errors.Is finds its sentinel
// (directly and through a caller's %w wrapping) and no other, and that the
// message states the accepted range. Source: calc's own error contract
// (errors.go; issue 10: errors carry a typed quantity, errors.Is works on
// every sentinel).
func TestEveryValidatorNamesItsQuantity(t *testing.T) {
	nan := math.NaN()
	s := demoCase()
	with := func(f func(*Siphon)) Siphon { c := s; f(&c); return c }
	solve := func(f func(*Siphon)) func() error {
		return func() error { _, err := Solve(with(f)); return err }
	}
	tank := mustTank(NewVerticalCylinder(1.2, 1.5))
	okDrain := DrainInput{Tank: tank, Siphon: baseSiphon(1.4, 0.05, 1.9, -2)}
	drain := func(f func(*DrainInput)) func() error {
		return func() error { in := okDrain; f(&in); _, err := PlanDrain(in); return err }
	}
	band := func(tol Tolerance) func() error {
		return func() error { _, err := planBand(okDrain, tol); return err }
	}
	tk := func(f func() (Tank, error)) func() error { return func() error { _, err := f(); return err } }
	cases := []struct {
		name string
		call func() error
		what Quantity
		is   error
	}{
		{"density", solve(func(s *Siphon) { s.Fluid.Density = 0 }), QuantityDensity, ErrOutOfRange},
		{"density NaN", solve(func(s *Siphon) { s.Fluid.Density = Density(nan) }), QuantityDensity, ErrNotFinite},
		{"viscosity", solve(func(s *Siphon) { s.Fluid.Viscosity = 11 }), QuantityViscosity, ErrOutOfRange},
		{"vapour pressure", solve(func(s *Siphon) { s.Fluid.VaporPressure = -1 }), QuantityVaporPressure, ErrOutOfRange},
		{"vapour pressure too high", solve(func(s *Siphon) { s.Fluid.VaporPressure = 3e5 }), QuantityVaporPressure, ErrOutOfRange},
		{"outlet K", solve(func(s *Siphon) { s.Hose.OutletK = -1 }), QuantityOutletK, ErrOutOfRange},
		{"max flow", solve(func(s *Siphon) { s.MaxFlow = FlowRate(nan) }), QuantityMaxFlow, ErrNotFinite},
		{"intake kind", solve(func(s *Siphon) { s.Intake.Kind = 99 }), QuantityIntakeKind, ErrOutOfRange},
		{"intake face", solve(func(s *Siphon) { s.Intake.FaceDiameter = -0.1 }), QuantityIntakeSize, ErrOutOfRange},
		{"intake height", solve(func(s *Siphon) { s.Intake.Height = 3 }), QuantityIntakeHeight, ErrOutOfRange},
		{"intake open area", solve(func(s *Siphon) { s.Intake.OpenArea = -1 }), QuantityIntakeOpenArea, ErrOutOfRange},
		{"intake K", solve(func(s *Siphon) { s.Intake.K = nan }), QuantityIntakeK, ErrNotFinite},
		{"float depth", solve(func(s *Siphon) { s.Intake.Kind = IntakeFloating }), QuantityFloatDepth, ErrOutOfRange},
		{"vacuum class", solve(func(s *Siphon) { s.Hose.Vacuum = 9 }), QuantityVacuumRating, ErrOutOfRange},
		{"vacuum rating", solve(func(s *Siphon) { s.Hose.Vacuum = VacuumRated }), QuantityVacuumRating, ErrOutOfRange},
		{"hose wall", solve(func(s *Siphon) { s.Hose.Vacuum = VacuumFromWall }), QuantityHoseWall, ErrOutOfRange},
		{"down-leg slope", solve(func(s *Siphon) { s.Geometry.DownLegSlope = 1.5 }), QuantityDownLegSlope, ErrOutOfRange},
		{"barometer", solve(func(s *Siphon) { s.AtmPressure = 5000 }), QuantityAtmPressure, ErrOutOfRange},
		{"hose diameter", solve(func(s *Siphon) { s.Hose.Diameter = 0 }), QuantityHoseDiameter, ErrOutOfRange},
		{"hose length", solve(func(s *Siphon) { s.Hose.Length = Length(math.Inf(1)) }), QuantityHoseLength, ErrNotFinite},
		{"roughness", solve(func(s *Siphon) { s.Hose.Roughness = 0.01 }), QuantityRoughness, ErrGeometry},
		{"roughness negative", solve(func(s *Siphon) { s.Hose.Roughness = -1e-6 }), QuantityRoughness, ErrOutOfRange},
		{"up-leg", solve(func(s *Siphon) { s.Hose.UpLegLength = 20 }), QuantityUpLegLength, ErrGeometry},
		{"K entrance", solve(func(s *Siphon) { s.Hose.KEntrance = -1 }), QuantityKEntrance, ErrOutOfRange},
		{"K up-leg", solve(func(s *Siphon) { s.Hose.KUpLeg = 2000 }), QuantityKUpLeg, ErrOutOfRange},
		{"K down-leg", solve(func(s *Siphon) { s.Hose.KDownLeg = nan }), QuantityKDownLeg, ErrNotFinite},
		{"hoses", solve(func(s *Siphon) { s.Hoses = 0 }), QuantityHoses, ErrOutOfRange},
		{"surface", solve(func(s *Siphon) { s.Geometry.Surface = 2000 }), QuantitySurface, ErrOutOfRange},
		{"intake", solve(func(s *Siphon) { s.Geometry.Intake = -2000 }), QuantityIntake, ErrOutOfRange},
		{"crest", solve(func(s *Siphon) { s.Geometry.Crest = Length(nan) }), QuantityCrest, ErrNotFinite},
		{"outlet", solve(func(s *Siphon) { s.Geometry.Outlet = -2000 }), QuantityOutlet, ErrOutOfRange},
		{"crest below intake", solve(func(s *Siphon) { s.Geometry.Crest = -1 }), QuantityCrest, ErrGeometry},
		{"crest below outlet", solve(func(s *Siphon) { s.Geometry.Outlet = 2; s.Geometry.Crest = 1.8 }), QuantityCrest, ErrGeometry},

		{"tank diameter", tk(func() (Tank, error) { return NewVerticalCylinder(0, 1) }), QuantityTankDiameter, ErrOutOfRange},
		{"tank height", tk(func() (Tank, error) { return NewVerticalCylinder(1, -1) }), QuantityTankHeight, ErrOutOfRange},
		{"box length", tk(func() (Tank, error) { return NewRectangular(Length(nan), 1, 1) }), QuantityTankLength, ErrNotFinite},
		{"box width", tk(func() (Tank, error) { return NewRectangular(1, 2000, 1) }), QuantityTankWidth, ErrOutOfRange},
		{"lying cylinder length", tk(func() (Tank, error) { return NewHorizontalCylinder(1, 0) }), QuantityTankLength, ErrOutOfRange},
		{"cone height", tk(func() (Tank, error) { return NewConeBottom(1, 2, 1) }), QuantityConeHeight, ErrGeometry},
		{"pit length", tk(func() (Tank, error) { return NewSlopedPit(0, 1, 1, 1) }), QuantityTankLength, ErrOutOfRange},
		{"pit width", tk(func() (Tank, error) { return NewSlopedPit(1, 0, 1, 1) }), QuantityTankWidth, ErrOutOfRange},
		{"side slope", tk(func() (Tank, error) { return NewSlopedPit(1, 1, 30, 1) }), QuantitySideSlope, ErrOutOfRange},
		{"pit depth", tk(func() (Tank, error) { return NewSlopedPit(1, 1, 1, 0) }), QuantityTankHeight, ErrOutOfRange},
		{"sphere", tk(func() (Tank, error) { return NewSphere(-1) }), QuantityTankDiameter, ErrOutOfRange},
		{"table sizes", tk(func() (Tank, error) { return NewTable([]float64{0, 1}, []float64{0}) }), QuantityTankTable, ErrGeometry},
		{"table rows", tk(func() (Tank, error) { return NewTable([]float64{1}, []float64{1}) }), QuantityTankTable, ErrGeometry},
		{"table level falls", tk(func() (Tank, error) { return NewTable([]float64{0, 1, 0.5}, []float64{0, 1, 2}) }), QuantityTankTable, ErrOutOfRange},
		{"table level repeats", tk(func() (Tank, error) { return NewTable([]float64{0, 1, 1}, []float64{0, 1, 2}) }), QuantityTankTable, ErrOutOfRange},
		{"table volume falls", tk(func() (Tank, error) { return NewTable([]float64{0, 1, 2}, []float64{0, 1, 0.5}) }), QuantityTankTable, ErrOutOfRange},
		{"table holds nothing", tk(func() (Tank, error) { return NewTable([]float64{0, 1}, []float64{0, 0}) }), QuantityTankTable, ErrOutOfRange},

		{"no tank", drain(func(in *DrainInput) { in.Tank = nil }), QuantitySourceTank, ErrNoTank},
		{"start level", drain(func(in *DrainInput) { in.Siphon.Geometry.Surface = 1.6 }), QuantityStartLevel, ErrOutOfRange},
		{"intake above level", drain(func(in *DrainInput) { in.Siphon.Geometry.Intake = 1.45 }), QuantityIntake, ErrGeometry},
		{"intake below floor", drain(func(in *DrainInput) { in.Siphon.Geometry.Intake = -0.1 }), QuantityIntake, ErrOutOfRange},
		{"target", drain(func(in *DrainInput) { in.Target = -1 }), QuantityTarget, ErrOutOfRange},
		{"target at start", drain(func(in *DrainInput) { in.Target = 1.4 }), QuantityTarget, ErrOutOfRange},
		{"curve points", drain(func(in *DrainInput) { in.CurvePoints = 1 }), QuantityCurvePoints, ErrOutOfRange},
		{"receiver tank", drain(func(in *DrainInput) { in.Receiver = &Receiver{} }), QuantityReceiverTank, ErrNoTank},
		{"receiver floor", drain(func(in *DrainInput) { in.Receiver = &Receiver{Tank: tank, Floor: 5000} }), QuantityReceiverFloor, ErrOutOfRange},
		{"receiver level", drain(func(in *DrainInput) { in.Receiver = &Receiver{Tank: tank, Level: 2} }), QuantityReceiverLevel, ErrOutOfRange},
		{"siphon through the plan", drain(func(in *DrainInput) { in.Siphon.Hoses = 500 }), QuantityHoses, ErrOutOfRange},

		{"height tolerance", band(Tolerance{Height: 11}), QuantityHeightTolerance, ErrOutOfRange},
		{"roughness low", band(Tolerance{RoughnessLow: -1e-6, RoughnessHigh: 1e-5}), QuantityRoughnessRange, ErrOutOfRange},
		{"roughness high", band(Tolerance{RoughnessLow: 2e-5, RoughnessHigh: 1e-5}), QuantityRoughnessRange, ErrOutOfRange},
		{"K low", band(Tolerance{KLow: -1, KHigh: 2}), QuantityKRange, ErrOutOfRange},
		{"K high", band(Tolerance{KLow: 2, KHigh: 1}), QuantityKRange, ErrOutOfRange},
		{"flow band", func() error { _, _, err := FlowBand(s, Tolerance{Height: Length(nan)}); return err }, QuantityHeightTolerance, ErrNotFinite},
		{"what-if lengths", func() error { _, err := WhatIf(okDrain, make([]Length, 17), nil); return err }, QuantityWhatIf, ErrOutOfRange},
		{"what-if diameters", func() error { _, err := WhatIf(okDrain, nil, make([]Length, 17)); return err }, QuantityWhatIf, ErrOutOfRange},

		{"altitude", func() error { _, err := StandardAtmosphere(12000); return err }, QuantityAltitude, ErrOutOfRange},
		{"p_s temperature", func() error { _, err := WaterSaturationPressure(Temperature(nan)); return err }, QuantityTemperature, ErrNotFinite},
		{"water temperature", func() error { _, err := Water(Celsius(-1), 1e5); return err }, QuantityTemperature, ErrOutOfRange},
		{"water pressure", func() error { _, err := Water(300, 0); return err }, QuantityAtmPressure, ErrOutOfRange},
		{"water boils", func() error { _, err := Water(Celsius(100), 80e3); return err }, QuantityTemperature, ErrBoiling},
		{"water boils at any T", func() error { _, err := Water(Celsius(1), 500); return err }, QuantityAtmPressure, ErrBoiling},
	}
	hit := map[error]bool{}
	seen := map[Quantity]bool{}
	for _, c := range cases {
		err := c.call()
		var re *RangeError
		if !errors.As(err, &re) {
			t.Errorf("%s: %v is not a *RangeError", c.name, err)
			continue
		}
		if re.What == QuantityUnknown || re.What != c.what {
			t.Errorf("%s: What = %v, want %v (%v)", c.name, re.What, c.what, err)
		}
		seen[re.What] = true
		wrapped := fmt.Errorf("caller: %w", err)
		for _, s := range sentinels {
			want := s == c.is
			if errors.Is(err, s) != want || errors.Is(wrapped, s) != want {
				t.Errorf("%s: errors.Is(%v, %v) = %v, want %v", c.name, err, s, errors.Is(err, s), want)
			}
		}
		hit[c.is] = true
		if msg := err.Error(); !strings.Contains(msg, "accepted") || strings.Contains(msg, "NaN") && c.is != ErrNotFinite {
			t.Errorf("%s: message %q", c.name, msg)
		}
	}
	for _, s := range sentinels {
		if !hit[s] {
			t.Errorf("no case reaches %v", s)
		}
	}
	t.Logf("%d quantities reached", len(seen))
}

// TestQuantityCodes: every Quantity has its own stable lowercase code.
func TestQuantityCodes(t *testing.T) {
	seen := map[string]Quantity{}
	for q := QuantityUnknown; q < quantityCount; q++ {
		c := q.String()
		if c == "" || c != strings.ToLower(c) || strings.ContainsAny(c, " -") {
			t.Errorf("%d: code %q", q, c)
		}
		if p, dup := seen[c]; dup {
			t.Errorf("%d and %d share the code %q", p, q, c)
		}
		seen[c] = q
	}
	if QuantityUnknown.String() != "unknown" || QuantityHoseDiameter.String() != "hose_diameter" || QuantityKUpLeg.String() != "k_up_leg" {
		t.Errorf("codes %q %q %q", QuantityUnknown, QuantityHoseDiameter, QuantityKUpLeg)
	}
	if got := quantityCount.String(); !strings.HasPrefix(got, "quantity(") {
		t.Errorf("out of range: %q", got)
	}
}
