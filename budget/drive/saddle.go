package drive

import (
	"container/heap"
	"math"

	"gonum.org/v1/gonum/mat"

	"beamledger/budget/atoms"
	"beamledger/budget/numeric"
)

// The escape over the lowest saddle. Straight rays from the minimum only
// bound the depth from above: atoms in a single horizontal beam under
// gravity leave along the beam, where the beam is weaker, and then fall,
// over a saddle no straight line from the minimum crosses. The lowest
// saddle on the way out is found in two steps:
//
//  1. flood: the minimax path on a grid in the trap's principal frame (the
//     lowest level at which the water rising from the minimum reaches the
//     box's edge, Dijkstra's order with the path's highest point in place of
//     its length); the node where that level was set is the saddle's
//     neighbourhood;
//  2. refine: the saddle itself, by following the lowest eigenvector of the
//     Hessian uphill and the others downhill (the partitioned rational
//     function step of Baker, J. Comput. Chem. 7, 385 (1986)), accepted only
//     where the gradient vanishes and the Hessian has exactly one negative
//     eigenvalue.
//
// A goal's trial powers track the saddle found at a nearby power by the
// refinement alone.

// frame is the trap's principal frame: unit axes and a length per axis
// (the scaled coordinates ξ give r = origin + Σ ξ_i h_i a_i).
type frame struct {
	origin [3]float64
	axes   [3][3]float64
	h      [3]float64
}

func (fr *frame) at(ξ [3]float64) [3]float64 {
	r := fr.origin
	for i := range 3 {
		for j := range 3 {
			r[j] += ξ[i] * fr.h[i] * fr.axes[i][j]
		}
	}
	return r
}

func (fr *frame) coords(r [3]float64) [3]float64 {
	d := [3]float64{r[0] - fr.origin[0], r[1] - fr.origin[1], r[2] - fr.origin[2]}
	var ξ [3]float64
	for i := range 3 {
		ξ[i] = numeric.Dot(d, fr.axes[i]) / fr.h[i]
	}
	return ξ
}

// floodCells is the grid's half-width in cells along each axis.
const floodCells = 12

// floodGrid finds the lowest level at which the region connected to the
// minimum (the frame's origin, a grid node) reaches the edge of the box of
// floodCells cells of fr.h on either side of it, and the node where the
// way out is highest. edge is the axis whose face the highest node lies on
// (−1 inside: the saddle lies in the box; otherwise the box is too short
// along that axis).
func (f *field) floodGrid(fr *frame) (at [3]float64, level float64, edge int) {
	const m = 2*floodCells + 1
	idx := func(i, j, k int) int { return (i*m+j)*m + k }
	// The nodes are closer together near the minimum: node i of m lies at
	// floodCells · sinh(c u)/sinh(c) cells, u = (i − floodCells)/floodCells,
	// a third of a cell apart at the centre and nearly three at the edge.
	const c = 2.5
	var pos [m]float64
	for i := range pos {
		pos[i] = floodCells * math.Sinh(c*float64(i-floodCells)/floodCells) / math.Sinh(c)
	}
	node := func(n int) [3]float64 { return fr.at([3]float64{pos[n/(m*m)], pos[n/m%m], pos[n%m]}) }
	// The potential at a node, worked out when the water first reaches it.
	v := make([]float64, m*m*m)
	known := make([]bool, len(v))
	V := func(n int) float64 {
		if !known[n] {
			v[n], known[n] = f.V(node(n)), true
		}
		return v[n]
	}
	lvl := make([]float64, len(v))
	top := make([]int32, len(v)) // the node where the way to each node is highest
	for i := range lvl {
		lvl[i] = math.Inf(1)
	}
	start := idx(floodCells, floodCells, floodCells)
	lvl[start], top[start] = V(start), int32(start)
	q := &nodeQueue{}
	heap.Push(q, queued{start, lvl[start]})
	done := make([]bool, len(v))
	for q.Len() > 0 {
		n := heap.Pop(q).(queued).n
		if done[n] {
			continue
		}
		done[n] = true
		i, j, k := n/(m*m), n/m%m, n%m
		if i == 0 || i == m-1 || j == 0 || j == m-1 || k == 0 || k == m-1 {
			t := int(top[n])
			ti, tj, tk := t/(m*m), t/m%m, t%m
			edge = -1
			for a, c := range [3]int{ti, tj, tk} {
				if c == 0 || c == m-1 {
					edge = a
				}
			}
			return node(t), lvl[n], edge
		}
		for _, d := range [6][3]int{{1, 0, 0}, {-1, 0, 0}, {0, 1, 0}, {0, -1, 0}, {0, 0, 1}, {0, 0, -1}} {
			o := idx(i+d[0], j+d[1], k+d[2])
			if done[o] {
				continue
			}
			l, t := lvl[n], top[n]
			if vo := V(o); vo > l {
				l, t = vo, int32(o)
			}
			if l < lvl[o] {
				lvl[o], top[o] = l, t
				heap.Push(q, queued{o, l})
			}
		}
	}
	return fr.origin, math.Inf(1), -1
}

