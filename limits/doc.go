// Package limits holds the exposure limits of IEC 60825-1:2014 (Edition 3,
// Annex A) as pure functions of wavelength, exposure duration and angular
// subtense: the maximum permissible exposure (MPE) at the cornea and for the
// skin, the correction factors C1…C7, T1 and T2, the limiting apertures, and
// the accessible emission limits (AEL) of the classes for continuous
// emission.
//
// Conventions: wavelengths in m, durations in s, angles in rad, radiant
// exposure in J/m², irradiance in W/m², powers in W. A wavelength or duration
// outside a table is an error naming the quantity, its value and the valid
// range; nothing is extrapolated.
//
// Provenance. The standard's text is not reproduced or available to this
// project: every number below was transcribed from memory of IEC
// 60825-1:2014 (and, where noted, of Edition 2, 2007) and is marked so in the
// tests. Where the recollection was uncertain the lower (more restrictive)
// value was taken, and the comment says so. Every value must be checked
// against the standard's own tables before the output is relied on; SAFETY.md
// says the same to users.
//
// Continuous AELs are derived as the MPE at the classification time base
// times the area of the limiting aperture, the relation the tables are built
// on; the tables round to two figures, this package does not round.
package limits
