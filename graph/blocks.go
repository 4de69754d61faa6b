package graph

import "slices"

// Blocks returns the biconnected components of g with at least one edge,
// each as its sorted list of edge indices, ordered by their first edge.
// It is Hopcroft and Tarjan's algorithm ("Efficient algorithms for graph
// manipulation", CACM 16(6), 1973) with an explicit stack.
func (g *Graph) Blocks() [][]int32 {
	n := g.N()
	disc := make([]int32, n)
	low := make([]int32, n)
	for i := range disc {
		disc[i] = -1
	}
	type frame struct {
		v, parentEdge int32
		next          int
	}
	var (
		out   [][]int32
		estk  []int32
		stack []frame
		time  int32
	)
	for root := int32(0); int(root) < n; root++ {
		if disc[root] >= 0 {
			continue
		}
		disc[root], low[root] = time, time
		time++
		stack = append(stack[:0], frame{v: root, parentEdge: -1})
		for len(stack) > 0 {
			top := &stack[len(stack)-1]
			v := top.v
			nb, inc := g.Neighbors(v), g.IncidentEdges(v)
			if top.next < len(nb) {
				w, e := nb[top.next], inc[top.next]
				top.next++
				if e == top.parentEdge {
					continue
				}
				if disc[w] < 0 {
					estk = append(estk, e)
					disc[w], low[w] = time, time
					time++
					stack = append(stack, frame{v: w, parentEdge: e})
				} else if disc[w] < disc[v] {
					estk = append(estk, e)
					low[v] = min(low[v], disc[w])
				}
				continue
			}
			stack = stack[:len(stack)-1]
			if len(stack) == 0 {
				break
			}
			p := stack[len(stack)-1].v
			low[p] = min(low[p], low[v])
			if low[v] >= disc[p] {
				// p separates the subtree of v: pop its block.
				pe := top.parentEdge
				var blk []int32
				for {
					e := estk[len(estk)-1]
					estk = estk[:len(estk)-1]
					blk = append(blk, e)
					if e == pe {
						break
					}
				}
				slices.Sort(blk)
				out = append(out, blk)
			}
		}
	}
	slices.SortFunc(out, func(a, b []int32) int { return int(a[0] - b[0]) })
	return out
}
