package calc

import (
	"math"
	"testing"

	"drawdown/calc/testkit"
)

// TestSubmergenceWorkedNumbers: ANSI/HI 9.8, S = D(1 + 2.3 F_D), and Gordon
// (1970), S = C·V·√D, against the check values of
// calc/testdata/reference/hydraulics.md §6 (computed there from each criterion's
// equation; Gordon's C 0.3/0.4 in ft units, 0.5434/0.7245 in SI). Four
// decimals: half a unit, over the value.
func TestSubmergenceWorkedNumbers(t *testing.T) {
	const src = "hydraulics.md §6 check values [computed from the published equations]"
	for _, c := range []struct {
		d, v                 float64
		hi, gordonS, gordonA float64
	}{
		{0.050, 1.0, 0.2142, 0.1215, 0.1620},
		{0.100, 1.5, 0.4484, 0.2578, 0.3437},
		{0.025, 2.0, 0.2573, 0.1718, 0.2291},
	} {
		q := FlowRate(c.v * math.Pi * c.d * c.d / 4)
		testkit.Close(t, "HI 9.8 S (m)", float64(SubmergenceHI(q, Length(c.d))), c.hi, 0.00005/c.hi, src)
		testkit.Close(t, "Gordon asymmetrical S (m)", float64(AirStartsSubmergence(q, Length(c.d))), c.gordonA, 0.00005/c.gordonA, src)
		testkit.Close(t, "Gordon symmetrical S (m)", GordonCSymmetric*c.v*math.Sqrt(c.d), c.gordonS, 0.00005/c.gordonS, src)
		// dimensionless: S/D = C·√g·F_D, 2.27·F_D for Gordon asymmetrical
		fr := c.v / math.Sqrt(StandardGravity*c.d)
		testkit.Close(t, "Gordon S/D over F_D", float64(AirStartsSubmergence(q, Length(c.d)))/c.d/fr, 2.2689, 0.00005/2.2689,
			"C_SI·√g = 0.4/√0.3048·√9.80665 [computed]")
	}
}

// TestAirStartsUsesTheDeviceFace: the vortex criterion is taken at the
// intake device's own face (issue 11): a strainer of 100 mm with the same
// flow as a 38 mm bare end draws air much lower, by (38/100)^1.5 of the
// Gordon submergence (S ∝ q/D^1.5 for a given flow).
func TestAirStartsUsesTheDeviceFace(t *testing.T) {
	s := bundSiphon(t)
	bare, _ := Solve(s)
	s.Intake = Intake{Kind: IntakeStrainer, FaceDiameter: 0.1, Height: 0.025, OpenArea: 0.0045}
	str, _ := Solve(s)
	// same bore, similar flow; Gordon at each face
	sBare := float64(AirStartsSubmergence(bare.FlowPerHose, 0.038))
	sStr := float64(AirStartsSubmergence(str.FlowPerHose, 0.1))
	testkit.Close(t, "bare-end air starts (m)", float64(bare.AirStartsLevel-s.Geometry.Intake), sBare, 1e-12, "Gordon at the bore")
	testkit.Close(t, "strainer air starts above its holes (m)", float64(str.AirStartsLevel-s.Geometry.Intake)-0.025, sStr, 1e-12, "Gordon at the strainer's face")
	testkit.Close(t, "face-size scaling", sStr/sBare*float64(bare.FlowPerHose)/float64(str.FlowPerHose), math.Pow(0.038/0.1, 1.5), 1e-12,
		"S = C·q/(π/4)·D^−1.5 (Gordon's form)")
	if !(float64(str.SubmergenceHI) > sStr) {
		t.Errorf("HI 9.8 %v should exceed Gordon %v by about a face diameter", str.SubmergenceHI, sStr)
	}
}

// bundSiphon is the demo bund: rain water at 8 °C at 45 m, one 38 mm
// suction hose 12 m long (rated for 80 kPa of vacuum, common for
// reinforced suction hose), lift 0.6 m and drop 1.5 m over the start level of
// 0.35 m, a bare end hung 5 cm above the floor.
func bundSiphon(t *testing.T) Siphon {
	t.Helper()
	p, err := StandardAtmosphere(45)
	if err != nil {
		t.Fatal(err)
	}
	w, err := Water(Celsius(8), p)
	if err != nil {
		t.Fatal(err)
	}
	return Siphon{Fluid: w, AtmPressure: p, Hoses: 1,
		Hose:     Hose{Diameter: 0.038, Length: 12, Roughness: 0.01e-3, KEntrance: 0.78, Vacuum: VacuumRated, VacuumRating: 80e3},
		Geometry: Geometry{Surface: 0.35, Intake: 0.05, Crest: 0.95, Outlet: -1.15},
	}
}

func bundTank(t *testing.T) Tank { return mustTank(NewRectangular(8, 5, 1)) }

