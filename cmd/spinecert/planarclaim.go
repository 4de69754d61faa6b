package main

import (
	"errors"
	"fmt"
	"os"

	"spinecert.dev/graph"
	"spinecert.dev/planar"
	"spinecert.dev/planar/planarcert"
)

// planarityRecord is the planarity verdict that pagenumber and bundle record:
// found and checked by planar.DecideChecked by the independent certificate
// checker before it is reported.
type planarityRecord struct {
	Planar      bool   `json:"planar"`
	Certificate string `json:"certificate"` // "embedding", "K5 subdivision" or "K3,3 subdivision"
	Checked     bool   `json:"checked"`
	cert        *planarcert.Cert
}

// checkedPlanarity decides planarity and checks the certificate.
func checkedPlanarity(g *graph.Graph) (*planarityRecord, error) {
	pr, err := planar.DecideChecked(g)
	if errors.Is(err, planarcert.ErrRejected) {
		return nil, undecided(fmt.Errorf("planarity: %w", err))
	}
	if err != nil {
		return nil, fmt.Errorf("planarity: %w", err)
	}
	rec := &planarityRecord{Planar: pr.Planar, Certificate: "embedding", Checked: true, cert: pr.Cert}
	if !pr.Planar {
		rec.Certificate = fmt.Sprintf("%s subdivision", pr.Cert.Kuratowski.Kind)
	}
	return rec, nil
}

// String is the human line, e.g. "planar: yes (embedding checked)".
func (p *planarityRecord) String() string {
	yes := "no"
	if p.Planar {
		yes = "yes"
	}
	return fmt.Sprintf("planar: %s (%s checked)", yes, p.Certificate)
}

// requirePlanar is the --planar rule: a claim about a planar graph fails
// (exit 1) when the graph is not planar.
func requirePlanar(name string, p *planarityRecord) error {
	if p.Planar {
		return nil
	}
	return refuted(fmt.Errorf("%s is not planar (%s checked), but --planar requires a planar graph", name, p.Certificate))
}

// readPlanarCertFile reads a planarity certificate for g from path; errors
// are input errors (exit 2). The certificate is not checked here.
func readPlanarCertFile(path string, g *graph.Graph) (*planarcert.Cert, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, usageErr(err)
	}
	defer f.Close()
	c, err := planarcert.Read(f, path, g)
	if err != nil {
		return nil, usageErr(err)
	}
	return c, nil
}
