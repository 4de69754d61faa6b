#!/bin/sh
# Fault injection: output that follows no convention, with the SAT exit status.
echo "the answer is probably yes"
echo "SATISFIABLE"
exit 10