// strainerOnFloor is a flat strainer lying on the bund floor: 100 mm body,
// top row of holes 25 mm up, open area 0.0045 m² (four times the bore), its
// own K 1 (invented; the figures of a common pancake strainer).
var strainerOnFloor = Intake{Kind: IntakeStrainer, FaceDiameter: 0.1, Height: 0.025, OpenArea: 0.0045, K: 1}

// TestDemoBundDrains: with a strainer lying on its floor the demo bund drains
// to within a few centimetres of the floor (issue 11, "done when"); the plan
// says where air starts and what gulping costs.
func TestDemoBundDrains(t *testing.T) {
	s := bundSiphon(t)
	s.Geometry.Intake = 0
	s.Intake = strainerOnFloor
	plan, err := PlanDrain(DrainInput{Tank: bundTank(t), Siphon: s})
	if err != nil {
		t.Fatal(err)
	}
	if plan.StopReason != StopIntake || plan.StopLevel > 0.04 || plan.Residual > 8*5*0.04 {
		t.Errorf("stops at %.3f m (%s) with %.2f m³ left; want within a few cm of the floor", plan.StopLevel, plan.StopReason, plan.Residual)
	}
	if !(plan.AirStartsLevel > plan.PrimeLostLevel) || plan.AirStartsLevel > 0.2 || !(plan.GulpTime > 0) || !(plan.GulpTimeLost > 0) {
		t.Errorf("air starts %.3f m, prime lost %.3f m, gulping %.0f s costs %.0f s", plan.AirStartsLevel, plan.PrimeLostLevel,
			plan.GulpTime, plan.GulpTimeLost)
	}
	// bund water may carry a sheen: with the film flag and no board the
	// drain stops where air starts; a board lets it go on to prime lost
	s.Intake.FilmRisk = true
	film, _ := PlanDrain(DrainInput{Tank: bundTank(t), Siphon: s})
	s.Intake.Covered = true
	board, _ := PlanDrain(DrainInput{Tank: bundTank(t), Siphon: s})
	if film.StopReason != StopAir || math.Abs(float64(film.StopLevel-plan.AirStartsLevel)) > 1e-6 {
		t.Errorf("film, no board: stop %.4f (%s), air starts %.4f", film.StopLevel, film.StopReason, plan.AirStartsLevel)
	}
	if board.StopReason != StopIntake || board.StopLevel > 0.04 || board.AirStartsLevel != board.PrimeLostLevel {
		t.Errorf("board: stop %.4f (%s), air %v prime %v", board.StopLevel, board.StopReason, board.AirStartsLevel, board.PrimeLostLevel)
	}
}

// TestLargerBoreNeverSlower: for the same target level a larger bore never
// takes longer (issue 11 property), over the standard hose sizes, bare ends
// and strainers, with and without a film.
func TestLargerBoreNeverSlower(t *testing.T) {
	for _, in := range []Intake{{}, {Kind: IntakeBareFloor}, strainerOnFloor, {Covered: true}} {
		for _, target := range []Length{0.3, 0.2} {
			prev := math.Inf(1)
			for _, d := range []Length{0.019, 0.025, 0.032, 0.038, 0.050, 0.063} {
				s := bundSiphon(t)
				s.Intake = in
				if in.Kind != IntakeBareHung {
					s.Geometry.Intake = 0
				}
				s.Hose.Diameter = d
				plan, err := PlanDrain(DrainInput{Tank: bundTank(t), Siphon: s, Target: target})
				if err != nil {
					t.Fatal(err)
				}
				if plan.StopReason != StopTarget {
					continue // the target lies below where this bore stops
				}
				if float64(plan.Time) > prev*(1+1e-9) {
					t.Errorf("%v, target %v: %v mm takes %.0f s, more than the smaller bore's %.0f s", in.Kind, target, d*1000, plan.Time, prev)
				}
				prev = float64(plan.Time)
			}
		}
	}
}

// TestBoardNeverDrainsLess: a board over the intake never drains less
// (issue 11 property): no vortex, so no gulping and no stop where air starts.
func TestBoardNeverDrainsLess(t *testing.T) {
	for _, in := range []Intake{{}, {Kind: IntakeBareFloor}, strainerOnFloor, {FilmRisk: true}, {Kind: IntakeFootValve, FaceDiameter: 0.08, Height: 0.06, K: 5}} {
		for _, d := range []Length{0.025, 0.038, 0.05} {
			s := bundSiphon(t)
			s.Intake = in
			s.Hose.Diameter = d
			open, err := PlanDrain(DrainInput{Tank: bundTank(t), Siphon: s})
			if err != nil {
				t.Fatal(err)
			}
			s.Intake.Covered = true
			covered, err := PlanDrain(DrainInput{Tank: bundTank(t), Siphon: s})
			if err != nil {
				t.Fatal(err)
			}
			if covered.Volume < open.Volume*(1-1e-12) {
				t.Errorf("%v film %v, %v mm: board drains %.3f m³, open %.3f m³", in.Kind, in.FilmRisk, d*1000, covered.Volume, open.Volume)
			}
		}
	}
}

