package api

import "stagewright/api/units"

// Quantity is a physical input: a JSON number in the field's SI unit, or a
// string with a unit ("35 degC", "14.7 psia", "12 barg"). It is
// units.Quantity, the one parser of units; strings are kept as text when
// decoding and read with the field's dimension when the request is
// converted, so that a bad unit is reported with its field's pointer.
type Quantity = units.Quantity
