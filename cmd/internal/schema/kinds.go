package schema

import "kneeprint/cmd/internal/units"

// The sections of each kind of file, in the order the starters write them. Ranges in
// the descriptions are the loader's (cmd/internal/spec).

func aircraftSections() []section {
	return []section{
		{"kind", true, func() obj { return constant("aircraft", "This file is an aircraft performance profile.") }},
		{"name", true, func() obj { return text("Your own name for this profile, printed on the cards", true) }},
		{"type", true, func() obj { return text("The aircraft type as the flight manual names it", true) }},
		{"notes", false, func() obj { return text("Where the figures come from (manual, section, who typed them, when)", false) }},
		{"mtow", true, func() obj { return quantity(units.Mass, "Maximum takeoff mass (100 to 5670 kg)") }},
		{"min_mass", false, func() obj {
			return quantity(units.Mass, "Lowest flyable mass: empty mass, the lightest crew, the least fuel. Required without a table; with one, default its lightest block. A weight below it is refused as a typing slip")
		}},
		{"weights", false, func() obj {
			return quantities(units.Mass, "The weights the cards show, none above the MTOW (at most 8; default the MTOW only)", 0, 8)
		}},
		{"speeds", false, speedsSchema},
		{"limits", true, limitsSchema},
		{"takeoff_flap", true, func() obj { return text("The flap setting the data are for, as the manual prints it", true) }},
		{"model", false, func() obj {
			return oneOf("Which model the cards use; required when the profile has both a table and a physics section.", "table", "physics")
		}},
		{"flaps", false, flapsSchema},
		{"table", false, tableSchema},
		{"physics", false, physicsSchema},
		{"climb", false, climbSchema},
		{"landing", false, landingSchema},
	}
}

// aircraftRules adds what depends on more than one key: a model section, min_mass
// without a table, the speeds and flaps physics needs, model naming a section.
func aircraftRules(root obj) {
	root["anyOf"] = []any{obj{"required": []string{"table"}}, obj{"required": []string{"physics"}}}
	root["allOf"] = []any{
		obj{"if": obj{"required": []string{"table", "physics"}}, "then": obj{"required": []string{"model"}}},
		obj{"if": obj{"not": obj{"required": []string{"table"}}}, "then": obj{"required": []string{"min_mass"}}},
		obj{"if": obj{"required": []string{"physics"}}, "then": obj{
			"required":   []string{"speeds", "flaps"},
			"properties": obj{"speeds": obj{"type": "object", "required": []string{"rotation", "at_50ft"}}},
		}},
		obj{"if": obj{"required": []string{"model"}, "properties": obj{"model": obj{"const": "physics"}}}, "then": obj{"required": []string{"physics"}}},
		obj{"if": obj{"required": []string{"model"}, "properties": obj{"model": obj{"const": "table"}}}, "then": obj{"required": []string{"table"}}},
		// Only a physics profile may give the climb speed alone.
		obj{"if": obj{"not": obj{"required": []string{"physics"}}, "required": []string{"climb"}}, "then": obj{"properties": obj{"climb": obj{
			"anyOf": []any{obj{"required": []string{"rate_of_climb"}}, obj{"required": []string{"weights"}}},
		}}}},
	}
}

func speedsSchema() obj {
	return object("The manual's speeds, indicated airspeed; the physics model needs both.", obj{
		"rotation": quantity(units.Speed, "Rotation (lift-off) speed from the manual, IAS"),
		"at_50ft":  quantity(units.Speed, "Speed at the 50 ft screen from the manual, IAS; not below the rotation speed"),
	})
}

func limitsSchema() obj {
	return object("The manual's limits (and your club's).", obj{
		"demonstrated_crosswind": quantity(units.Speed, "The manual's maximum demonstrated crosswind component: advisory, framed on the card (1 to 60 kt)"),
		"max_crosswind":          quantity(units.Speed, "Optional real crosswind limit, the manual's or your club's; past it a cell is beyond limits. 0 kt is refused: leave it out for no limit"),
		"max_tailwind":           quantity(units.Speed, "Tailwind limit (default 10 kt; at most 30 kt)"),
		"min_temperature":        quantity(units.Temperature, "Optional declared operating limit (-60 to 60 C); colder is beyond limits"),
		"max_temperature":        quantity(units.Temperature, "Optional declared operating limit (-60 to 60 C); hotter is beyond limits"),
	}, "demonstrated_crosswind")
}