// nodeQueue is a min-heap of grid nodes by their flood level.
type nodeQueue []queued

type queued struct {
	n   int
	lvl float64
}

func (q nodeQueue) Len() int           { return len(q) }
func (q nodeQueue) Less(a, b int) bool { return q[a].lvl < q[b].lvl }
func (q nodeQueue) Swap(a, b int)      { q[a], q[b] = q[b], q[a] }
func (q *nodeQueue) Push(x any)        { *q = append(*q, x.(queued)) }
func (q *nodeQueue) Pop() any {
	x := (*q)[len(*q)-1]
	*q = (*q)[:len(*q)-1]
	return x
}

// refineSaddle walks from start to the nearest first-order saddle of the
// field, in the scaled coordinates of fr (steps of at most one cell);
// ok is false when it does not settle on one (gradient zero within 1e-9
// of the potential's scale v0 per cell, one negative eigenvalue).
func (f *field) refineSaddle(fr *frame, start [3]float64, v0 float64) (s [3]float64, ok bool) {
	ξ := fr.coords(start)
	const δ = 1e-3 // the finite-difference step, cells
	at := func(x [3]float64) float64 { return f.V(fr.at(x)) / v0 }
	for range 80 {
		g, H := scaledDerivatives(at, ξ, δ)
		var eig mat.EigenSym
		if !eig.Factorize(H, true) {
			return start, false
		}
		λ := eig.Values(nil)
		var vecs mat.Dense
		eig.VectorsTo(&vecs)
		var step [3]float64
		gn := 0.0
		for i := range 3 {
			e := [3]float64{vecs.At(0, i), vecs.At(1, i), vecs.At(2, i)}
			gi := numeric.Dot(g, e)
			gn += gi * gi
			var d float64
			if i == 0 { // uphill along the lowest mode
				μ := λ[0]/2 + math.Sqrt(λ[0]*λ[0]/4+gi*gi)
				if μ-λ[0] > 0 {
					d = gi / (μ - λ[0])
				}
			} else { // downhill along the others
				μ := λ[i]/2 - math.Sqrt(λ[i]*λ[i]/4+gi*gi)
				if λ[i]-μ > 0 {
					d = -gi / (λ[i] - μ)
				}
			}
			for j := range 3 {
				step[j] += d * e[j]
			}
		}
		if n := math.Sqrt(numeric.Dot(step, step)); n > 1 {
			for j := range step {
				step[j] /= n
			}
		}
		if math.Sqrt(gn) < 1e-9 && λ[0] < 0 && λ[1] > 0 {
			return fr.at(ξ), true
		}
		for j := range ξ {
			ξ[j] += step[j]
		}
		if math.Sqrt(numeric.Dot(step, step)) < 1e-9 {
			break
		}
	}
	g, H := scaledDerivatives(at, ξ, δ)
	var eig mat.EigenSym
	if !eig.Factorize(H, false) {
		return start, false
	}
	λ := eig.Values(nil)
	if math.Sqrt(numeric.Dot(g, g)) < 1e-9 && λ[0] < 0 && λ[1] > 0 {
		return fr.at(ξ), true
	}
	return start, false
}

// scaledDerivatives are the gradient and Hessian of at by central
// differences of step δ.
func scaledDerivatives(at func([3]float64) float64, x [3]float64, δ float64) ([3]float64, *mat.SymDense) {
	var g [3]float64
	H := mat.NewSymDense(3, nil)
	shifted := func(i, j int, si, sj float64) float64 {
		q := x
		q[i] += si * δ
		q[j] += sj * δ
		return at(q)
	}
	v := at(x)
	for i := range 3 {
		p, m := shifted(i, i, 0.5, 0.5), shifted(i, i, -0.5, -0.5)
		g[i] = (p - m) / (2 * δ)
		H.SetSym(i, i, (p-2*v+m)/(δ*δ))
		for j := i + 1; j < 3; j++ {
			H.SetSym(i, j, (shifted(i, j, 1, 1)-shifted(i, j, 1, -1)-shifted(i, j, -1, 1)+shifted(i, j, -1, -1))/(4*δ*δ))
		}
	}
	return g, H
}

