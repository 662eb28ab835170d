package cards

import (
	"bytes"
	"encoding/json"
	"errors"

	"kneeprint/layout"
)

// DataFormat is the version of the card data layout (cards --data).
const DataFormat = 1

// CardFile is the content of one card file as printed, for the user's own tools
// (cards --data writes it beside the PDF). Every figure is the one on the card: in
// the card's units, required distances rounded up, declared distances rounded down.
// The fields are documented in the README.
type CardFile struct {
	Format      int        `json:"format"`
	Version     string     `json:"kneeprint_version"`
	Aircraft    string     `json:"aircraft"`
	Airfield    string     `json:"airfield"`
	Ident       string     `json:"ident"`
	Template    string     `json:"template"`
	Policy      string     `json:"policy"`
	Generated   string     `json:"generated"`
	ValidUntil  string     `json:"valid_until"`
	Caution     string     `json:"caution"`
	Pages       []DataPage `json:"pages"`
	OmittedMass []float64  `json:"weights_not_on_card"`
	// Part is, in a bundle's card data (CardBundle), the name this card file has on
	// its own; absent otherwise.
	Part string `json:"part,omitempty"`
}

// DataPage is one card page: one runway end in one condition.
type DataPage struct {
	Page            string      `json:"page"` // designator, with the condition when the end has a page per condition
	Designator      string      `json:"designator"`
	HeadingDeg      float64     `json:"heading_deg"`
	Surface         string      `json:"surface"`
	Condition       string      `json:"condition"`
	SlopePct        float64     `json:"slope_pct"`
	Fingerprint     string      `json:"fingerprint"`
	Unit            string      `json:"unit"`
	MassUnit        string      `json:"mass_unit"`
	TempUnit        string      `json:"temperature_unit"`
	Declared        Declared    `json:"declared"`
	Limiting        string      `json:"limiting"`
	Factors         []string    `json:"factors"`
	QNHhPa          float64     `json:"qnh_hpa"`
	QNHinHg         float64     `json:"qnh_inhg"`
	PressureAltFt   float64     `json:"pressure_altitude_ft"`
	HotterPer10hPa  float64     `json:"hotter_per_10hpa"`
	Temperatures    []float64   `json:"temperatures"`
	DensityAltFt    []float64   `json:"density_altitudes_ft"`
	WindsKt         []float64   `json:"winds_kt"`
	TightMarginPct  float64     `json:"tight_margin_pct"`
	Empty           *string     `json:"empty"`
	AccelerateCheck DataAccel   `json:"accelerate_check"`
	Crosswind       DataXwind   `json:"crosswind"`
	Blocks          []DataBlock `json:"blocks"`
	// Obstacles past the end of the TORA as printed (empty when none), the margin
	// they must be cleared by (null without obstacles) and the climb row (null
	// without obstacles).
	Obstacles        []DataObstacle `json:"obstacles"`
	ObstacleMarginFt *float64       `json:"obstacle_margin_ft"`
	Climb            *DataClimb     `json:"climb"`
	// Landing is the card's landing side (the back), null when it has none.
	Landing *DataLanding `json:"landing"`
	// PDFPages are, in a bundle's card data, the pages of the bundle this card is
	// printed on (takeoff side, then landing side); absent otherwise.
	PDFPages []int `json:"pdf_pages,omitempty"`
}

// DataObstacle is one obstacle as printed: height in feet, distances in the card's unit.
type DataObstacle struct {
	Note     string  `json:"note"`
	HeightFt float64 `json:"height_ft"`
	PastEnd  float64 `json:"past_end"`
	Lateral  float64 `json:"lateral"` // right positive, 0 on the extended centre line
}

// DataClimb is the climb row: the climb speed, the weight (the heaviest block) and
// per temperature column the still-air gradient in percent (null: no figure).
type DataClimb struct {
	SpeedKIAS    float64    `json:"speed_kias"`
	Weight       float64    `json:"weight"`
	GradientsPct []*float64 `json:"gradients_pct"`
}

// DataLanding is the landing side of a card as printed.
type DataLanding struct {
	LDA           *float64       `json:"lda"` // as printed, rounded down; null when not declared
	NoLDA         bool           `json:"no_lda"`
	Flap          string         `json:"flap"`
	Model         string         `json:"model"`
	Factors       []string       `json:"factors"`
	Approach      []DataApproach `json:"approach"`
	PressureAltFt float64        `json:"pressure_altitude_ft"`
	Temperatures  []float64      `json:"temperatures"`
	DensityAltFt  []float64      `json:"density_altitudes_ft"`
	WindsKt       []float64      `json:"winds_kt"`
	Empty         *string        `json:"empty"`
	OmittedMass   []float64      `json:"weights_not_on_side"`
	Blocks        []DataBlock    `json:"blocks"`
}