func flapsSchema() obj {
	return list(object("A flap setting and its maximum lift coefficient.", obj{
		"name":  text("The flap setting as the manual prints it (takeoff_flap names one)", true),
		"clmax": plainNumber("Maximum lift coefficient in this setting", 0.8, 3.5),
	}, "name", "clmax"), "Flap settings with their CLmax; the physics model needs the takeoff flap's.", 0, 0)
}

// tableSchema is the flight manual's takeoff table.
func tableSchema() obj {
	return manualTable("to_50ft", "Total distance to 50 ft",
		"The manual's takeoff table for a paved, dry, level runway: figures over pressure altitude x temperature x weight.")
}

// manualTable is a flight manual's distance table: ground roll and the total distance
// (key total: to 50 ft for takeoff, from 50 ft for landing) over pressure altitude x
// temperature x weight, with the manual's own notes.
func manualTable(total, totalDesc, desc string) obj {
	rows := func(what string) obj {
		return list(list(obj{"type": "number", "minimum": 1, "description": "A distance in the table's distance_unit, as the manual prints it."},
			"One row: one figure per temperature, in the order of temperatures.", 1, 0),
			what+": one row per pressure altitude, one figure per temperature, plain numbers in distance_unit.", 1, 0)
	}
	block := object("One weight's figures.", obj{
		"weight":      quantity(units.Mass, "The weight of this block"),
		"ground_roll": rows("Ground roll"),
		total:         rows(totalDesc),
	}, "weight", "ground_roll", total)
	return object(desc, obj{
		"wind_factoring_included": boolean("Required, no default: true when the manual's chart or wind notes already credit only part of a headwind and more than all of a tailwind (the manual says so beside the chart); false when its wind notes are for the full reported wind or it has none. false is the conservative answer when in doubt."),
		"distance_unit":           oneOf("The unit the rows are printed in.", "m", "ft"),
		"pressure_altitudes":      quantities(units.Length, "The rows: pressure altitudes, strictly increasing (-2000 to 20000 ft)", 1, 0),
		"temperatures":            quantities(units.Temperature, "The columns: temperatures, strictly increasing (-60 to 60 C)", 1, 0),
		"weights":                 list(block, "One block per weight of the table.", 1, 0),
		"corrections":             correctionsSchema(),
	}, "wind_factoring_included", "distance_unit", "pressure_altitudes", "temperatures", "weights")
}

// landingSchema is the landing section: the landing flap, approach speed and maximum
// landing mass, the manual's landing table and/or a physics landing model calibrated
// to the manual's landing figures.
func landingSchema() obj {
	point := calibrationPoint("from_50ft", "The manual's landing distance from 50 ft")
	physics := object("A physics landing model on the airframe of the profile's physics section, calibrated to the manual's landing figures.", obj{
		"cd0":              plainNumber("Zero-lift drag coefficient, landing flap and gear (default the takeoff cd0)", 0.01, 0.2),
		"cl_ground_roll":   plainNumber("Lift coefficient in the landing-roll attitude (default the takeoff cl_ground_run)", 0, 2),
		"free_roll_time":   quantity(units.Duration, "Time from touchdown to braking (default 1 s; 0 to 5 s)"),
		"approach_angle":   quantity(units.Angle, "Starting value of the fitted approach angle below the horizontal (2 to 12 deg)"),
		"braking_fraction": plainNumber("Starting value of the fitted fraction of the surface's braking coefficient", 0.15, 1.0),
		"calibration":      list(point, "The manual's landing figures the physics is fitted to (at most 50): at least one at the maximum landing mass, paved, dry.", 0, 50),
	})
	l := object("The landing: the card's landing side and check's landing answer.", obj{
		"flap":             text("The landing flap setting, as the manual prints it (the physics needs its clmax in flaps)", true),
		"approach_speed":   quantity(units.Speed, "The approach speed over the 50 ft screen at the maximum landing mass, IAS (30 to 120 kt)"),
		"max_landing_mass": quantity(units.Mass, "The maximum landing mass (default the MTOW; not above it)"),
		"model":            oneOf("Which landing model the cards use; required when the section has both a table and physics.", "table", "physics"),
		"table": manualTable("from_50ft", "Total distance from 50 ft to a stop",
			"The manual's landing table for a paved, dry, level runway: figures over pressure altitude x temperature x weight."),
		"physics": physics,
	}, "flap")
	l["anyOf"] = []any{obj{"required": []string{"table"}}, obj{"required": []string{"physics"}}}
	l["allOf"] = []any{obj{"if": obj{"required": []string{"table", "physics"}}, "then": obj{"required": []string{"model"}}}}
	return l
}

