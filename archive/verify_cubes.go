package archive

import (
	"bytes"
	"fmt"
	"io"
	"os"

	"spinecert.dev/cube"
	"spinecert.dev/dimacs"
	"spinecert.dev/proof"
)

// prepareCubes reads the cube file of a refutation by cubes, checks it
// against the manifest and, for a decision tree, checks coverage by shape.
func (v *verifier) prepareCubes() {
	cs := v.m.Refutation.Cubes
	data, ok := v.heldMember("cubes", cs.Member, cs.SHA256, " (it must come before the proofs)")
	if !ok {
		return
	}
	vars := v.m.Refutation.CNF.Vars
	if v.target != nil {
		vars = v.target.Vars
	}
	cubes, err := cube.Read(bytes.NewReader(data), cs.Member, cube.ReadOptions{Vars: vars})
	if err != nil {
		v.rep.add("cubes", StatusFail, "%v", err)
		return
	}
	if len(cubes) != cs.Count {
		v.rep.add("cubes", StatusFail, "%s holds %d cubes, the manifest records %d", cs.Member, len(cubes), cs.Count)
		return
	}
	v.cubes = cubes
	v.cubeIdx = map[string]int{}
	for i, e := range cs.Entries {
		v.cubeIdx[e.Proof.Member] = i
	}
	switch cs.Coverage.Method {
	case CoverTree:
		if err := cube.CheckTree(cubes); err != nil {
			v.rep.add("coverage", StatusFail, "%v", err)
			return
		}
		v.coverOK = true
		v.rep.add("coverage", StatusPass, "the %d cubes are the leaves of a complete binary decision tree (%s): every assignment satisfies exactly one", len(cubes), CoverTree)
	case CoverProof:
		v.cubeIdx[cs.Coverage.Proof.Member] = -1
	}
}

// cubeMember checks one proof member of a refutation by cubes: a cube's
// proof against the CNF with the cube's literals as units, or the coverage
// proof against the coverage formula. With Jobs > 1 the proof is copied to
// a file and checked beside the reading of the next members.
func (v *verifier) cubeMember(m Member, r io.Reader) error {
	i, ok := v.cubeIdx[m.Name]
	if !ok || v.cubes == nil || v.target == nil {
		return nil // unlisted members are reported in finish; unchecked proofs in finishCubes
	}
	cs := v.m.Refutation.Cubes
	var p Proof
	var against *dimacs.CNF
	if i < 0 {
		p, against = *cs.Coverage.Proof, cube.CoverageCNF(v.cubes, v.target.Vars)
	} else {
		p, against = cs.Entries[i].Proof, cube.Apply(v.target, v.cubes[i])
	}
	if p.SHA256 != m.SHA256 || p.Size != m.Size {
		v.rep.add("proof record "+m.Name, StatusFail, "the manifest records size %d and SHA-256 %s, the member has size %d and SHA-256 %s", p.Size, p.SHA256, m.Size, m.SHA256)
		return nil
	}
	if i >= 0 && v.opt.CubeOutcome != nil {
		if out, ok := v.opt.CubeOutcome(i, m.SHA256); ok {
			v.mu.Lock()
			v.outcomes[m.Name] = out
			v.elsewhere++
			v.mu.Unlock()
			return nil
		}
	}
	if i >= 0 && v.opt.CubeFilter != nil && !v.opt.CubeFilter(i) {
		return nil
	}
	opt := proof.RefutationOptions{Format: p.Format, Name: m.Name, TempDir: v.opt.TempDir}
	record := func(out proof.Outcome) {
		v.mu.Lock()
		v.outcomes[m.Name] = out
		v.mu.Unlock()
		if i >= 0 && v.opt.CubeChecked != nil {
			v.opt.CubeChecked(i, m.SHA256, out)
		}
	}
	if cap(v.sem) <= 1 {
		record(proof.CheckRefutation(v.ctx, against, r, opt))
		return nil
	}
	v.sem <- struct{}{}
	f, err := os.CreateTemp(v.opt.TempDir, "spinecert-cube-proof-*")
	if err != nil {
		<-v.sem
		return fmt.Errorf("archive: %w", err)
	}
	if _, err := io.Copy(f, r); err != nil {
		f.Close()
		os.Remove(f.Name())
		<-v.sem
		return err
	}
	v.wg.Add(1)
	go func() {
		defer func() { f.Close(); os.Remove(f.Name()); <-v.sem; v.wg.Done() }()
		var out proof.Outcome
		if _, err := f.Seek(0, io.SeekStart); err != nil {
			out = proof.Outcome{Err: err, Detail: err.Error()}
		} else {
			out = proof.CheckRefutation(v.ctx, against, f, opt)
		}
		record(out)
	}()
	return nil
}

// cubesUnchecked starts the finding of cube proofs that had no CNF to be
// checked against (a re-solve may supersede it).
const cubesUnchecked = "the cube proofs were not checked"

// finishCubes reports the cube proofs and tells whether the refutation by
// cubes is established: coverage, and every cube's proof accepted.
func (v *verifier) finishCubes() bool {
	cs := v.m.Refutation.Cubes
	if v.target == nil {
		v.rep.add("cubes", StatusFail, "%s: there is no CNF of the claim to check them against", cubesUnchecked)
		return false
	}
	if v.cubes == nil {
		return false
	}
	if cs.Coverage.Method == CoverProof {
		out, ok := v.outcomes[cs.Coverage.Proof.Member]
		switch {
		case !ok:
			v.rep.add("coverage", StatusFail, "the coverage proof %s was not checked (missing or altered)", cs.Coverage.Proof.Member)
		case out.OK():
			v.coverOK = true
			v.rep.add("coverage", StatusPass, "the formula of the negated cubes is refuted: %s", describe(out))
		default:
			v.rep.add("coverage", StatusFail, "the coverage proof %s: %s", cs.Coverage.Proof.Member, describe(out))
		}
	}
	passed, shown := 0, 0
	var lemmas, core int64
	for i, e := range cs.Entries {
		out, ok := v.outcomes[e.Proof.Member]
		switch {
		case ok && out.OK():
			passed++
			lemmas += out.Lemmas
			core += out.Core
			continue
		case shown >= 20:
			continue
		case !ok:
			v.rep.add(fmt.Sprintf("cube %d", i+1), StatusFail, "its proof %s was not checked (missing or altered)", e.Proof.Member)
		default:
			v.rep.add(fmt.Sprintf("cube %d", i+1), StatusFail, "cube %s: %s", v.cubes[i], describe(out))
		}
		shown++
	}
	if passed < len(cs.Entries) {
		if n := len(cs.Entries) - passed - shown; n > 0 {
			v.rep.add("cubes", StatusFail, "%d more cubes failed", n)
		}
		v.rep.add("cubes", StatusFail, "%d of %d cubes refuted", passed, len(cs.Entries))
		return false
	}
	where := ""
	if v.elsewhere > 0 {
		where = fmt.Sprintf("; %d of them checked by Slurm array tasks of this spinecert, taken from their records", v.elsewhere)
	}
	v.rep.add("cubes", StatusPass, "all %d cubes refuted: each proof passed spinecert's DRAT checker and the LRAT re-check against the CNF with the cube's literals as units (%d lemmas, %d needed%s)", passed, lemmas, core, where)
	return v.coverOK
}
