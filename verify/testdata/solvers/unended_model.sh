#!/bin/sh
# Fault injection: a model that is not ended by 0.
echo "s SATISFIABLE"
echo "v 1 2 3"
exit 10
