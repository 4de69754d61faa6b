package cube

import "fmt"

// CheckTree checks that the cubes are the leaves of a complete binary
// decision tree, each written root first: there is one variable v that
// every cube starts with, as v or as ¬v, both signs occur, and the cubes of
// each sign, with that first literal removed, are again such a tree — down
// to a single empty cube. Then every assignment satisfies exactly one cube
// (the argument is in the package doc), which proves coverage and
// disjointness at once. The check is linear in the number of literals.
//
// A cube that is a prefix of another, or two equal cubes, is an overlap
// (ErrOverlap, naming both). Any other departure from the shape wraps
// ErrNotTree and says where; such cubes may still cover the space, which
// only a refutation of CoverageCNF can then show.
func CheckTree(cubes []Cube) error {
	if len(cubes) == 0 {
		return fmt.Errorf("%w: there are no cubes", ErrNotCovering)
	}
	if err := wellFormed(cubes); err != nil {
		return err
	}
	idx := make([]int, len(cubes))
	for i := range idx {
		idx[i] = i
	}
	return checkNode(cubes, idx, 0, nil)
}

func checkNode(cubes []Cube, idx []int, depth int, path Cube) error {
	first := idx[0]
	if len(idx) == 1 && len(cubes[first]) == depth {
		return nil
	}
	for _, i := range idx {
		if len(cubes[i]) == depth {
			other := idx[0]
			if other == i {
				other = idx[1]
			}
			a, b := min(i, other), max(i, other)
			if len(cubes[a]) == len(cubes[b]) {
				return fmt.Errorf("%w: cubes %d and %d are the same (%s)", ErrOverlap, a+1, b+1, cubes[a])
			}
			return fmt.Errorf("%w: cube %d (%s) holds wherever cube %d (%s) holds", ErrOverlap, i+1, cubes[i], other+1, cubes[other])
		}
	}
	v := abs(cubes[first][depth])
	var pos, neg []int
	for _, i := range idx {
		l := cubes[i][depth]
		switch l {
		case v:
			pos = append(pos, i)
		case -v:
			neg = append(neg, i)
		default:
			return fmt.Errorf("%w: after the decisions %s, cube %d decides variable %d and cube %d variable %d",
				ErrNotTree, pathText(path), first+1, v, i+1, abs(l))
		}
	}
	if len(pos) == 0 || len(neg) == 0 {
		missing := v
		if len(neg) == 0 {
			missing = -v
		}
		return fmt.Errorf("%w: after the decisions %s, no cube continues with %d", ErrNotTree, pathText(path), missing)
	}
	p := append(path[:len(path):len(path)], v)
	if err := checkNode(cubes, pos, depth+1, p); err != nil {
		return err
	}
	p[len(p)-1] = -v
	return checkNode(cubes, neg, depth+1, p)
}

func pathText(p Cube) string {
	if len(p) == 0 {
		return "(none)"
	}
	return p.String()
}
