package model_test

import (
	"fmt"
	"os"
	"path/filepath"

	"drawdown/model"
)

// Parse reads what a technician types, with or without a unit, and returns
// SI units; Format shows a value in either system.
func ExampleParse() {
	d, err := model.Parse(model.DimDiameter, "3/4 in", model.SI)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.5f m\n", d)
	fmt.Println(model.Format(model.DimDiameter, d, model.SI))
	fmt.Println(model.Format(model.DimDiameter, d, model.US))

	_, err = model.Parse(model.DimLength, "1e400", model.SI)
	fmt.Println(err)
	// Output:
	// 0.01905 m
	// 19.1 mm
	// 0.750 in
	// cannot read "1e400" as a length: number too large; accepted units m, cm, mm, µm, ft, in
}

// A field names itself and its accepted range in the unit system in use.
func ExampleFieldSpec_Validate() {
	f, _ := model.FieldByID(model.FieldHoseID)
	_, err := f.Validate("0", model.SI)
	fmt.Println(err)
	_, err = f.Validate("30 in", model.US)
	fmt.Println(err)
	// Output:
	// Hose inside diameter: 0 mm is out of range; accepted 3 to 600 mm
	// Hose inside diameter: 30 in is out of range; accepted 0.118 to 23.6 in
}

// Save a job and load it back; the job file keeps every input exactly as
// typed.
func ExampleSaveAtomic() {
	dir, err := os.MkdirTemp("", "drawdown-example")
	if err != nil {
		fmt.Println(err)
		return
	}
	defer os.RemoveAll(dir)
	job := model.DemoJob()
	job.Set(model.FieldHoseID, "1-1/2in")

	path := filepath.Join(dir, "bund.json")
	if err := model.SaveAtomic(path, job); err != nil {
		fmt.Println(err)
		return
	}
	back, err := model.Load(path)
	if err != nil {
		fmt.Println(err)
		return
	}
	d, _ := back.Value(model.FieldHoseID)
	fmt.Println(back.Name)
	fmt.Println(back.Text(model.FieldHoseID), "=", model.Format(model.DimDiameter, d, back.Units))
	// Output:
	// Bund B2 rainwater release
	// 1-1/2in = 38.1 mm
}