// descend follows the potential downhill from r (a saddle) with first step
// along d, in steps of a tenth of a cell, for at most n steps or until it
// stops falling; it returns the points passed.
func (f *field) descend(fr *frame, r, d [3]float64, n int) [][3]float64 {
	ξ := fr.coords(r)
	dξ := fr.coords([3]float64{fr.origin[0] + d[0], fr.origin[1] + d[1], fr.origin[2] + d[2]})
	const step = 0.1
	norm := math.Sqrt(numeric.Dot(dξ, dξ))
	for j := range ξ {
		ξ[j] += step * dξ[j] / norm
	}
	at := func(x [3]float64) float64 { return f.V(fr.at(x)) }
	out := [][3]float64{fr.at(ξ)}
	last := at(ξ)
	for range n {
		g, _ := scaledGradient(at, ξ, 1e-3)
		gn := math.Sqrt(numeric.Dot(g, g))
		if gn == 0 {
			break
		}
		next := ξ
		for j := range next {
			next[j] -= step * g[j] / gn
		}
		v := at(next)
		if v >= last {
			break
		}
		ξ, last = next, v
		out = append(out, fr.at(ξ))
	}
	return out
}

// scaledGradient is the gradient of at by central differences of step δ,
// and its value at x.
func scaledGradient(at func([3]float64) float64, x [3]float64, δ float64) ([3]float64, float64) {
	var g [3]float64
	for i := range 3 {
		p, m := x, x
		p[i] += δ
		m[i] -= δ
		g[i] = (at(p) - at(m)) / (2 * δ)
	}
	return g, at(x)
}

// lattice says whether the field holds a standing wave.
func (f *field) lattice() bool {
	for _, b := range f.beams {
		if b.back != nil {
			return true
		}
	}
	return false
}

// principalFrame is the frame of the trap's principal axes at the minimum
// r, its cells sized so that floodCells of them reach three times as far as
// the potential rises by depth along each axis (or as its highest point
// along the axis, where it never rises that far), at most reach.
func (f *field) principalFrame(r [3]float64, axes [3][3]float64, vmin, depth, reach float64) *frame {
	fr := &frame{origin: r, axes: axes}
	L, _ := f.scale()
	const n = 80
	q := math.Pow(reach/(L/50), 1.0/n)
	for i, a := range axes {
		extent := 0.0
		for _, sgn := range []float64{1, -1} {
			t, top, at := L/50, math.Inf(-1), 0.0
			for range n + 1 {
				v := f.V([3]float64{r[0] + sgn*t*a[0], r[1] + sgn*t*a[1], r[2] + sgn*t*a[2]}) - vmin
				if v >= depth {
					at = t
					break
				}
				if v > top {
					top, at = v, t
				}
				t *= q
			}
			extent = math.Max(extent, at)
		}
		fr.h[i] = math.Min(3*extent, reach) / floodCells
	}
	return fr
}

// floodSaddle is the saddle on the lowest way out of the minimum at fr's
// origin (below the straight rays' depth), by flooding and refining; the
// box grows along an axis whose face the way out is highest on (twice, at
// most to reach). ok is false when there is none in the box, or the
// refined saddle does not lead back down to the minimum.
func (f *field) floodSaddle(fr *frame, vmin, depth, reach, v0 float64) (s [3]float64, ok bool) {
	for range 5 {
		node, level, edge := f.floodGrid(fr)
		if !(level-vmin < depth) {
			return s, false
		}
		if edge >= 0 {
			if 2*fr.h[edge]*floodCells > reach {
				return s, false
			}
			fr.h[edge] *= 2
			continue
		}
		s, ok = f.refineSaddle(fr, node, v0)
		if !ok {
			return s, false
		}
		// The saddle must lead back down to this minimum.
		back := f.descend(fr, s, [3]float64{fr.origin[0] - s[0], fr.origin[1] - s[1], fr.origin[2] - s[2]}, 1000)
		ξ := fr.coords(back[len(back)-1])
		return s, math.Sqrt(numeric.Dot(ξ, ξ)) < 1
	}
	return s, false
}

// escapeProfile is the potential along the way out over the saddle s from
// the minimum at r: down from the saddle to the minimum and, beyond it,
// half as far again down the other side; distances (m) from the minimum
// along the path and U/k_B (K), for the plot.
func (f *field) escapeProfile(fr *frame, r, s [3]float64) [][2]float64 {
	in := f.descend(fr, s, [3]float64{r[0] - s[0], r[1] - s[1], r[2] - s[2]}, 1000)
	out := f.descend(fr, s, [3]float64{s[0] - r[0], s[1] - r[1], s[2] - r[2]}, len(in)*3/2)
	pts := [][3]float64{r}
	for i := len(in) - 1; i >= 0; i-- {
		pts = append(pts, in[i])
	}
	pts = append(pts, s)
	pts = append(pts, out...)
	var profile [][2]float64
	d := 0.0
	for i, p := range pts {
		if i > 0 {
			q := pts[i-1]
			e := [3]float64{p[0] - q[0], p[1] - q[1], p[2] - q[2]}
			d += math.Sqrt(numeric.Dot(e, e))
		}
		profile = append(profile, [2]float64{d, f.V(p) / atoms.KB})
	}
	return profile
}
