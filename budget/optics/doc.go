// Package optics propagates Gaussian beams and computes what optics do to
// them: the complex beam parameter per plane, thin lenses and plates,
// clipping by a circular aperture and coupling into a single-mode fibre.
//
// Sources and conventions:
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
//
// # Formulas
//
//	| quantity | expression | source | function | test |
//	| --- | --- | --- | --- | --- |
//	| beam radius W(z) | 1/q = 1/R − i M²λ/(πW²) | Saleh & Teich (2007) eqs. (3.1-8)–(3.1-19); Siegman (1986) §17.4 | Plane.Radius | TestPlaneTextbookHeNe |
//	| Rayleigh range | z_R = πW0²/(M²λ) | Saleh & Teich (2007) eq. (3.1-11) | Plane.RayleighRange | ExampleNewPlane |
//	| far-field half-angle | θ = M²λ/(πW0) | Saleh & Teich (2007) eq. (3.1-19) | Plane.Divergence | TestPlaneTextbookHeNe |
//	| thin lens | ABCD (1, 0; −1/f, 1) | Self, Appl. Opt. 22, 658 (1983) | Plane.Lens | TestLensSelf1983 |
//	| plate focus shift | t(1 − 1/n) | Siegman (1986) §15.1 | Beam.Slab | TestSlabFocusShift |
//	| peak irradiance | I₀ = 2P/(π Wx Wy) | Siegman (1986) §17.1 | Beam.PeakIrradiance | ExampleBeam_PeakIrradiance |
//	| power for a peak irradiance | P = I₀ π Wx Wy / 2 | Siegman (1986) §17.1 | Beam.PowerForPeakIrradiance | TestPeakIrradiance |
//	| paraxial bound | θ ≤ 0.5 rad | Siegman (1986) §16.1 (common practice) | Beam.HalfAngle | TestBeamValidity |
//	| clipped fraction | ∬ over a centred circle of an elliptical Gaussian | 1 − exp(−2a²/W²); gonum quadrature | CircleFraction | TestCircleFractionEllipticalQuadrature |
//	| fibre mode overlap | Marcuse overlap per plane, GSM lowest mode 2/(M²+1) | Marcuse (1977); Starikov & Wolf (1982) | ModeOverlap1D | TestModeOverlapGSMLowestMode |
//	| fibre coupling of a beam | product of the x and y overlaps | Marcuse (1977) | FiberOverlap | TestFiberOverlapRoundMarcuse |
//	| ideal coupling lens | f matching the mode to the beam | Marcuse (1977), thin lens | IdealCouplingFocalLength | TestIdealCouplingFocalLength |
//	| fibre output waist | W = λf/(π MFD/2) | Gaussian far field, common practice | FiberOutputWaist | TestFiberOutputWaist |
//	| pulse energy | Q = P/f | definition of the average power, common practice | PulseEnergy | ExamplePulseEnergy |
//	| pulse peak power | P_peak = Q/τ (rectangular pulse) | common practice | PulsePeakPower | ExamplePulseEnergy |
package optics
