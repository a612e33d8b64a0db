// Package units reads and writes quantities: a number and a unit in one
// string ("780.24 nm", "1.67 mW/cm2", "82 %") parsed into SI base units with
// its dimension checked, and SI values written back with a unit and an SI
// prefix for people.
//
// Conventions: every value inside the program is a float64 in SI base units
// (m, kg, s, K, rad and their products); units appear only here, where text
// is read or written. SI prefixes f to G; "u", "µ" and "μ" all mean micro.
//
// # Formulas
//
//	| quantity | expression | source | function | test |
//	| --- | --- | --- | --- | --- |
//	| loss in dB | 10 log10(ratio) | common practice | Decibels | TestDecibels |
package units
