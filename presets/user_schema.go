package presets

// The preset file schema: one struct per [[section]], decoded by the TOML
// library. Pointers mark optional numbers, so a missing key differs from 0.

type fileDoc struct {
	Liquid     []liquidDoc   `toml:"liquid"`
	Material   []materialDoc `toml:"material"`
	Hose       []hoseDoc     `toml:"hose"`
	Fitting    []fittingDoc  `toml:"fitting"`
	Tank       []tankDoc     `toml:"tank"`
	Priming    []primingDoc  `toml:"priming"`
	PrimingAid []aidDoc      `toml:"priming_aid"`
	Intake     []intakeDoc   `toml:"intake"`
}

type liquidDoc struct {
	ID       string   `toml:"id"`
	Name     string   `toml:"name"`
	Basis    string   `toml:"basis"`
	Source   string   `toml:"source"`
	Note     string   `toml:"note"`
	TMin     *float64 `toml:"t_min_c"`
	TMax     *float64 `toml:"t_max_c"`
	Cold     *float64 `toml:"cold_c"`
	ColdKind string   `toml:"cold_kind"`
	Flash    *float64 `toml:"flash_c"`
	Boil     *float64 `toml:"boil_c"`
	Hazards  []string `toml:"hazards"`
	BasedOn  string   `toml:"based_on"`
	Model    string   `toml:"model"`

	Density   *float64 `toml:"density_kg_m3"`
	Viscosity *float64 `toml:"viscosity_mpa_s"`
	Vapor     *float64 `toml:"vapor_pressure_pa"`

	Salinity *float64 `toml:"salinity_g_kg"`
	RVP      *float64 `toml:"rvp_kpa"`

	Density15 *float64 `toml:"density_15c_kg_m3"`
	Nu1       *float64 `toml:"nu1_mm2_s"`
	Nu1T      *float64 `toml:"nu1_t_c"`
	Nu2       *float64 `toml:"nu2_mm2_s"`
	Nu2T      *float64 `toml:"nu2_t_c"`

	Table *tableDoc `toml:"table"`

	DensitySource   string `toml:"density_source"`
	ViscositySource string `toml:"viscosity_source"`
	VaporSource     string `toml:"vapor_pressure_source"`
	RangeSource     string `toml:"range_source"`
	ColdSource      string `toml:"cold_source"`
	FlashSource     string `toml:"flash_source"`
}

type tableDoc struct {
	T         []float64 `toml:"t_c"`
	Density   []float64 `toml:"density_kg_m3"`
	Viscosity []float64 `toml:"viscosity_mpa_s"`
	Vapor     []float64 `toml:"vapor_pressure_pa"`
}

type materialDoc struct {
	ID        string   `toml:"id"`
	Aliases   []string `toml:"aliases"`
	Name      string   `toml:"name"`
	Rough     *float64 `toml:"roughness_mm"`
	RoughLow  *float64 `toml:"roughness_low_mm"`
	RoughHigh *float64 `toml:"roughness_high_mm"`
	Collapses bool     `toml:"collapses"`
	Vacuum    string   `toml:"vacuum"`
	VacuumKPa *float64 `toml:"vacuum_kpa"`
	VacuumSrc string   `toml:"vacuum_source"`
	Source    string   `toml:"source"`
	Note      string   `toml:"note"`
}

type hoseDoc struct {
	ID       string   `toml:"id"`
	Aliases  []string `toml:"aliases"`
	Name     string   `toml:"name"`
	Diameter *float64 `toml:"inside_diameter_mm"`
	Series   string   `toml:"series"`
	Source   string   `toml:"source"`
}

type fittingDoc struct {
	ID         string   `toml:"id"`
	Aliases    []string `toml:"aliases"`
	Name       string   `toml:"name"`
	Where      string   `toml:"where"`
	K          *float64 `toml:"k"`
	KLow       *float64 `toml:"k_low"`
	KHigh      *float64 `toml:"k_high"`
	KFT        *float64 `toml:"k_ft"`
	KFTLow     *float64 `toml:"k_ft_low"`
	KFTHigh    *float64 `toml:"k_ft_high"`
	BoreRatio  *float64 `toml:"bore_ratio"`
	FromMemory bool     `toml:"from_memory"`
	Source     string   `toml:"source"`
	Note       string   `toml:"note"`
}

type tankDoc struct {
	ID       string             `toml:"id"`
	Name     string             `toml:"name"`
	Shape    string             `toml:"shape"`
	Sizes    map[string]float64 `toml:"sizes"`
	Confined bool               `toml:"confined_space"`
	Source   string             `toml:"source"`
	Note     string             `toml:"note"`
}

type primingDoc struct {
	ID      string   `toml:"id"`
	Name    string   `toml:"name"`
	Summary string   `toml:"summary"`
	NotFor  []string `toml:"not_for"`
	Caution string   `toml:"caution"`
	Source  string   `toml:"source"`
}

type aidDoc struct {
	ID         string   `toml:"id"`
	Name       string   `toml:"name"`
	StrokeLow  *float64 `toml:"stroke_low_ml"`
	StrokeHigh *float64 `toml:"stroke_high_ml"`
	Source     string   `toml:"source"`
	Note       string   `toml:"note"`
}

type intakeDoc struct {
	ID         string   `toml:"id"`
	Aliases    []string `toml:"aliases"`
	Name       string   `toml:"name"`
	Kind       string   `toml:"kind"`
	K          *float64 `toml:"k"`
	KLow       *float64 `toml:"k_low"`
	KHigh      *float64 `toml:"k_high"`
	FromMemory bool     `toml:"from_memory"`
	KSource    string   `toml:"k_source"`
	FaceMM     *float64 `toml:"face_diameter_mm"`
	FaceBores  *float64 `toml:"face_diameter_bores"`
	MouthMM    *float64 `toml:"mouth_height_mm"`
	MouthBores *float64 `toml:"mouth_height_bores"`
	OpenRatio  *float64 `toml:"open_area_ratio"`
	DrawDownMM *float64 `toml:"draw_down_mm"`
	DepthMM    *float64 `toml:"depth_mm"`
	Source     string   `toml:"source"`
	Note       string   `toml:"note"`
}