// TestTargetHonoured: a target above every stop is where the plan stops; a
// target below prime lost is flagged and never passed.
func TestTargetHonoured(t *testing.T) {
	s := bundSiphon(t)
	plan, _ := PlanDrain(DrainInput{Tank: bundTank(t), Siphon: s, Target: 0.2})
	if plan.StopReason != StopTarget || plan.StopLevel != 0.2 || plan.TargetBelowPrimeLost {
		t.Errorf("target 0.2 m: %s at %v (below prime lost %v)", plan.StopReason, plan.StopLevel, plan.TargetBelowPrimeLost)
	}
	plan, _ = PlanDrain(DrainInput{Tank: bundTank(t), Siphon: s, Target: 0.06})
	if plan.StopReason != StopIntake || !plan.TargetBelowPrimeLost || !(plan.StopLevel > 0.06) {
		t.Errorf("target 0.06 m under prime lost %v: %s at %v (flag %v)", plan.PrimeLostLevel, plan.StopReason, plan.StopLevel, plan.TargetBelowPrimeLost)
	}
}

// TestFloatingIntake: a floating intake keeps its mouth FloatDepth under the
// surface and stops when it grounds: at Intake + FloatDepth; its float keeps
// vortices off (air starts where prime is lost).
func TestFloatingIntake(t *testing.T) {
	s := bundSiphon(t)
	s.Geometry.Intake = 0
	s.Intake = Intake{Kind: IntakeFloating, FloatDepth: 0.04}
	plan, err := PlanDrain(DrainInput{Tank: bundTank(t), Siphon: s})
	if err != nil {
		t.Fatal(err)
	}
	if plan.StopReason != StopIntake || math.Abs(float64(plan.StopLevel)-0.04) > 1e-9 || plan.AirStartsLevel != plan.PrimeLostLevel || plan.GulpTime != 0 {
		t.Errorf("floating: %s at %v, air %v prime %v", plan.StopReason, plan.StopLevel, plan.AirStartsLevel, plan.PrimeLostLevel)
	}
}

// TestSuctionPlate: a low-level suction plate draws down to the level it is
// rated for.
func TestSuctionPlate(t *testing.T) {
	s := bundSiphon(t)
	s.Geometry.Intake = 0
	s.Intake = Intake{Kind: IntakeSuctionPlate, FaceDiameter: 0.2, Height: 0.005, Covered: true}
	plan, _ := PlanDrain(DrainInput{Tank: bundTank(t), Siphon: s})
	if plan.StopReason != StopIntake || math.Abs(float64(plan.StopLevel)-0.005) > 1e-9 {
		t.Errorf("plate: %s at %v", plan.StopReason, plan.StopLevel)
	}
}

// TestAirGathersBelowLevel: as the level falls and the flow with it, the
// down-leg velocity drops below the air-clearing velocity (Wisner et al.
// 1975): the plan says below which level air gathers; at that level Solve's
// velocity equals its clearing velocity. A steeper down-leg slope needs more
// velocity, so air gathers sooner.
func TestAirGathersBelowLevel(t *testing.T) {
	s := bundSiphon(t)
	s.Hose.Diameter = 0.05
	s.Hose.Length = 20
	s.Geometry.Outlet = 0
	plan, err := PlanDrain(DrainInput{Tank: bundTank(t), Siphon: s})
	if err != nil {
		t.Fatal(err)
	}
	if !plan.AirGatherFound || !(plan.AirGatherLevel < s.Geometry.Surface) || plan.StopReason != StopAir ||
		!(plan.StopLevel < plan.AirGatherLevel) {
		t.Fatalf("air gather level %v (found %v), stop %v %s", plan.AirGatherLevel, plan.AirGatherFound, plan.StopLevel, plan.StopReason)
	}
	r := solveLevel(t, s, plan.AirGatherLevel)
	testkit.Close(t, "velocity at the air-gather level (m/s)", float64(r.Velocity), float64(r.AirClearingVelocity), 1e-4,
		"Wisner et al. 1975 clearing velocity at that level")
	s.Geometry.DownLegSlope = 1 // a vertical drop just after the crest
	steep, _ := PlanDrain(DrainInput{Tank: bundTank(t), Siphon: s})
	if !steep.AirGatherFound || !(steep.AirGatherLevel > plan.AirGatherLevel) {
		t.Errorf("steep down-leg: air gathers below %v (found %v), mean slope %v", steep.AirGatherLevel, steep.AirGatherFound, plan.AirGatherLevel)
	}
}
