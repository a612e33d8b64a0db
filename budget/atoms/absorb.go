package atoms

import "math"

// DetuningFactor is a = 1 + 4Δ²/Γ² for detuning Δ and linewidth Γ (rad/s).
func DetuningFactor(Δ, Γ float64) float64 { return 1 + 4*Δ*Δ/(Γ*Γ) }

// OutgoingIntensity solves the saturable-absorber relation for i_out given
// i_in ≥ 0, the optical depth b ≥ 0 and a ≥ 1 (intensities in units of
// I_sat): Newton's method on x = ln i_out, safeguarded by bisection on the
// bracket [ln i_in − (b + i_in)/a, ln i_in], where the function is monotone
// and concave; it cannot fail for any finite input.
//
// Saturable absorption along one ray through a cloud of independent
// two-level atoms in steady state. With intensities in units of the
// saturation intensity (i = I/I_sat), a = 1 + 4Δ²/Γ² and b the resonant
// optical depth of the ray, dI/dz = −n σ0 I/(a + I/I_sat) integrates to
//
//	a ln(i_in/i_out) + (i_in − i_out) = b
//
// (the relation used for high-intensity absorption imaging: Reinaudi et
// al., Opt. Lett. 32, 3143 (2007), eq. (1) with α* = a). Nothing here
// models diffraction or lensing by the cloud, Doppler broadening or
// optical pumping.
func OutgoingIntensity(iIn, b, a float64) float64 {
	if !(iIn > 0) || !(b > 0) {
		return iIn
	}
	lnIn := math.Log(iIn)
	lo := lnIn - (b+iIn)/a
	// Start from the weak-drive (Beer–Lambert) answer, clamped to the bracket.
	x0 := math.Max(lo, math.Min(lnIn, lnIn-b/a))
	return math.Exp(solveLinExp(a, a*lnIn+(iIn-b), lo, lnIn, x0))
}

// IncomingIntensity solves the relation for i_in given the intensity i_out
// > 0 that must remain after an optical depth b ≥ 0 (units of I_sat):
// A ln i_in + i_in = b + a ln i_out + i_out, increasing in ln i_in.
func IncomingIntensity(iOut, b, a float64) float64 {
	if !(iOut > 0) || !(b > 0) {
		return iOut
	}
	rhs := b + a*math.Log(iOut) + iOut
	lo := math.Log(iOut)
	hi := lo + b/a // at least this much is needed even unsaturated; grow below
	for a*hi+math.Exp(hi) < rhs {
		hi += 1 + b/a
	}
	// Start where eˣ alone would meet the right side: Newton then
	// converges in a few steps at any column (from the bracket's top it
	// crept down by about one per step: a column of 231 needed 230).
	x0 := hi
	if rhs > 0 {
		x0 = math.Max(lo, math.Min(hi, math.Log(rhs)))
	}
	return math.Exp(solveLinExp(a, rhs, lo, hi, x0))
}

// solveLinExp solves a·x + eˣ = c for x in the bracket [lo, hi] that holds
// the root (the left side increases with x): Newton's method from x0,
// safeguarded by bisection, so that it cannot fail for finite input. Both
// directions of the saturable-absorber relation reduce to it with x the
// logarithm of the unknown intensity.
func solveLinExp(a, c, lo, hi, x0 float64) float64 {
	x := x0
	for range 100 {
		ex := math.Exp(x)
		v := a*x + ex - c
		if v > 0 {
			hi = x
		} else {
			lo = x
		}
		nx := x - v/(a+ex)
		if !(nx > lo && nx < hi) {
			nx = (lo + hi) / 2
		}
		if math.Abs(nx-x) < 1e-14*math.Max(1, math.Abs(x)) {
			return nx
		}
		x = nx
	}
	return x
}

// ColumnFraction is the share of a Gaussian cloud's column in front of the
// position z along the ray (z in units of the rms size along it): the
// normal cumulative distribution Φ(z) = erfc(−z/√2)/2.
func ColumnFraction(z float64) float64 { return math.Erfc(-z/math.Sqrt2) / 2 }
