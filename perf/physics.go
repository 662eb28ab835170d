package perf

// PropellerType distinguishes fixed-pitch and constant-speed propellers.
type PropellerType string

// Propeller types.
const (
	FixedPitch    PropellerType = "fixed_pitch"
	ConstantSpeed PropellerType = "constant_speed"
)

// Physics is the aerodynamic and engine description the physics model integrates.
type Physics struct {
	WingAreaM2  float64 // reference wing area S
	SpanM       float64 // wing span b
	WingHeightM float64 // height of the wing above the ground h, for ground effect
	CD0         float64 // zero-lift drag coefficient, gear down, takeoff flap
	Oswald      float64 // span efficiency e
	CLGround    float64 // lift coefficient in the ground-run attitude
	CLMax       float64 // maximum lift coefficient in the takeoff flap setting

	PowerW          float64       // rated sea-level power of the engine
	PropDiameterM   float64       // propeller diameter
	Propeller       PropellerType // fixed pitch or constant speed
	PropEfficiency  float64       // eta at lift-off speed
	StaticThrustFac float64       // static thrust as a fraction of the momentum-theory ideal

	LiftoffFactor float64 // lift-off speed as a multiple of stall speed (1.1, Raymer)
	RotationS     float64 // rotation time at lift-off speed
}
