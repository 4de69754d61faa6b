#!/bin/sh
# Fault injection: says UNSAT but exits with the SAT status.
echo "s UNSATISFIABLE"
exit 10
