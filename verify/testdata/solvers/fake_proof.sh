#!/bin/sh
# Fault injection: claims UNSAT and writes a "proof" that only states the
# empty clause. Usage: fake_proof.sh CNF PROOF
printf '0\n' > "$2"
echo "s UNSATISFIABLE"
exit 20
