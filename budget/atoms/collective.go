package atoms

// Collective is the threshold estimate for one cloud and drive.
//
// The threshold of cooperative resonance fluorescence.
//
// Model: N two-level atoms driven on resonance, H = (ħΩ/2)(S⁺ + S⁻), with one
// collective decay channel of rate Γ_c (the driven Dicke model; Drummond and
// Carmichael, Opt. Commun. 27, 160 (1978); Carmichael, J. Phys. B 13, 3551
// (1980)). Its mean-field steady state exists only for Ω ≤ Ω_c = N Γ_c / 2;
// above it the collective spin keeps oscillating. In free space the decay
// into the forward mode of an elongated cloud driven along its axis is set by
// the resonant optical depth D along the drive: N Γ_c = D Γ / 4, so
// Ω_c = D Γ / 8 and s_c = 2(Ω_c/Γ)² = D²/32. The prefactor is uncertain at the
// factor-2 level, so the estimate is a band: D = b0 (upper, used for margins)
// and D = b0/2 (lower). At large D the photon budget governs instead: the
// drive's photon flux equals N Γ / 2 at s = D. With single-atom decay
// included, the crossover is smooth for D ≤ 32 and bistable above.
type Collective struct {
	// OmegaC and OmegaCLow are the threshold Rabi frequencies Ω_c for
	// D = b0 and D = b0/2, rad/s (equal when the collective rate was given).
	OmegaC, OmegaCLow float64
	// SatC is the threshold saturation s_c = 2(Ω_c/Γ)² (upper band).
	SatC float64
	// PhotonBudgetSat is s = D, where the photon flux equals N Γ / 2.
	PhotonBudgetSat float64
	// D is the optical depth used (b0), 0 when a rate was given.
	D float64
	// Bistable is set when D > 32.
	Bistable bool
	// FromRate is set when the user's collective rate was used.
	FromRate bool
}

// BistableOpticalDepth is the optical depth above which the crossover is
// bistable once single-atom decay is included.
const BistableOpticalDepth = 32

// CollectiveThreshold estimates the threshold from the resonant optical
// depth b0 along the drive and the single-atom linewidth Γ (rad/s).
func CollectiveThreshold(b0, Γ float64) Collective {
	return Collective{
		OmegaC:          b0 * Γ / 8,
		OmegaCLow:       b0 / 2 * Γ / 8,
		SatC:            b0 * b0 / 32,
		PhotonBudgetSat: b0,
		D:               b0,
		Bistable:        b0 > BistableOpticalDepth,
	}
}

// CollectiveFromRate uses a known collective rate N Γ_c (rad/s):
// Ω_c = N Γ_c / 2.
func CollectiveFromRate(nΓc, Γ, b0 float64) Collective {
	ωc := nΓc / 2
	return Collective{
		OmegaC: ωc, OmegaCLow: ωc,
		SatC:            SaturationForRabi(Γ, ωc),
		PhotonBudgetSat: b0,
		D:               b0,
		Bistable:        b0 > BistableOpticalDepth,
		FromRate:        true,
	}
}
