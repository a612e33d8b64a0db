package atoms

import (
	"fmt"
	"math"
	"math/cmplx"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// meanField integrates the mean-field equations of the driven Dicke model
// from the all-ground state with a classical fourth-order Runge-Kutta scheme,
// returning the final spin and the swing of Jz over the last tenth of the run:
//
//	dJx/dt = Γc Jz Jx,  dJy/dt = −Ω Jz + Γc Jz Jy,  dJz/dt = Ω Jy − Γc (Jx² + Jy²)
//
// (the semiclassical equations of Drummond and Carmichael, Opt. Commun. 27,
// 160 (1978), for H = (ħΩ/2)(J⁺ + J⁻) = ħΩ Jx and collective decay Γc).
func meanField(n, Ω, Γc, t, dt float64) (v [3]float64, jzSwing float64) {
	f := func(v [3]float64) [3]float64 {
		return [3]float64{Γc * v[2] * v[0], -Ω*v[2] + Γc*v[2]*v[1], Ω*v[1] - Γc*(v[0]*v[0]+v[1]*v[1])}
	}
	step := func(v, k [3]float64, h float64) [3]float64 {
		return [3]float64{v[0] + h*k[0], v[1] + h*k[1], v[2] + h*k[2]}
	}
	v = [3]float64{0, 0, -n / 2}
	steps := int(t / dt)
	lo, hi := math.Inf(1), math.Inf(-1)
	for i := 0; i < steps; i++ {
		k1 := f(v)
		k2 := f(step(v, k1, dt/2))
		k3 := f(step(v, k2, dt/2))
		k4 := f(step(v, k3, dt))
		for c := range v {
			v[c] += dt / 6 * (k1[c] + 2*k2[c] + 2*k3[c] + k4[c])
		}
		if i >= steps-steps/10 {
			lo, hi = math.Min(lo, v[2]), math.Max(hi, v[2])
		}
	}
	return v, hi - lo
}

// Below Ω_c = NΓc/2 the mean-field spin settles at Jx = 0, Jy = Ω/Γc,
// Jz = −√(N²/4 − (Ω/Γc)²); just above it there is no steady state and Jz keeps
// oscillating (Carmichael, J. Phys. B 13, 3551 (1980), §2).
func TestMeanFieldThreshold(t *testing.T) {
	const n, Γc = 100.0, 1.0
	ωc := n * Γc / 2
	for _, frac := range []float64{0.5, 0.9, 0.97} {
		Ω := frac * ωc
		v, swing := meanField(n, Ω, Γc, 40, 1e-4)
		wantJz := -math.Sqrt(n*n/4 - (Ω/Γc)*(Ω/Γc))
		if swing > 1e-6*n || math.Abs(v[2]-wantJz) > 1e-6*n || math.Abs(v[1]-Ω/Γc) > 1e-6*n {
			t.Errorf("Ω = %.2f Ω_c: J = %v, Jz swing %g; want a steady state at Jz = %g", frac, v, swing, wantJz)
		}
	}
	for _, frac := range []float64{1.03, 1.5} {
		_, swing := meanField(n, frac*ωc, Γc, 40, 1e-4)
		if swing < 0.1*n {
			t.Errorf("Ω = %.2f Ω_c: Jz swing %g over the last stretch; want no steady state (an oscillation)", frac, swing)
		}
	}
}

// dicke returns J+ in the symmetric subspace |S, m⟩, m = −S…S, S = N/2.
func dicke(n int) [][]complex128 {
	d := n + 1
	s := float64(n) / 2
	jp := make([][]complex128, d)
	for i := range jp {
		jp[i] = make([]complex128, d)
	}
	for i := 0; i < d-1; i++ {
		m := -s + float64(i)
		jp[i+1][i] = complex(math.Sqrt(s*(s+1)-m*(m+1)), 0)
	}
	return jp
}

func mul(a, b [][]complex128) [][]complex128 {
	d := len(a)
	out := make([][]complex128, d)
	for i := range out {
		out[i] = make([]complex128, d)
		for k := 0; k < d; k++ {
			if a[i][k] == 0 {
				continue
			}
			for j := 0; j < d; j++ {
				out[i][j] += a[i][k] * b[k][j]
			}
		}
	}
	return out
}

func dagger(a [][]complex128) [][]complex128 {
	d := len(a)
	out := make([][]complex128, d)
	for i := range out {
		out[i] = make([]complex128, d)
		for j := range out[i] {
			out[i][j] = cmplx.Conj(a[j][i])
		}
	}
	return out
}

// liouvillian applies L[ρ] = −i[H, ρ] + Γc (J− ρ J+ − ½{J+J−, ρ}) with
// H = (Ω/2)(J+ + J−) (ħ = 1).
func liouvillian(rho, jp, jm, h, jpjm [][]complex128, Γc float64) [][]complex128 {
	d := len(rho)
	a, b := mul(h, rho), mul(rho, h)
	c := mul(mul(jm, rho), jp)
	e, f := mul(jpjm, rho), mul(rho, jpjm)
	out := make([][]complex128, d)
	for i := range out {
		out[i] = make([]complex128, d)
		for j := range out[i] {
			out[i][j] = -1i*(a[i][j]-b[i][j]) + complex(Γc, 0)*(c[i][j]-0.5*(e[i][j]+f[i][j]))
		}
	}
	return out
}

// steadyStateNumeric solves L[ρ] = 0 with Tr ρ = 1 by dense linear algebra
// (gonum LU) over the real and imaginary parts of ρ.
func steadyStateNumeric(n int, Ω, Γc float64) [][]complex128 {
	d := n + 1
	jp := dicke(n)
	jm := dagger(jp)
	h := make([][]complex128, d)
	for i := range h {
		h[i] = make([]complex128, d)
		for j := range h[i] {
			h[i][j] = complex(Ω/2, 0) * (jp[i][j] + jm[i][j])
		}
	}
	jpjm := mul(jp, jm)
	dim := 2 * d * d
	A := mat.NewDense(dim, dim, nil)
	for col := 0; col < dim; col++ {
		basis := make([][]complex128, d)
		for i := range basis {
			basis[i] = make([]complex128, d)
		}
		k := col / 2
		if col%2 == 0 {
			basis[k/d][k%d] = 1
		} else {
			basis[k/d][k%d] = 1i
		}
		l := liouvillian(basis, jp, jm, h, jpjm, Γc)
		for r := 0; r < d*d; r++ {
			A.Set(2*r, col, real(l[r/d][r%d]))
			A.Set(2*r+1, col, imag(l[r/d][r%d]))
		}
	}
	b := mat.NewVecDense(dim, nil)
	// Tr L[ρ] = 0 for every ρ, so the equations for ρ_00 follow from the
	// other diagonal ones; they give way to Re Tr ρ = 1 and Im Tr ρ = 0 (the
	// real form of a complex-linear map has a two-dimensional null space).
	for col := 0; col < dim; col++ {
		A.Set(0, col, 0)
		A.Set(1, col, 0)
	}
	for i := 0; i < d; i++ {
		A.Set(0, 2*(i*d+i), 1)
		A.Set(1, 2*(i*d+i)+1, 1)
	}
	b.SetVec(0, 1)
	var x mat.VecDense
	if err := x.SolveVec(A, b); err != nil {
		panic(err)
	}
	rho := make([][]complex128, d)
	for i := range rho {
		rho[i] = make([]complex128, d)
		for j := range rho[i] {
			k := i*d + j
			rho[i][j] = complex(x.AtVec(2*k), x.AtVec(2*k+1))
		}
	}
	return rho
}

// steadyStateClosedForm is the exact steady state of cooperative resonance
// fluorescence, ρ = D⁻¹ Σ_{m,n=0}^{N} (g*)^{−m} g^{−n} (J−)^m (J+)^n with
// g = iΩ/Γc (Puri and Lawande, Phys. Lett. A 72, 200 (1979); Carmichael,
// J. Phys. B 13, 3551 (1980)).
func steadyStateClosedForm(n int, Ω, Γc float64) [][]complex128 {
	d := n + 1
	jp := dicke(n)
	jm := dagger(jp)
	g := complex(0, Ω/Γc)
	ident := func() [][]complex128 {
		m := make([][]complex128, d)
		for i := range m {
			m[i] = make([]complex128, d)
			m[i][i] = 1
		}
		return m
	}
	powers := func(op [][]complex128, scale complex128) [][][]complex128 {
		out := [][][]complex128{ident()}
		for k := 1; k <= n; k++ {
			next := mul(out[k-1], op)
			for i := range next {
				for j := range next[i] {
					next[i][j] *= scale
				}
			}
			out = append(out, next)
		}
		return out
	}
	left := powers(jm, 1/cmplx.Conj(g))
	right := powers(jp, 1/g)
	rho := make([][]complex128, d)
	for i := range rho {
		rho[i] = make([]complex128, d)
	}
	for m := 0; m <= n; m++ {
		for k := 0; k <= n; k++ {
			p := mul(left[m], right[k])
			for i := range p {
				for j := range p[i] {
					rho[i][j] += p[i][j]
				}
			}
		}
	}
	var tr complex128
	for i := 0; i < d; i++ {
		tr += rho[i][i]
	}
	for i := range rho {
		for j := range rho[i] {
			rho[i][j] /= tr
		}
	}
	return rho
}

func TestDickeSteadyStateClosedForm(t *testing.T) {
	for _, n := range []int{1, 2, 3, 5, 8} {
		for _, frac := range []float64{0.3, 1, 2.5} {
			Γc := 1.0
			Ω := frac * float64(n) * Γc / 2
			t.Run(fmt.Sprintf("N=%d,Ω=%.1fΩc", n, frac), func(t *testing.T) {
				num := steadyStateNumeric(n, Ω, Γc)
				exact := steadyStateClosedForm(n, Ω, Γc)
				for i := range num {
					for j := range num[i] {
						if cmplx.Abs(num[i][j]-exact[i][j]) > 1e-9 {
							t.Fatalf("ρ[%d][%d]: master equation %v, closed form %v", i, j, num[i][j], exact[i][j])
						}
					}
				}
			})
		}
	}
}

// For one atom the model is resonance fluorescence of a two-level atom:
// ρ_ee = Ω² / (Γ² + 2Ω²) on resonance (optical Bloch equations; Loudon,
// The Quantum Theory of Light, 3rd ed. (2000), §2.8).
func TestDickeOneAtomIsBloch(t *testing.T) {
	for _, Ω := range []float64{0.1, 1, 3} {
		rho := steadyStateClosedForm(1, Ω, 1)
		if got, want := real(rho[1][1]), Ω*Ω/(1+2*Ω*Ω); math.Abs(got-want) > 1e-12 {
			t.Errorf("Ω = %g Γ: ρ_ee = %.12f, Bloch %.12f", Ω, got, want)
		}
	}
}

// The planning figures follow from N Γc = D Γ / 4: Ω_c = DΓ/8, s_c = D²/32.
func TestCollectiveThresholdBand(t *testing.T) {
	const Γ = 2 * math.Pi * 6.0666e6
	c := CollectiveThreshold(25.7, Γ)
	if !close(c.OmegaC, 25.7*Γ/8, 1e-12) || !close(c.OmegaCLow, c.OmegaC/2, 1e-12) {
		t.Errorf("Ω_c band %g, %g", c.OmegaC, c.OmegaCLow)
	}
	if !close(c.SatC, SaturationForRabi(Γ, c.OmegaC), 1e-12) || !close(c.SatC, 25.7*25.7/32, 1e-12) {
		t.Errorf("s_c = %g, want D²/32 = %g", c.SatC, 25.7*25.7/32)
	}
	if c.Bistable || !CollectiveThreshold(40, Γ).Bistable {
		t.Errorf("bistable flag wrong")
	}
	// The mean-field threshold Ω_c = NΓc/2 with NΓc = DΓ/4.
	r := CollectiveFromRate(25.7*Γ/4, Γ, 25.7)
	if !close(r.OmegaC, c.OmegaC, 1e-12) {
		t.Errorf("from rate: Ω_c = %g, want %g", r.OmegaC, c.OmegaC)
	}
}

func close(a, b, rel float64) bool { return math.Abs(a-b) <= rel*math.Abs(b) }

func BenchmarkCollectiveThreshold(b *testing.B) {
	for i := 0; i < b.N; i++ {
		CollectiveThreshold(float64(i%50), 3.8e7)
	}
}