func correctionsSchema() obj {
	groundRoll := func(what string) obj {
		return object(what, obj{"add_of_ground_roll": quantity(units.Percent, "Percentage of the ground roll added to both distances")}, "add_of_ground_roll")
	}
	return object("The manual's correction notes, as data; leave out those it lacks.", obj{
		"headwind": object("Decrease the distances by `decrease` for each `per` of headwind, up to `up_to` when the manual gives one (beyond: no data).", obj{
			"decrease": quantity(units.Percent, "Decrease per step (0 to 50 %)"),
			"per":      quantity(units.Speed, "Per this much headwind"),
			"up_to":    quantity(units.Speed, "Optional: the largest headwind the note covers (1 to 60 kt); without it, no data past half the lift-off speed when speeds.rotation is given"),
		}, "decrease", "per"),
		"tailwind": object("Increase the distances by `increase` for each `per` of tailwind, up to `up_to` (beyond: no data).", obj{
			"increase": quantity(units.Percent, "Increase per step (0 to 100 %)"),
			"per":      quantity(units.Speed, "Per this much tailwind"),
			"up_to":    quantity(units.Speed, "The largest tailwind the note covers"),
		}, "increase", "per", "up_to"),
		"grass":     groundRoll("On dry grass: add a percentage of the ground roll."),
		"wet_grass": groundRoll("On wet grass: add a percentage of the ground roll."),
	})
}

// climbSchema is the all-engines climb: the manual's climb speed and its rate-of-climb
// table (one table for the MTOW, or one block per weight), or in a physics profile the
// speed alone.
func climbSchema() obj {
	rows := list(list(obj{"type": "number", "minimum": -2000, "maximum": 5000, "description": "A rate of climb in rate_unit, as the manual prints it."},
		"One row: one rate per temperature, in the order of temperatures.", 1, 0),
		"Rates of climb: one row per pressure altitude, one rate per temperature, plain numbers in rate_unit.", 1, 0)
	block := object("One weight's rates.", obj{
		"weight":        quantity(units.Mass, "The weight of this block"),
		"rate_of_climb": rows,
	}, "weight", "rate_of_climb")
	c := object("The all-engines climb after takeoff, for obstacles past the runway end: the manual's climb speed and rate-of-climb table; a physics profile may give the speed alone (its calibrated excess power is then used).", obj{
		"speed":              quantity(units.Speed, "The manual's climb speed, IAS (40 to 150 kt)"),
		"rate_unit":          oneOf("The unit the rates are printed in.", "ft/min", "m/s"),
		"pressure_altitudes": quantities(units.Length, "The rows: pressure altitudes, strictly increasing (-2000 to 20000 ft)", 1, 0),
		"temperatures":       quantities(units.Temperature, "The columns: temperatures, strictly increasing (-60 to 60 C)", 1, 0),
		"rate_of_climb":      rows,
		"weights":            list(block, "One block per weight of the table (instead of rate_of_climb).", 1, 0),
	}, "speed")
	c["not"] = obj{"required": []string{"rate_of_climb", "weights"}}
	table := obj{"anyOf": []any{obj{"required": []string{"rate_of_climb"}}, obj{"required": []string{"weights"}}}}
	c["allOf"] = []any{
		obj{"if": obj{"anyOf": []any{obj{"required": []string{"rate_unit"}}, obj{"required": []string{"pressure_altitudes"}},
			obj{"required": []string{"temperatures"}}, obj{"required": []string{"rate_of_climb"}}, obj{"required": []string{"weights"}}}},
			"then": obj{"required": []string{"rate_unit", "pressure_altitudes", "temperatures"}, "allOf": []any{table}}},
	}
	return c
}

