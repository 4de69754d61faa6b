package planarcert

import "fmt"

// Embedding is a combinatorial embedding (rotation system) of a graph:
// Rotation[v] lists the neighbours of v in cyclic order around v. A rotation
// system is planar when tracing its faces gives V − E + F = 2C.
type Embedding struct {
	Rotation [][]int32
}

// KuratowskiKind tells which Kuratowski graph a subdivision is of.
type KuratowskiKind uint8

const (
	// K5 is the complete graph on five vertices.
	K5 KuratowskiKind = iota + 1
	// K33 is the complete bipartite graph K3,3.
	K33
)

// String returns "K5" or "K3,3".
func (k KuratowskiKind) String() string {
	switch k {
	case K5:
		return "K5"
	case K33:
		return "K3,3"
	}
	return fmt.Sprintf("kuratowski(%d)", uint8(k))
}

// Kuratowski is a subdivision of K5 or K3,3 inside a graph: the branch
// vertices and one path of the graph for every edge of K5 or K3,3. For K3,3
// the first three branch vertices form one side and the last three the other.
// Each path lists its vertices from one branch vertex to another.
type Kuratowski struct {
	Kind   KuratowskiKind
	Branch []int32
	Paths  [][]int32
}

// Cert is evidence about the planarity of one graph: an embedding when
// Planar, a Kuratowski subgraph when not.
type Cert struct {
	Planar     bool
	Embedding  *Embedding
	Kuratowski *Kuratowski
}
