package main

import (
	"math"
	"strconv"

	"drawdown/model"
	"drawdown/model/present"
)

// calcSchema names the JSON document of `drawdown calc --json`, in its
// "schema" key. The number after the slash changes only when a key is
// removed or changes meaning; new keys may be added under the same number.
const calcSchema = "drawdown-calc/1"

// jsonDigits is the number of significant figures in the JSON numbers: far
// more than any input is measured to (a tape reads 3 or 4 figures), few
// enough that float noise never shows.
const jsonDigits = 6

// jsonNum rounds to jsonDigits significant figures and guarantees a finite
// number (calc never returns NaN or Inf; this is the last guard).
func jsonNum(v float64) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0
	}
	r, err := strconv.ParseFloat(strconv.FormatFloat(v, 'g', jsonDigits, 64), 64)
	if err != nil || r == 0 {
		return 0 // also turns -0 into 0
	}
	return r
}

// jsonPtr is jsonNum for a key that is null when it does not apply.
func jsonPtr(v float64) *float64 {
	r := jsonNum(v)
	return &r
}

type jsonWarning struct {
	Code    string `json:"code"`
	Message string `json:"message"`
}

type jsonDrain struct {
	TimeS            float64  `json:"time_s"`
	TimeLowS         float64  `json:"time_low_s"`
	TimeHighS        float64  `json:"time_high_s"`
	VolumeM3         float64  `json:"volume_m3"`
	StopLevelM       float64  `json:"stop_level_m"`
	StopReason       string   `json:"stop_reason"`
	ResidualM3       float64  `json:"residual_m3"`
	CrestLimitLevelM *float64 `json:"crest_limit_level_m"`
	StartFlowM3S     float64  `json:"start_flow_m3_s"`
	ReceiverLevelM   *float64 `json:"receiver_level_m,omitempty"`
	TargetLevelM     float64  `json:"target_level_m"`
	AirStartsLevelM  float64  `json:"air_starts_level_m"`
	PrimeLostLevelM  float64  `json:"prime_lost_level_m"`
	// The forecast (issue 13's contract): inflow, settle level (null when
	// the siphon keeps up or nothing comes in), time to 90 % of the volume,
	// the band's main input, the finishing pump's time (null without a
	// pump rate, or when the pump cannot keep up: pump_falls_behind).
	InflowM3S       float64     `json:"inflow_m3_s"`
	SettleLevelM    *float64    `json:"settle_level_m"`
	TimeTo90pctS    float64     `json:"time_to_90pct_s"`
	RangeDriver     string      `json:"range_driver"`
	RangeLevelM     float64     `json:"range_level_m"`
	FinishLowM      float64     `json:"finish_low_m"`
	FinishHighM     float64     `json:"finish_high_m"`
	PumpFinishS     *float64    `json:"pump_finish_s"`
	PumpFallsBehind bool        `json:"pump_falls_behind,omitempty"`
	Curve           []jsonPoint `json:"curve,omitempty"`
}

// jsonPoint is one point of the drain curve (with --curve).
type jsonPoint struct {
	TimeS          float64  `json:"time_s"`
	LevelM         float64  `json:"level_m"`
	FlowM3S        float64  `json:"flow_m3_s"`
	ReceiverLevelM *float64 `json:"receiver_level_m,omitempty"`
}