// calibrationPoint is one of the manual's figures a physics model is fitted to: its
// conditions, the ground roll and/or the total distance (key total).
func calibrationPoint(total, totalDesc string) obj {
	point := object("One of the manual's figures the physics is fitted to.", obj{
		"source":            text("Where the figure comes from", false),
		"pressure_altitude": quantity(units.Length, "Pressure altitude of the figure"),
		"temperature":       quantity(units.Temperature, "Temperature of the figure"),
		"weight":            quantity(units.Mass, "Weight of the figure"),
		"surface":           oneOf("Surface of the figure (default paved).", "paved", "grass", "gravel"),
		"condition":         oneOf("Condition of the figure (default dry).", "dry", "wet"),
		"headwind":          quantity(units.Speed, "The wind the figure is for, used as written (default 0 kt)"),
		"ground_roll":       quantity(units.Length, "The manual's ground roll"),
		total:               quantity(units.Length, totalDesc),
	}, "pressure_altitude", "temperature", "weight")
	point["anyOf"] = []any{obj{"required": []string{"ground_roll"}}, obj{"required": []string{total}}}
	return point
}

// physicsSchema is the physics description and its calibration points.
func physicsSchema() obj {
	point := calibrationPoint("to_50ft", "The manual's total distance to 50 ft")
	return object("A physics description of the aircraft, calibrated to the manual's figures.", obj{
		"wing_area":     quantity(units.Area, "Wing area (5 to 60 m2)"),
		"span":          quantity(units.Length, "Wing span (4 to 25 m)"),
		"wing_height":   quantity(units.Length, "Height of the wing above the ground (0.3 to 4 m)"),
		"cd0":           plainNumber("Zero-lift drag coefficient", 0.01, 0.15),
		"oswald":        plainNumber("Oswald efficiency factor", 0.4, 1.0),
		"cl_ground_run": plainNumber("Lift coefficient in the ground run", 0, 1.5),
		"power":         quantity(units.Power, "Engine power (20 to 600 kW)"),
		"propeller": object("The propeller.", obj{
			"type":                   oneOf("Propeller type.", "fixed_pitch", "constant_speed"),
			"diameter":               quantity(units.Length, "Propeller diameter (1 to 3.5 m)"),
			"efficiency":             plainNumber("Starting value of the fitted propeller efficiency", 0.35, 0.85),
			"static_thrust_fraction": plainNumber("Starting value of the fitted static thrust, a fraction of the momentum-theory ideal", 0.35, 1.0),
		}, "type", "diameter"),
		"rotation_time": quantity(units.Duration, "Time from rotation to lift-off (default 1 s; 0 to 5 s)"),
		"calibration":   list(point, "The manual's figures the physics is fitted to (at most 50): at least one at MTOW, paved, dry.", 0, 50),
	}, "wing_area", "span", "wing_height", "cd0", "oswald", "cl_ground_run", "power", "propeller")
}

func airfieldSections() []section {
	return []section{
		{"kind", true, func() obj { return constant("airfield", "This file is an airfield's runway data.") }},
		{"name", true, func() obj { return text("The airfield's name, printed on the cards", true) }},
		{"ident", true, func() obj {
			o := text("Your own short name: 2 to 10 letters, digits or '-', starting with a letter or digit (not an official location indicator)", true)
			o["pattern"] = `^[A-Za-z0-9][A-Za-z0-9-]{1,9}$`
			return o
		}},
		{"elevation", true, func() obj {
			return quantity(units.Length, "Aerodrome elevation: the highest point of the landing area (-500 to 5000 m)")
		}},
		{"variation", false, func() obj {
			return obj{"type": "string",
				"pattern":     `^\s*(([0-9]+(\.[0-9]*)?|\.[0-9]+)\s*(deg|°)\s*[EW]|` + number + `\s*(deg|°))\s*$`,
				"description": "Magnetic variation, for winds given as true: \"3 deg E\" or \"2 deg W\" (or signed, east positive: \"-2 deg\"), not both a sign and E or W; at most 60 deg. Default 0."}
		}},
		{"runways", true, func() obj { return list(runwaySchema(), "The runways (at most 12).", 1, 12) }},
	}
}

