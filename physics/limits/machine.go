package limits

// Rules of an installed machine at an operating point (rating). Surge and
// choke flows are themselves estimates; these rules grade the distance to
// the estimates.

// surgeSource names the basis of the surge-margin levels.
const surgeSource = commonPractice + " (anti-surge control lines sit some 8-10 % in flow from the surge line; the surge estimate itself is uncertain by some ±10-15 % in flow)"

// SurgeMargin is the rule on the surge margin Q/Q_surge − 1 at the
// operating speed: a warning below 0.10, the limit at 0 (at or past the
// estimated surge line).
func SurgeMargin() Rule {
	return Rule{ID: "surge-margin", Code: "surge-margin", Quantity: "surge margin Q/Q_surge - 1 at this speed (estimated surge line)", Unit: "-", Sense: Below,
		Warning: 0.10, Limit: 0, Basis: surgeSource}
}

// ChokeMargin is the rule on the choke margin 1 − Q/Q_choke at the
// operating speed: a warning below 0.05 (efficiency and head fall steeply
// there), the limit at 0 (common practice, no source).
func ChokeMargin() Rule {
	return Rule{ID: "choke-margin", Code: "choke-margin", Quantity: "choke margin 1 - Q/Q_choke at this speed (estimated choke flow)", Unit: "-", Sense: Below,
		Warning: 0.05, Limit: 0, Basis: commonPractice + " (head and efficiency collapse near choke; the choke estimate is uncertain by some ±5 % in flow)"}
}

// SpeedAboveRange is the rule on the speed over the maximum continuous
// speed: the maximum continuous speed is a limit by definition (API 617
// defines it; the trip speed lies above it, from memory).
func SpeedAboveRange() Rule {
	return Rule{ID: "speed-above-range", Code: "speed-range", Quantity: "speed over the maximum continuous speed", Unit: "-", Sense: Above,
		Warning: 1.0, Limit: 1.0, Basis: "definition of the maximum continuous speed (API 617, from memory)"}
}

// SpeedBelowRange is the rule on the speed over the minimum operating
// speed (the machine's speed range, by definition).
func SpeedBelowRange() Rule {
	return Rule{ID: "speed-below-range", Code: "speed-range", Quantity: "speed over the minimum operating speed", Unit: "-", Sense: Below,
		Warning: 1.0, Limit: 1.0, Basis: "definition of the minimum operating speed of the machine's speed range"}
}