type jsonResult struct {
	Schema               string        `json:"schema"`
	Verdict              string        `json:"verdict"`
	Fix                  string        `json:"fix,omitempty"`
	Liquid               string        `json:"liquid"`
	TemperatureK         float64       `json:"temperature_k"`
	AtmPressurePa        float64       `json:"atm_pressure_pa"`
	VaporPressurePa      float64       `json:"vapor_pressure_pa"`
	DensityKgM3          float64       `json:"density_kg_m3"`
	ViscosityPaS         float64       `json:"viscosity_pa_s"`
	LiftM                float64       `json:"lift_m"`
	DropM                float64       `json:"drop_m"`
	MaxCrestHeightM      float64       `json:"max_crest_height_m"`
	FlowingCrestLimitM   float64       `json:"flowing_crest_limit_m"`
	WorkingCrestHeightM  float64       `json:"working_crest_height_m"`
	CrestMarginM         float64       `json:"crest_margin_m"`
	CrestPressurePa      float64       `json:"crest_pressure_pa"`
	FlowM3S              float64       `json:"flow_m3_s"`
	FlowLowM3S           float64       `json:"flow_low_m3_s"`
	FlowHighM3S          float64       `json:"flow_high_m3_s"`
	VelocityMS           float64       `json:"velocity_m_s"`
	Reynolds             float64       `json:"reynolds"`
	FrictionFactor       float64       `json:"friction_factor"`
	Regime               string        `json:"regime"`
	RequiredSubmergenceM float64       `json:"required_submergence_m"`
	AirClearingVelocity  float64       `json:"air_clearing_velocity_m_s"`
	OutletThrottleK      *float64      `json:"outlet_throttle_k"`
	HoseVacuumWorstPa    float64       `json:"hose_vacuum_worst_pa"`
	HoseVacuumRatingPa   *float64      `json:"hose_vacuum_rating_pa"`
	AirStartsLevelM      float64       `json:"air_starts_level_m"`
	PrimeLostLevelM      float64       `json:"prime_lost_level_m"`
	PrimingVolumeM3      float64       `json:"priming_volume_m3"`
	PumpStrokes          int           `json:"pump_strokes,omitempty"`
	Warnings             []jsonWarning `json:"warnings"`
	Notes                []string      `json:"notes"`
	Cautions             []string      `json:"cautions"`
	// With --measured-flow: the tests' count and the flow planned from the
	// fittings before the plan was fitted to them (flow_m3_s is the fitted
	// one).
	FlowTests      int        `json:"flow_tests,omitempty"`
	PlannedFlowM3S *float64   `json:"planned_flow_m3_s,omitempty"`
	Drain          *jsonDrain `json:"drain,omitempty"`
}