func runwaySchema() obj {
	return object("One runway with its one or two ends.", obj{
		"surface":   oneOf("Surface.", "paved", "grass", "gravel"),
		"condition": oneOf("The condition the cards are printed for (default dry; grass and gravel get dry and wet cards).", "dry", "wet"),
		"length":    quantity(units.Length, "Distance between the thresholds, used with threshold elevations for the slope (default the longer TORA)"),
		"slope":     quantity(units.Slope, "Mean slope, uphill in the direction of the first end (-10 to 10 %); or give threshold elevations, not both"),
		"ends":      list(endSchema(), "The runway's ends (one or two).", 1, 2),
	}, "surface", "ends")
}

func endSchema() obj {
	des := text("Runway designator: 01 to 36, optionally L, C or R", true)
	des["pattern"] = `^(0?[1-9]|[12][0-9]|3[0-6])[LCR]?$`
	des["type"] = []string{"string", "integer"}
	des["minimum"], des["maximum"] = 1, 36
	return object("One direction of use of the runway, with its declared distances.", obj{
		"designator":          des,
		"heading":             quantity(units.Angle, "Magnetic heading in this direction (1 to 360 deg; default the designator x 10)"),
		"tora":                quantity(units.Length, "Takeoff run available"),
		"toda":                quantity(units.Length, "Takeoff distance available, including clearway; not below TORA (default TORA)"),
		"asda":                quantity(units.Length, "Accelerate-stop distance available, including stopway (default TORA; a shorter ASDA limits the run)"),
		"lda":                 quantity(units.Length, "Landing distance available (printed only)"),
		"threshold_elevation": quantity(units.Length, "Elevation of this threshold; give both ends' (or a slope), not one"),
		"notes":               text("Obstacles, displaced thresholds, local procedures: printed on the card", false),
		"obstacles":           list(obstacleSchema(), "Obstacles along the departure path that the climb must clear (at most 6).", 0, 6),
	}, "designator", "tora")
}

// obstacleSchema is one obstacle past a runway end: its height (above the end of the
// TORA) or elevation, and its distance from the end of the TORA or from the start of
// the takeoff run, with an optional lateral offset.
func obstacleSchema() obj {
	lateral := obj{
		"type":        "string",
		"pattern":     `^\s*` + number + `\s*(` + alternatives(units.Spellings(units.Length)) + `)\s*([Ll][Ee][Ff][Tt]|[Rr][Ii][Gg][Hh][Tt])?\s*$`,
		"description": "Optional offset from the extended centre line, printed only: a length and a side, e.g. \"30 m left\".",
	}
	o := object("An obstacle the climb after takeoff must clear.", obj{
		"note":       text("A short name the card prints, e.g. powerline (at most 40 characters)", true),
		"height":     quantity(units.Length, "Top of the obstacle above the ground at the end of the TORA (up to 1500 ft)"),
		"elevation":  quantity(units.Length, "Or: top of the obstacle above mean sea level (needs both threshold elevations)"),
		"past_end":   quantity(units.Length, "Distance along the departure path from the end of the TORA (0 to 10 km)"),
		"from_start": quantity(units.Length, "Or: distance from the start of the takeoff run (beyond the TORA)"),
		"lateral":    lateral,
	}, "note")
	o["not"] = obj{"anyOf": []any{obj{"required": []string{"height", "elevation"}}, obj{"required": []string{"past_end", "from_start"}}}}
	o["allOf"] = []any{
		obj{"anyOf": []any{obj{"required": []string{"height"}}, obj{"required": []string{"elevation"}}}},
		obj{"anyOf": []any{obj{"required": []string{"past_end"}}, obj{"required": []string{"from_start"}}}},
	}
	return o
}

