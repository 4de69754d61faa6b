package cube

import (
	"fmt"
	"slices"
)

// MaxPairwise is the most cubes CheckDisjoint compares pair by pair.
const MaxPairwise = 8192

// CheckDisjoint checks that no two cubes hold at once: every pair has a
// variable that one cube sets true and the other false. Cubes that pass
// CheckTree need no such check. It compares all pairs, so it refuses more
// than MaxPairwise cubes (ErrTooMany); an overlap wraps ErrOverlap and names
// both cubes and an assignment under which both hold.
func CheckDisjoint(cubes []Cube) error {
	if len(cubes) > MaxPairwise {
		return fmt.Errorf("%w: %d cubes, the pairwise check takes at most %d", ErrTooMany, len(cubes), MaxPairwise)
	}
	if err := wellFormed(cubes); err != nil {
		return err
	}
	var maxVar int32
	for _, c := range cubes {
		for _, l := range c {
			maxVar = max(maxVar, abs(l))
		}
	}
	sign := make([]int8, maxVar+1)
	for i, a := range cubes {
		for _, l := range a {
			sign[abs(l)] = sgn(l)
		}
		for j := i + 1; j < len(cubes); j++ {
			if !clashes(cubes[j], sign) {
				both := slices.Clone(a)
				for _, l := range cubes[j] {
					if sign[abs(l)] == 0 {
						both = append(both, l)
					}
				}
				return fmt.Errorf("%w: cubes %d and %d both hold under %s", ErrOverlap, i+1, j+1, both)
			}
		}
		for _, l := range a {
			sign[abs(l)] = 0
		}
	}
	return nil
}

func clashes(c Cube, sign []int8) bool {
	for _, l := range c {
		if s := sign[abs(l)]; s != 0 && s != sgn(l) {
			return true
		}
	}
	return false
}

func sgn(l int32) int8 {
	if l < 0 {
		return -1
	}
	return 1
}