// DataApproach is the speed over the threshold a landing block assumes.
type DataApproach struct {
	Weight float64 `json:"weight"`
	KIAS   float64 `json:"kias"`
}

// Declared are the declared distances as printed (null when not declared).
type Declared struct {
	TORA *float64 `json:"tora"`
	TODA *float64 `json:"toda"`
	ASDA *float64 `json:"asda"`
	LDA  *float64 `json:"lda"`
}

// DataAccel is the accelerate check as printed.
type DataAccel struct {
	Midpoint     float64        `json:"midpoint"`
	RotationKIAS *float64       `json:"rotation_kias"`
	SpeedKIAS    *float64       `json:"speed_kias"`
	Expected     []DataExpected `json:"expected"`
}

// DataExpected is one block's expected 70 % point (null when none is printed).
type DataExpected struct {
	Weight      float64  `json:"weight"`
	Temperature *float64 `json:"temperature"`
	Distance    *float64 `json:"distance"`
}

// DataXwind is the crosswind helper's reference values.
type DataXwind struct {
	DemonstratedKt float64  `json:"demonstrated_kt"`
	LimitKt        *float64 `json:"limit_kt"`
}

// DataBlock is one weight block.
type DataBlock struct {
	Weight float64    `json:"weight"`
	MTOW   bool       `json:"mtow"`
	MLM    bool       `json:"mlm,omitempty"` // a landing block at the maximum landing mass
	Cells  []DataCell `json:"cells"`
}

// DataCell is one cell: row (wind), column (temperature), the printed figure or null,
// and the state.
type DataCell struct {
	WindKt        float64  `json:"wind_kt"`
	Temperature   float64  `json:"temperature"`
	Figure        *float64 `json:"figure"`
	State         string   `json:"state"`
	CannotTakeOff bool     `json:"cannot_take_off"`
	Obstacle      bool     `json:"obstacle"`              // a no-go that fits the declared distance but does not clear an obstacle
	CannotStop    bool     `json:"cannot_stop,omitempty"` // landing: a no-go without a figure
}

func num(x float64) *float64 { return &x }

// CardFileJSON is job j's card data, pages as computed, in JSON.
func CardFileJSON(j *Job, pages []layout.CardData) ([]byte, error) {
	return encodeData(cardFile(j, pages, nil))
}

// cardFile is the card data of a laid-out job.
func (l *Laid) cardFile() (CardFile, error) {
	if l.data == nil && len(l.Ends) > 0 {
		return CardFile{}, errors.New("card data asked of a job laid out without it (Job.Data)")
	}
	return cardFile(l.Job, l.data, l.landing), nil
}