func templateSections() []section {
	return []section{
		{"kind", true, func() obj { return constant("card-template", "This file is a card template (preset).") }},
		{"name", true, func() obj { return text("The template's name", true) }},
		{"page", true, func() obj { return oneOf("Card size.", "a5", "half-letter", "5x8") }},
		{"unit", true, func() obj { return oneOf("Every length on the card.", "m", "ft") }},
		{"mass_unit", false, func() obj { return oneOf("Weights on the card (default kg).", "kg", "lb") }},
		{"temperature_unit", false, func() obj { return oneOf("Temperatures on the card (default C).", "C", "F") }},
		{"policy", true, func() obj { return oneOf("The safety factors applied.", "uk-advisory", "eu-class-b") }},
		{"qnh", true, func() obj { return quantity(units.Pressure, "The (low) QNH the card assumes (900 to 1050 hPa)") }},
		{"tight_margin", true, func() obj {
			return quantity(units.Percent, "A fitting cell with less spare than this is tight (0 to 50 %)")
		}},
		{"temperatures", true, func() obj {
			return quantities(units.Temperature, "The card's columns, strictly increasing (at most 12)", 1, 12)
		}},
		{"winds", true, func() obj {
			return quantities(units.Speed, "The card's rows, strictly increasing; negative is a tailwind (at most 11)", 1, 11)
		}},
		{"max_blocks", true, func() obj { return wholeNumber("Weight blocks per card, heaviest first", 1, 6) }},
		{"accelerate_check_temperature", false, func() obj {
			return obj{"description": "No longer used (the accelerate check follows the grid): delete this line."}
		}},
		{"crosswind_speeds", true, func() obj {
			return quantities(units.Speed, "Wind speeds of the crosswind helper (at most 6)", 1, 6)
		}},
		{"crosswind_angles", true, func() obj {
			return quantities(units.Angle, "Wind angles off the runway of the crosswind helper (0 to 90 deg, at most 7)", 1, 7)
		}},
		{"valid_days", true, func() obj { return wholeNumber("Default validity: the card date plus this many days", 1, 400) }},
		{"landing", false, func() obj {
			return oneOf("Where a profile's landing figures go (default back).", "back", "same-page", "none")
		}},
		{"obstacle_margin", false, func() obj {
			return quantity(units.Length, "The height by which the climb must clear an obstacle past the runway end (default 50 ft; 10 to 500 ft)")
		}},
	}
}

func planSections() []section {
	files := func(desc string, max int) obj {
		item := obj{"type": []string{"string", "number"}, "minLength": 1, "description": "A file, relative to the plan (or demo:NAME)."}
		return list(item, desc, 1, max)
	}
	date := func(desc string) obj {
		return obj{"type": "string", "pattern": `^[0-9]{4}-(0[1-9]|1[0-2])-(0[1-9]|[12][0-9]|3[01])$`, "description": desc + " YYYY-MM-DD."}
	}
	return []section{
		{"kind", true, func() obj { return constant("plan", "This file is a season plan.") }},
		{"name", true, func() obj { return text("The plan's name", true) }},
		{"aircraft", true, func() obj { return files("Aircraft profiles (at most 200).", 200) }},
		{"airfields", true, func() obj { return files("Airfield files (at most 500).", 500) }},
		{"templates", false, func() obj {
			return files("Card presets (a5, half-letter, 5x8) or card-template files (at most 6; default a5).", 6)
		}},
		{"unit", false, func() obj { return oneOf("Overrides every template's unit.", "m", "ft") }},
		{"policy", false, func() obj { return oneOf("Overrides every template's policy.", "uk-advisory", "eu-class-b") }},
		{"date", true, func() obj { return date("Printed on every card.") }},
		{"valid_until", false, func() obj { return date("After the date; default the date plus the template's valid_days.") }},
		{"output", true, func() obj { return text("Folder for the cards and the index, relative to the plan", true) }},
		{"sheet", false, func() obj { return oneOf("Two cards per sheet, with cut marks.", "a4", "letter") }},
	}
}