// jsonOf lays the plan out as the JSON document; curve adds the drain
// curve.
func jsonOf(p model.Plan, curve bool) jsonResult {
	r := p.Result
	s := p.Siphon
	j := jsonResult{
		Schema:               calcSchema,
		Verdict:              r.Verdict.String(),
		Fix:                  present.FixOf(r, p.Liquid, present.Figures{Sys: model.SI}),
		Liquid:               p.Liquid.ID,
		TemperatureK:         jsonNum(float64(p.Temperature)),
		AtmPressurePa:        jsonNum(float64(s.AtmPressure)),
		VaporPressurePa:      jsonNum(float64(s.Fluid.VaporPressure)),
		DensityKgM3:          jsonNum(float64(s.Fluid.Density)),
		ViscosityPaS:         jsonNum(float64(s.Fluid.Viscosity)),
		LiftM:                jsonNum(float64(s.Geometry.Lift())),
		DropM:                jsonNum(float64(s.Geometry.Drop())),
		MaxCrestHeightM:      jsonNum(float64(r.MaxCrestHeight)),
		FlowingCrestLimitM:   jsonNum(float64(r.FlowingCrestLimit)),
		WorkingCrestHeightM:  jsonNum(float64(r.WorkingCrestHeight)),
		CrestMarginM:         jsonNum(float64(r.CrestMargin)),
		CrestPressurePa:      jsonNum(float64(r.CrestPressure)),
		FlowM3S:              jsonNum(float64(r.Flow)),
		FlowLowM3S:           jsonNum(float64(p.FlowLow)),
		FlowHighM3S:          jsonNum(float64(p.FlowHigh)),
		VelocityMS:           jsonNum(float64(r.Velocity)),
		Reynolds:             jsonNum(r.Reynolds),
		FrictionFactor:       jsonNum(r.FrictionFactor),
		Regime:               r.Regime.String(),
		RequiredSubmergenceM: jsonNum(float64(r.RequiredSubmergence)),
		AirClearingVelocity:  jsonNum(float64(r.AirClearingVelocity)),
		HoseVacuumWorstPa:    jsonNum(float64(r.HoseVacuumWorst)),
		AirStartsLevelM:      jsonNum(float64(r.AirStartsLevel)),
		PrimeLostLevelM:      jsonNum(float64(r.PrimeLostLevel)),
		PrimingVolumeM3:      jsonNum(float64(r.PrimingVolume)),
		PumpStrokes:          p.PumpStrokes,
		Warnings:             []jsonWarning{},
		Notes:                append([]string{}, p.Notes...),
		Cautions:             present.Cautions(p),
	}
	if r.HasOutletThrottle {
		j.OutletThrottleK = jsonPtr(r.OutletThrottleK)
	}
	if r.HoseRated {
		j.HoseVacuumRatingPa = jsonPtr(float64(r.HoseVacuumRating))
	}
	if p.TestFit != nil {
		j.FlowTests = len(p.Tests)
		j.PlannedFlowM3S = jsonPtr(float64(p.PlannedFlow))
	}
	for _, w := range present.WarningsOf(r, present.Figures{Sys: model.SI}) {
		j.Warnings = append(j.Warnings, jsonWarning{Code: w.Code, Message: w.Long})
	}
	if d := p.Drain; d != nil {
		jd := &jsonDrain{
			TimeS:           jsonNum(float64(d.Time)),
			TimeLowS:        jsonNum(float64(p.TimeLow)),
			TimeHighS:       jsonNum(float64(p.TimeHigh)),
			VolumeM3:        jsonNum(float64(d.Volume)),
			StopLevelM:      jsonNum(float64(d.StopLevel)),
			StopReason:      string(d.StopReason),
			ResidualM3:      jsonNum(float64(d.Residual)),
			StartFlowM3S:    jsonNum(float64(d.StartFlow)),
			TargetLevelM:    jsonNum(float64(p.DrainIn.Target)),
			AirStartsLevelM: jsonNum(float64(d.AirStartsLevel)),
			PrimeLostLevelM: jsonNum(float64(d.PrimeLostLevel)),
		}
		if d.CrestLimitFound {
			v := jsonNum(float64(d.CrestLimitLevel))
			jd.CrestLimitLevelM = &v
		}
		if p.Receiver != nil {
			v := jsonNum(float64(d.ReceiverLevel))
			jd.ReceiverLevelM = &v
		}
		forecastJSON(jd, p)
		if curve {
			for _, pt := range d.Curve {
				jp := jsonPoint{TimeS: jsonNum(float64(pt.Time)), LevelM: jsonNum(float64(pt.Level)), FlowM3S: jsonNum(float64(pt.Flow))}
				if p.Receiver != nil {
					v := jsonNum(float64(pt.ReceiverLevel))
					jp.ReceiverLevelM = &v
				}
				jd.Curve = append(jd.Curve, jp)
			}
		}
		j.Drain = jd
	}
	return j
}

// forecastJSON fills the drain's forecast keys.
func forecastJSON(jd *jsonDrain, p model.Plan) {
	d := p.Drain
	jd.InflowM3S = jsonNum(float64(p.Inflow.Total))
	if d.SettleFound {
		jd.SettleLevelM = jsonPtr(float64(d.SettleLevel))
	}
	jd.TimeTo90pctS = jsonNum(float64(d.Time90))
	jd.RangeDriver = present.RangeDriver(p)
	jd.RangeLevelM, jd.FinishLowM, jd.FinishHighM = jsonNum(float64(d.StopLevel)), jsonNum(float64(d.StopLevel)), jsonNum(float64(d.StopLevel))
	if b := p.Band; b != nil {
		jd.RangeLevelM = jsonNum(float64(b.Level))
		jd.FinishLowM, jd.FinishHighM = jsonNum(float64(b.FinishLow)), jsonNum(float64(b.FinishHigh))
	}
	if p.PumpFinish > 0 {
		jd.PumpFinishS = jsonPtr(float64(p.PumpFinish))
	}
	jd.PumpFallsBehind = p.PumpFallsBehind
}
