package limits

// Status says how far a value can be trusted.
type Status string

// Statuses of a value.
const (
	// StatusChecked: the value was compared with a named public source that
	// prints it (CheckedAgainst).
	StatusChecked Status = "checked"
	// StatusFromMemory: transcribed from memory of the printed table of the
	// standard the provenance names (IEC 60825-1:2014, EN 207); no public
	// source was at hand to compare it with.
	StatusFromMemory Status = "from memory"
	// StatusEarlierEdition: the value equals the row an earlier edition's
	// values print, as reprinted in public guidance (CheckedAgainst names
	// it); the 2014 text itself was not compared.
	StatusEarlierEdition Status = "checked against an earlier edition"
	// StatusSubstitute: a value of our own that stands in for one we could
	// not confirm, chosen to be at least as restrictive (Replaces says what
	// it stands in for).
	StatusSubstitute Status = "conservative substitute"
)

// Standard is the standard and edition the tables follow.
const Standard = "IEC 60825-1:2014 (Edition 3)"

// Tables of the standard, named by what they hold (the numbers are not
// given: we could not confirm them).
const (
	TableEyeShort   = "Annex A, MPE at the cornea, exposures below 10 s"
	TableEyeLong    = "Annex A, MPE at the cornea, exposures from 10 s"
	TableSkin       = "Annex A, MPE of the skin"
	TableFactors    = "Annex A, correction factors and breakpoints"
	TableApertures  = "Annex A, limiting apertures"
	TableRepetitive = "repetitive-pulse rules"
	TableClass1     = "AEL table, Class 1 and 1M"
	TableClass2     = "AEL table, Class 2 and 2M"
	TableClass3R    = "AEL table, Class 3R"
	TableClass3B    = "AEL table, Class 3B"
	TableTimeBases  = "classification time bases"
)

// Public sources the values were compared with.
const (
	// SourceDirectiveFactors is the table of coefficients of the EU
	// directive on artificial optical radiation (the ICNIRP values), as
	// published by the Norwegian Labour Inspection Authority (Regulations
	// concerning Action and Limit Values, Annex 4, Table 4.5).
	SourceDirectiveFactors = "Directive 2006/25/EC Annex II Table 2.5 (coefficients)"
	// SourceDirectiveRepetitive is its table of corrections for repetitive
	// exposure: the three rules, C_P = N^−0.25 for thermal limits only, and
	// T_min per band.
	SourceDirectiveRepetitive = "Directive 2006/25/EC Annex II Table 2.6 (repetitive exposure)"
	// SourceUsersGuide is the laser user's guide of the same family of
	// standards, §5.1: 100 s above 400 nm and 30 000 s below as the
	// worst-case exposure for the MPE.
	SourceUsersGuide = "IEC 60825-14 (AS/NZS IEC 60825.14:2011) §5.1, worst-case exposure durations"
	// SourceSimplifiedMPE is the simplified table of MPE at the cornea of
	// the German accident-prevention regulation on laser radiation (values
	// of the earlier editions of IEC/EN 60825-1), as reprinted in public
	// guidance: per band, a continuous, a mode-locked (below 1 ns) and a
	// pulsed (1 ns onward) value.
	SourceSimplifiedMPE = "DGUV Vorschrift 11 simplified MPE at the cornea (earlier-edition values), as reprinted in Haufe Arbeitsschutz Office, Laser: Gefährdungen und Schutzmaßnahmen, Tab. 3"
)

// Provenance is where a value comes from: the standard, its table and row,
// the public sources it was checked against, and its status.
type Provenance struct {
	Standard, Table, Row string
	CheckedAgainst       []string
	Status               Status
	// Replaces says, for a substitute, what it stands in for.
	Replaces string
}

// Checked reports whether the value was compared with a public source.
func (p Provenance) Checked() bool { return p.Status == StatusChecked }

// String is the provenance in one line, for people.
func (p Provenance) String() string {
	s := p.Standard + ", " + p.Table
	if p.Row != "" {
		s += ", " + p.Row
	}
	s += ": " + string(p.Status)
	if p.Status == StatusSubstitute && p.Replaces != "" {
		s += " (in place of " + p.Replaces + ")"
	}
	for i, c := range p.CheckedAgainst {
		if i == 0 {
			s += "; checked against "
		} else {
			s += ", "
		}
		s += c
	}
	return s
}

// memory is a row transcribed from memory.
func memory(table, row string) Provenance {
	return Provenance{Standard: Standard, Table: table, Row: row, Status: StatusFromMemory}
}

// checked is a row compared with public sources.
func checked(table, row string, sources ...string) Provenance {
	return Provenance{Standard: Standard, Table: table, Row: row, Status: StatusChecked, CheckedAgainst: sources}
}

// earlier is a row whose value an earlier edition's reprinted table prints.
func earlier(table, row string, sources ...string) Provenance {
	return Provenance{Standard: Standard, Table: table, Row: row, Status: StatusEarlierEdition, CheckedAgainst: sources}
}

// substitute is a value of our own in place of a row we could not confirm.
func substitute(table, row, replaces string) Provenance {
	return Provenance{Standard: Standard, Table: table, Row: row, Status: StatusSubstitute, Replaces: replaces}
}
