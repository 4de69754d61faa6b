package dimacs

import "fmt"

// Literals inside the encoder may be the constants litTrue and litFalse
// (= -litTrue); addClause drops false literals and satisfied clauses, so
// fixing a variable by a symmetry argument removes it from the formula
// instead of adding a unit clause.
const (
	litTrue  int32 = 1 << 30
	litFalse int32 = -litTrue
	maxVar         = 1<<30 - 1
)

// Family names a group of clauses or variables in Stats.
type Family int

// The constraint families of both formulations.
const (
	FamOrder    Family = iota // spine order: transitivity (and asymmetry in the baseline)
	FamPage                   // every edge on some page
	FamSamePage               // same-page variables
	FamBetween                // betweenness variables: c lies between the ends of e
	FamConflict               // forbidden crossings (stack) and nestings (queue)
	numFamilies
)

var familyNames = [numFamilies]string{"order", "page", "same-page", "betweenness", "conflict"}

// String returns the family's name as printed by --stats.
func (f Family) String() string {
	if f >= 0 && f < numFamilies {
		return familyNames[f]
	}
	return fmt.Sprintf("family(%d)", int(f))
}

// FamilyStats counts the variables, clauses and literals of one family.
type FamilyStats struct {
	Family   string `json:"family"`
	Vars     int    `json:"variables"`
	Clauses  int    `json:"clauses"`
	Literals int    `json:"literals"`
}

// Stats describes the size of an encoding.
type Stats struct {
	Vars     int           `json:"variables"`
	Clauses  int           `json:"clauses"`
	Literals int           `json:"literals"`
	Parts    int           `json:"parts"` // separately encoded pieces (blocks)
	Families []FamilyStats `json:"families"`
}

// formula accumulates clauses in one flat slice, each ended by 0.
type formula struct {
	lits    []int32
	nvars   int
	clauses int
	fam     [numFamilies]FamilyStats
	tmp     []int32
	err     error
}

// newVar allocates a variable in family f.
func (f *formula) newVar(fam Family) int32 {
	if f.nvars >= maxVar {
		f.err = fmt.Errorf("%w: more than %d variables", ErrTooLarge, maxVar)
		return litFalse
	}
	f.nvars++
	f.fam[fam].Vars++
	return int32(f.nvars)
}

// add appends a clause after removing false and repeated literals; a clause
// that holds a true literal or a complementary pair is dropped.
func (f *formula) add(fam Family, lits ...int32) {
	t := f.tmp[:0]
outer:
	for _, l := range lits {
		switch l {
		case litTrue:
			return
		case litFalse:
			continue
		}
		for _, x := range t {
			if x == l {
				continue outer
			}
			if x == -l {
				return
			}
		}
		t = append(t, l)
	}
	f.tmp = t
	f.lits = append(f.lits, t...)
	f.lits = append(f.lits, 0)
	f.clauses++
	f.fam[fam].Clauses++
	f.fam[fam].Literals += len(t)
}

func (f *formula) stats() Stats {
	s := Stats{Vars: f.nvars, Clauses: f.clauses}
	for i := range f.fam {
		st := f.fam[i]
		st.Family = Family(i).String()
		s.Literals += st.Literals
		s.Families = append(s.Families, st)
	}
	return s
}
