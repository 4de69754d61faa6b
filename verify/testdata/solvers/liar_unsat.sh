#!/bin/sh
# Fault injection: claims UNSAT for any formula, with a matching exit status.
echo "s UNSATISFIABLE"
exit 20
