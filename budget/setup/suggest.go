package setup

import "strings"

// editDistance is the optimal-string-alignment distance between a and b:
// insertions, deletions, substitutions and transpositions of neighbours
// each count 1 ("lenght" is one from "length"). Compared case-insensitively.
func editDistance(a, b string) int {
	ra, rb := []rune(strings.ToLower(a)), []rune(strings.ToLower(b))
	d := make([][]int, len(ra)+1)
	for i := range d {
		d[i] = make([]int, len(rb)+1)
		d[i][0] = i
	}
	for j := range d[0] {
		d[0][j] = j
	}
	for i := 1; i <= len(ra); i++ {
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			d[i][j] = min(d[i-1][j]+1, d[i][j-1]+1, d[i-1][j-1]+cost)
			if i > 1 && j > 1 && ra[i-1] == rb[j-2] && ra[i-2] == rb[j-1] {
				d[i][j] = min(d[i][j], d[i-2][j-2]+1)
			}
		}
	}
	return d[len(ra)][len(rb)]
}

// closest is the candidate nearest to word, if it is near enough to be
// what was meant: at most 1 edit for words of up to 4 characters, 2 up to
// 8, 3 beyond; a tie between candidates suggests none (nearest lists
// them). Failing that, a word that begins exactly one candidate ("sat" for
// "saturation") suggests it.
func closest(word string, candidates []string) (string, bool) {
	if n := nearest(word, candidates); len(n) == 1 {
		return n[0], true
	}
	return "", false
}

// nearest lists the candidates nearest to word within closest's limits
// (several when they tie), or the one candidate the word begins.
func nearest(word string, candidates []string) []string {
	limit := 1
	switch n := len([]rune(word)); {
	case n > 8:
		limit = 3
	case n > 4:
		limit = 2
	}
	var best []string
	bestD := limit + 1
	for _, c := range candidates {
		if c == word {
			continue
		}
		switch d := editDistance(word, c); {
		case d < bestD:
			best, bestD = []string{c}, d
		case d == bestD:
			best = append(best, c)
		}
	}
	if len(best) > 0 {
		return best
	}
	var starts []string
	for _, c := range candidates {
		if len(word) >= 2 && strings.HasPrefix(strings.ToLower(c), strings.ToLower(word)) {
			starts = append(starts, c)
		}
	}
	if len(starts) == 1 {
		return starts
	}
	return nil
}

// didYouMean is "; did you mean X?" when a candidate is near word, else "".
// With a tie of up to three candidates it names them all.
func didYouMean(word string, candidates []string) string {
	n := nearest(word, candidates)
	if len(n) == 0 || len(n) > 3 {
		return ""
	}
	q := make([]string, len(n))
	for i, c := range n {
		q[i] = quoteIfSpaced(c)
	}
	return "; did you mean " + strings.Join(q, " or ") + "?"
}

func quoteIfSpaced(s string) string {
	if strings.ContainsAny(s, " ") {
		return `"` + s + `"`
	}
	return s
}
