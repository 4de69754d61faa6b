#!/bin/sh
# Fault injection: claims SAT with the all-false assignment, whatever the formula.
# The CNF path is the last argument.
for f; do cnf=$f; done
n=$(awk '$1 == "p" && $2 == "cnf" { print $3; exit }' "$cnf")
echo "s SATISFIABLE"
printf 'v'
i=1
while [ "$i" -le "$n" ]; do printf ' -%d' "$i"; i=$((i + 1)); done
printf ' 0\n'
exit 10
