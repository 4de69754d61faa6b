package proof

// Proof formats. Solver backends write one of the DRAT forms; CheckLRAT reads
// LRAT.
const (
	DRAT       = "drat"        // DRAT text (Wetzler, Heule, Hunt, SAT 2014)
	DRATBinary = "drat-binary" // binary DRAT, same paper
	RUP        = "rup"         // DRAT text without deletions or RAT lemmas
	LRAT       = "lrat"        // LRAT text (Cruz-Filipe, Heule, Hunt, Kaufmann, Schneider-Kamp, CADE 2017)
)
