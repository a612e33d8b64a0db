// Package budget reads setup files and computes, for every beam path, the
// beam size and power at each element.
//
// Sources and conventions:
//   - Quantities are float64 in SI base units (m, W, s, Hz, K, W/m²); units
//     appear only in ParseQuantity and the Format functions.
//   - Beam size is the 1/e² intensity radius W in x and y (for M² > 1 the
//     second-moment radius of ISO 11146). Peak irradiance I₀ = 2P/(π Wx Wy).
//   - Propagation: complex beam parameter q and ABCD matrices per plane, with
//     the embedded-Gaussian treatment of M² (Siegman, Lasers (1986), ch. 17):
//     a beam of quality M² propagates as a Gaussian of wavelength M²λ.
//   - Clipping at a centred circular clear aperture: the exact fraction of an
//     elliptical Gaussian (CircleFraction), not the round-beam shortcut.
//   - Fibre coupling: the overlap with the fibre's Gaussian mode (Marcuse,
//     Bell Syst. Tech. J. 56, 703 (1977)); beams with M² > 1 as Gaussian
//     Schell-model beams (Gori, Opt. Commun. 34, 301 (1980)).
//   - Positions along a path are free-space distances from its start; a thick
//     window's glass is counted in those distances, and its focus shift
//     t(1 − 1/n) is applied at the window.
//   - Power budget: every element's loss is named; an element whose loss is
//     not stated is lossless, and counted as such. For each laser, dumps +
//     open ends + losses = the source power.
package budget
