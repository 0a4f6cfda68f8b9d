// Package gas gives the thermodynamic properties of compressor gases: a
// component catalogue, mixtures, and the models selected by name
// ("ideal-constant", "ideal", "peng-robinson", "srk"), all behind the Model
// interface, with (P,h) and (P,s) flashes.
//
// Units are SI and specific quantities are per kg: enthalpy J/kg, entropy
// J/(kg K). Each model states its reference state; only differences of h
// and s within one model are meaningful.
package gas
