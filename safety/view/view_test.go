package view

import (
	"math"
	"strings"
	"testing"
)

// The JSON writer refuses a non-finite figure and names where it is, rather
// than write a document no reader can take; an absent value is null.
func TestJSONRefusesNonFinite(t *testing.T) {
	inner := &Record{}
	inner.F(Field{Key: "v_w", Kind: Number, SI: math.Inf(1)})
	doc := &Record{}
	doc.F(Num("a_w", "a", math.NaN(), "", "")).L(&List{Key: "list", Records: []Record{*inner}})
	var b strings.Builder
	err := WriteJSON(&b, doc)
	if err == nil || !strings.Contains(err.Error(), "$.list[0].v_w is +Inf") {
		t.Errorf("got %v", err)
	}
	ok := &Record{}
	ok.F(Num("a_w", "a", math.NaN(), "", "")).F(Absent("b", "b", true, ""))
	b.Reset()
	if err := WriteJSON(&b, ok); err != nil || b.String() != "{\n  \"a_w\": null\n}\n" {
		t.Errorf("got %q, %v", b.String(), err)
	}
}

// A line's {key} takes the field's text; the texts themselves are copied as
// they are, so a setup's name holding braces is never expanded.
func TestExpand(t *testing.T) {
	r := &Record{}
	r.F(Str("name", "name", "{power_w}", "")).F(Num("power_w", "power", 1, "1 W", ""))
	goal := &Record{}
	goal.F(Num("margin_db", "margin", 3, "+3.0 dB", ""))
	r.O("goal", goal, false)
	if got := r.Expand("{name} carries {power_w}, margin {goal.margin_db}"); got != "{power_w} carries 1 W, margin +3.0 dB" {
		t.Errorf("got %q", got)
	}
}
