package proof

import "fmt"

// stepSlack is how many literals a step may have beyond twice the variables
// mentioned before it (see stepLimit).
const stepSlack = 16

// stepLimit is the most literals (as written, repeats included) a proof step
// may have when vars variables have been mentioned by the formula and the
// proof before it. A clause that repeats no literal has at most two literals
// per variable, tautologies included, and a lemma that introduces a new
// variable (as RAT allows) adds one more variable; a lemma that repeats no
// literal and is no tautology is therefore refused only when it introduces
// more new variables at once than vars+stepSlack. The limit keeps the memory
// of one step in proportion to the formula and the proof read so far,
// whatever a short (or compressed) input claims.
func stepLimit(vars int) int { return 2*vars + stepSlack }

// stepLimitMsg says why a step of more than limit literals is refused.
func stepLimitMsg(limit, vars int) string {
	return fmt.Sprintf("step has more than %d literals: a step may have at most twice the %d variables the formula and the proof mention before it, plus %d", limit, vars, stepSlack)
}
