#!/bin/sh
# Fault injection: never answers. A second process in the same group records
# its pid so the test can see that the whole group was killed.
sleep 300 &
if [ -n "$SPINECERT_TEST_PIDFILE" ]; then echo $! > "$SPINECERT_TEST_PIDFILE"; fi
wait
