package calc_test

import (
	"fmt"

	"drawdown/calc"
)

// A 25 mm hose, 12 m long, over a crest 1.5 m above the water and down to an
// outlet 2.5 m below it (water at 15 °C, sea level).
func ExampleSolve() {
	r, err := calc.Solve(calc.Siphon{
		Fluid:       calc.Fluid{Density: 999.10, Viscosity: 1.1375e-3, VaporPressure: 1705.8},
		AtmPressure: 101325,
		Hoses:       1,
		Hose:        calc.Hose{Diameter: 0.025, Length: 12, Roughness: 0.01e-3, KEntrance: 0.78},
		Geometry:    calc.Geometry{Surface: 0, Intake: -0.3, Crest: 1.5, Outlet: -2.5},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s: %.1f L/min at %.2f m/s (%s)\n", r.Verdict, float64(r.Flow)*60000, float64(r.Velocity), r.Regime)
	fmt.Printf("crest %.1f kPa abs; working limit %.2f m above the surface, margin %.2f m\n",
		float64(r.CrestPressure)/1000, float64(r.WorkingCrestHeight), float64(r.CrestMargin))
	// Output:
	// runs: 57.7 L/min at 1.96 m/s (turbulent)
	// crest 80.0 kPa abs; working limit 6.05 m above the surface, margin 4.55 m
}
