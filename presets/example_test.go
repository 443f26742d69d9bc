package presets_test

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"drawdown/calc"
	"drawdown/presets"
)

// Look up a liquid and a hose, then read the liquid's properties at the
// job's temperature and its hazards.
func ExampleCatalogue_Liquid() {
	c := presets.Builtin()

	diesel, _ := c.Liquid("diesel")
	f, err := diesel.Fluid(calc.Celsius(15), 101325)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s at 15 °C: %.0f kg/m³, %.2f mPa·s\n", diesel.Name, float64(f.Density), float64(f.Viscosity)*1e3)
	fmt.Println("hazards:", diesel.HazardsAt(calc.Celsius(15)))
	fmt.Println("NFPA 30 class:", diesel.Class)

	hose, _ := c.Hose("1-1/2in")
	wall, _ := c.Material("suction-corrugated")
	fmt.Printf("%s: bore %.4f m, roughness %.1f mm (%.1f to %.1f)\n", hose.Name, float64(hose.Diameter),
		float64(wall.Roughness)*1e3, float64(wall.RoughnessLow)*1e3, float64(wall.RoughnessHigh)*1e3)

	fv, _ := c.Fitting("foot-valve")
	fmt.Printf("%s: K = %g (%g to %g), at the %s\n", fv.Name, fv.K.Central, fv.K.Low, fv.K.High, fv.Where)

	_, err = diesel.Fluid(calc.Celsius(-20), 101325)
	fmt.Println(err)
	// Output:
	// Diesel fuel at 15 °C: 835 kg/m³, 4.60 mPa·s
	// hazards: combustible, toxic, environmental
	// NFPA 30 class: II
	// 1-1/2 in (38.1 mm): bore 0.0381 m, roughness 1.0 mm (0.3 to 4.0)
	// Foot valve with strainer: K = 15 (15 to 30), at the entrance
	// Diesel fuel temperature 253.15 K is out of range; accepted 268.15 to 333.15 K (range of the diesel property data)
}

// A preset file with a mistake: the error names the line and the field, and
// Load still returns the built-in catalogue, so the tool starts.
func ExampleLoad() {
	dir, err := os.MkdirTemp("", "drawdown-example")
	if err != nil {
		fmt.Println(err)
		return
	}
	defer os.RemoveAll(dir)
	path := filepath.Join(dir, "presets.toml")
	file := `[[liquid]]
id = "tank-wash"
source = "site sample"
t_min_c = 5
t_max_c = 300
density_kg_m3 = 1010
viscosity_mpa_s = 1.3
`
	if err := os.WriteFile(path, []byte(file), 0o600); err != nil {
		fmt.Println(err)
		return
	}
	c, err := presets.Load(path)
	fmt.Println(strings.TrimPrefix(err.Error(), dir+string(filepath.Separator)))
	_, ok := c.Liquid("water")
	fmt.Println("built-in water still there:", ok)
	// Output:
	// presets.toml:5: liquid "tank-wash" t_max_c: 300 °C is out of range; accepted 5 to 200 °C
	// built-in water still there: true
}