// encodeData writes card data as indented JSON, characters as they are.
func encodeData(v any) ([]byte, error) {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	if err := enc.Encode(v); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// cardFile is job j's card data with the landing side of page i in landing[i].
func cardFile(j *Job, pages []layout.CardData, landing map[int]layout.CardData) CardFile {
	f := CardFile{Format: DataFormat, Version: j.Version, Aircraft: j.Aircraft.Name, Airfield: j.Airfield.Name,
		Ident: j.Airfield.Ident, Template: j.Template.Name, Policy: j.Template.Policy,
		Generated: j.Date.Format("2006-01-02"), ValidUntil: j.ValidUntil.Format("2006-01-02"), Caution: Caution,
		Pages: []DataPage{}, OmittedMass: []float64{}}
	for i, d := range pages {
		if i == 0 {
			f.OmittedMass = append(f.OmittedMass, d.Omitted...)
		}
		p := DataPage{Page: d.Designator, Designator: d.Designator, HeadingDeg: d.HeadingDeg, Surface: d.Surface,
			Condition: d.Condition, SlopePct: d.SlopePct, Fingerprint: d.Fingerprint, Unit: d.Unit, MassUnit: d.MassUnit,
			TempUnit: d.TempUnit, Limiting: d.Limiting, Factors: append([]string{}, d.PolicyItems...),
			QNHhPa: d.QNHhPa, QNHinHg: d.QNHinHg, PressureAltFt: d.PressureAltFt, HotterPer10hPa: d.HotterPer10hPa,
			Temperatures: d.Temps, DensityAltFt: d.DensityAltFt, WindsKt: d.WindsKt, TightMarginPct: d.TightMarginPct,
			Crosswind: DataXwind{DemonstratedKt: d.Crosswind.DemonstratedKt}}
		if d.ConditionPages > 1 {
			p.Page = d.Designator + " " + d.Condition
		}
		for _, dd := range d.Declared {
			switch dd.Name {
			case "TORA":
				p.Declared.TORA = num(dd.Value)
			case "TODA":
				p.Declared.TODA = num(dd.Value)
			case "ASDA":
				p.Declared.ASDA = num(dd.Value)
			case "LDA":
				p.Declared.LDA = num(dd.Value)
			}
		}
		if d.Empty != "" {
			p.Empty = &d.Empty
		}
		p.Obstacles = []DataObstacle{}
		for _, o := range d.Obstacles {
			p.Obstacles = append(p.Obstacles, DataObstacle{Note: o.Note, HeightFt: o.HeightFt, PastEnd: o.PastEnd, Lateral: o.Lateral})
		}
		if len(d.Obstacles) > 0 {
			p.ObstacleMarginFt = num(d.ObstacleMarginFt)
			p.Climb = &DataClimb{SpeedKIAS: d.ClimbKIAS, Weight: d.ClimbWeight, GradientsPct: []*float64{}}
			for i, g := range d.ClimbPct {
				var v *float64
				if d.HasClimbPct[i] {
					v = num(g)
				}
				p.Climb.GradientsPct = append(p.Climb.GradientsPct, v)
			}
		}
		if d.Crosswind.HasLimit {
			p.Crosswind.LimitKt = num(d.Crosswind.LimitKt)
		}
		a := d.Accel
		p.AccelerateCheck = DataAccel{Midpoint: a.MidpointDist, Expected: []DataExpected{}}
		if a.RotateKIAS > 0 {
			p.AccelerateCheck.RotationKIAS, p.AccelerateCheck.SpeedKIAS = num(a.RotateKIAS), num(a.SpeedKIAS)
		}
		for _, e := range a.Expected {
			de := DataExpected{Weight: e.Weight}
			if e.Has {
				de.Temperature, de.Distance = num(e.Temp), num(e.Dist)
			}
			p.AccelerateCheck.Expected = append(p.AccelerateCheck.Expected, de)
		}
		for _, b := range d.Blocks {
			db := DataBlock{Weight: b.Weight, MTOW: b.MTOW, Cells: []DataCell{}}
			for wi, row := range b.Cells {
				for ti, c := range row {
					dc := DataCell{WindKt: d.WindsKt[wi], Temperature: d.Temps[ti], State: c.State.String(), CannotTakeOff: c.CannotTakeOff, Obstacle: c.Obstacle}
					if c.HasDistance {
						dc.Figure = num(c.Distance)
					}
					db.Cells = append(db.Cells, dc)
				}
			}
			p.Blocks = append(p.Blocks, db)
		}
		if ld, ok := landing[i]; ok {
			p.Landing = dataLanding(ld)
		}
		f.Pages = append(f.Pages, p)
	}
	return f
}

// dataLanding is the JSON form of a landing side.
func dataLanding(d layout.CardData) *DataLanding {
	l := &DataLanding{NoLDA: d.NoGrid != "", Flap: d.Flap, Model: d.ModelName, Factors: append([]string{}, d.PolicyItems...),
		Approach: []DataApproach{}, PressureAltFt: d.PressureAltFt, Temperatures: d.Temps, DensityAltFt: d.DensityAltFt,
		WindsKt: d.WindsKt, OmittedMass: append([]float64{}, d.Omitted...), Blocks: []DataBlock{}}
	for _, dd := range d.Declared {
		if dd.Name == "LDA" {
			l.LDA = num(dd.Value)
		}
	}
	for _, a := range d.Approach {
		l.Approach = append(l.Approach, DataApproach{Weight: a.Weight, KIAS: a.KIAS})
	}
	if d.Empty != "" {
		l.Empty = &d.Empty
	}
	for _, b := range d.Blocks {
		db := DataBlock{Weight: b.Weight, MLM: b.Tag == "MLM", Cells: []DataCell{}}
		for wi, row := range b.Cells {
			for ti, c := range row {
				dc := DataCell{WindKt: d.WindsKt[wi], Temperature: d.Temps[ti], State: c.State.String(), CannotStop: c.CannotTakeOff}
				if c.HasDistance {
					dc.Figure = num(c.Distance)
				}
				db.Cells = append(db.Cells, dc)
			}
		}
		l.Blocks = append(l.Blocks, db)
	}
	return l
}
