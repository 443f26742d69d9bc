// Package presets is drawdown's catalogue: the liquids, hose materials, hose
// sizes, fittings, tank templates and priming methods a technician picks
// from instead of typing densities, roughnesses and loss coefficients. Every
// entry carries its source; a value from memory says so, a fact of the trade
// says "common practice", and a judgement made for this tool says "our
// choice".
//
// # What it owns
//
//   - Liquids (Liquid): density, viscosity and vapour pressure against
//     temperature over a stated valid range, a freezing or pour point, a
//     flash point and NFPA 30 class, and hazard tags (Hazard, Hazards) from
//     which the model builds the checklist. Liquid.Fluid returns a
//     calc.Fluid, or a *calc.RangeError naming the liquid and its range.
//   - Hose materials (Material) with absolute roughness ranges and a
//     vacuum rating (VacuumClass; Vacuum, gauge, positive for vacuum),
//     hose inside diameters (Hose), fittings (Fitting) with loss
//     coefficients and where they sit, tank templates (TankTemplate) for the shapes calc supports,
//     and priming methods and aids.
//   - Intakes (Intake, IntakeKind, DefaultIntake): bare end hung or on the
//     floor, strainer, foot valve, low-level suction plate, board or raft,
//     floating intake, each with its entrance K and the geometry the
//     intake physics needs (face diameter, mouth height, open area,
//     draw-down level, depth), sizes in millimetres plus hose bores.
//   - Size series (SizeSeries, Catalogue.Series, Catalogue.Bore): steel
//     pipe schedules 40 and 80 (ASME B36.10M/B36.19M), PVC schedules 40
//     and 80 (ASTM D1785), PE pipe SDR 11 and 17 (ISO 4427-2) and suction
//     and rubber hose (EN ISO 1307), each size with its bore and the band
//     its standard's tolerances allow; BoreHelp is the field help that goes
//     with them ("enter the bore").
//   - The catalogue loader for the screen and the command line alike
//     (Load: the built-in catalogue with the user preset file laid over
//     it), the user file parser (LoadUser, UserFile) and the listing
//     printed by `drawdown presets` (Catalogue.WriteListing).
//
// presets imports calc (for its SI types and water properties) and the TOML
// decoder. It must not import model, tui or main. Its one piece of file
// I/O is Load, which stats, opens and reads the user preset file; it never
// writes to a terminal. LoadUser reads from any io.Reader.
//
// # Built-in entries
//
// Builtin returns a fresh catalogue each call; nothing in the package is
// mutated. Liquids are defined in Go because their correlations are code
// (IAPWS water from calc; Sharqawy, Lienhard & Zubair (2010) seawater and
// brine; Melinder (2010) glycol tables; ASTM D341 for oils; EPA AP-42 for
// gasoline vapour pressure). The other entries live in the embedded
// catalogue.toml, written in the user preset format below.
//
// Liquid IDs: water, wastewater, greywater, bund-water, seawater, brackish,
// brine, eg30, eg50, pg30, pg50, diesel, kerosene, gasoline (winter blend,
// conservative), gasoline-summer, hydraulic-32, hydraulic-46, hydraulic-68.
// Catalogue.Liquid also accepts "seawater:S" or "brine:S" (salinity S in
// g/kg, up to 150) and "gasoline:R" (Reid vapour pressure R in kPa).
//
// # User preset file
//
// The file is TOML, by default at UserFile() (for example
// ~/.config/drawdown/presets.toml). It holds arrays of tables; an entry
// whose id matches a built-in entry replaces it, other entries are added.
// Units are in the key names. Every entry needs an id (lowercase letters,
// digits and . _ / -, up to 40) and a source. Unknown keys are errors, so a
// wrong unit suffix is caught. See testdata/user.toml for a full example.
//
//	[[liquid]]
//	id = "tank-wash"                # used with --liquid
//	name = "Tank wash water"        # optional display name
//	source = "site sample, 2026"    # default source for every property
//	hazards = ["environmental"]     # flammable, combustible, volatile, toxic,
//	                                # biohazard, environmental, hot, freezing-risk
//	t_min_c = 5                     # valid range, °C (a table defaults to its span)
//	t_max_c = 40
//	cold_c = -1                     # optional freezing or pour point, °C
//	cold_kind = "freezing point"
//	flash_c = 61                    # optional flash point, °C (sets the NFPA 30
//	boil_c = 150                    # class; boil_c only matters below 22.8 °C)
//	note = "Settle before draining."
//
//	# The properties, one of:
//	density_kg_m3 = 1010            # constant (model = "constant")
//	viscosity_mpa_s = 1.3
//	vapor_pressure_pa = 2300        # optional, default 0
//
//	[liquid.table]                  # tabulated (model = "table"): ρ linear,
//	t_c = [5, 20, 40]               # μ and p_v log-linear in temperature
//	density_kg_m3 = [1012, 1010, 1004]
//	viscosity_mpa_s = [1.9, 1.3, 0.9]
//	vapor_pressure_pa = [900, 2300, 7400]   # optional
//
//	based_on = "diesel"             # a built-in (or earlier) liquid; any of
//	                                # density_kg_m3, viscosity_mpa_s or
//	                                # vapor_pressure_pa given alongside
//	                                # replaces that property
//	model = "seawater"              # with salinity_g_kg (0-150)
//	model = "gasoline"              # with rvp_kpa (20-110)
//	model = "oil"                   # with density_15c_kg_m3 and nu1_mm2_s at
//	                                # nu1_t_c (default 40) and nu2_mm2_s at
//	                                # nu2_t_c (default 100): ASTM D341
//
//	# Optional per-property sources: density_source, viscosity_source,
//	# vapor_pressure_source, range_source, cold_source, flash_source.
//
//	[[material]]
//	id = "my-suction"
//	roughness_mm = 0.5              # central absolute roughness
//	roughness_low_mm = 0.2          # optional band
//	roughness_high_mm = 1.0
//	collapses = false               # true: flattens under suction (lay-flat)
//	vacuum = "rated"                # "rated", "not rated" (default) or "none"
//	vacuum_kpa = 80                 # the rating, gauge, positive for vacuum
//	vacuum_source = "hose marking"  # optional, default source
//	source = "maker's data"
//
//	[[hose]]
//	id = "30mm"
//	inside_diameter_mm = 30
//	series = "metric"               # or "inch"; optional
//	source = "measured"
//
//	[[fitting]]
//	id = "camlock"
//	where = "either"                # entrance, up-leg, down-leg or either
//	k = 0.3                         # or k_ft = n for K = n·f_T (Crane)
//	k_low = 0.2                     # optional band (k_ft_low, k_ft_high)
//	k_high = 0.5
//	# or bore_ratio = 0.8 for a barb or reducer: K from its insert bore over
//	# the hose bore (0.3 to 1), as BarbK
//	from_memory = false
//	source = "our estimate"
//
//	[[tank]]
//	id = "north-sump"
//	shape = "vertical-cylinder"     # vertical-cylinder, rectangular,
//	                                # horizontal-cylinder, cone-bottom,
//	                                # sloped-pit, sphere
//	sizes = { diameter = 1.2, height = 1.5 }   # metres; side-slope is run per rise
//	# needs: vertical-cylinder diameter, height; rectangular length, width,
//	# height; horizontal-cylinder diameter, length; cone-bottom diameter,
//	# cone-height, height (cone included); sloped-pit length, width (at the
//	# bottom), side-slope, height; sphere diameter
//	confined_space = true
//	source = "site drawing"
//
//	[[intake]]
//	id = "sump-strainer"
//	kind = "strainer"               # bare-hung, bare-floor, strainer, foot-valve,
//	                                # suction-plate, board, floating
//	k = 2.0                         # entrance K at the hose velocity (k_low,
//	k_source = "maker's chart"      # k_high optional; k_source defaults to source)
//	face_diameter_mm = 120          # or face_diameter_bores (default 1 bore)
//	mouth_height_mm = 90            # top of the opening above the floor, or
//	                                # mouth_height_bores (not for floating)
//	open_area_ratio = 0.35          # optional, 0.01 to 1
//	# draw_down_mm = 20             # suction-plate only: its rated level
//	# depth_mm = 150                # floating only: depth below the surface
//	source = "measured"
//
// Materials, hoses, fittings and intakes may list aliases = ["other-id"]:
// other IDs they are found by.
//
// The file may also hold [[priming]] and [[priming_aid]] entries in the form
// of catalogue.toml.
//
// A file that does not parse, has an unknown key or a value out of range
// gives a *ParseError with the file name, the line and the field, for
// example
//
//	presets.toml:14: liquid "tank-wash" t_max_c: 300 °C is out of range; accepted 5 to 200 °C
//
// A file nested deeper than 64 levels (tables, arrays and dotted keys) or
// with a key path over 1,024 characters is refused before it is decoded
// (ErrTooDeep, ErrKeyPathTooLong): the TOML decoder's cost grows with the
// square of the depth. An error line never repeats a long key path: it is
// cut with an ellipsis.
//
// Load then returns the built-in catalogue alone with the error, so the
// tool still starts. Load also refuses, with the built-in catalogue and an
// error, a path that is a directory, named pipe, device or socket
// (ErrNotRegularFile) and a file over 1 MiB (ErrTooLarge); a missing file
// is no error.
//
// # Cautions
//
// The catalogue plans a job; it does not make it safe. Values are typical or
// conservative and every correlation has limits. A product's safety data
// sheet, the site's written procedures, local codes and permits come first.
// A siphon is never started by mouth (NeverByMouth).
package presets
