// Package safety evaluates a setup: it runs the power and beam budget of
// package budget and gathers its findings into one assessment that the
// terminal, JSON and PDF outputs share.
//
// Conventions: SI base units throughout (m, W, s, W/m²); beam sizes are
// 1/e² intensity radii. Hazard figures use each laser's maximum power.
package safety
