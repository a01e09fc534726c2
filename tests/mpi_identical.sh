#!/usr/bin/env bash
# The MPI mode's promise: `mpirun -n 2 plumb ARGS` writes byte for byte what
# one process writes. Usage: mpi_identical.sh MPIRUN PLUMB WORKDIR sweep|scatter ARGS...
# For sweep, ARGS get --output FILE; for scatter, standard output is compared.
# Also: the second rank prints nothing (the launcher's own messages aside),
# and both runs end with the same exit status.
set -uo pipefail
mpirun=$1 plumb=$2 work=$3 command=$4
shift 4
rm -rf "$work" && mkdir -p "$work"
if [ "$command" = sweep ]; then
  "$plumb" sweep "$@" --output "$work/one.csv" >"$work/one.out" 2>"$work/one.err"
  one=$?
  "$mpirun" --allow-run-as-root --oversubscribe -n 2 --output-filename "$work/ranks" \
      "$plumb" sweep "$@" --output "$work/two.csv" >"$work/two.out" 2>"$work/two.err"
  two=$?
  a="$work/one.csv" b="$work/two.csv"
else
  "$plumb" "$command" "$@" >"$work/one.csv" 2>"$work/one.err"
  one=$?
  "$mpirun" --allow-run-as-root --oversubscribe -n 2 --output-filename "$work/ranks" \
      "$plumb" "$command" "$@" >"$work/two.csv" 2>"$work/two.err"
  two=$?
  a="$work/one.csv" b="$work/two.csv"
fi
echo "exit status: one process $one, mpirun -n 2 $two"
[ "$one" = "$two" ] || { echo "exit statuses differ"; cat "$work/two.err"; exit 1; }
[ -s "$a" ] || { echo "no output from one process"; exit 1; }
cmp "$a" "$b" || { echo "outputs differ"; diff "$a" "$b" | head -20; exit 1; }
# The second rank's own standard output and error (Open MPI's --output-filename).
for f in "$work"/ranks/1/rank.1/stdout "$work"/ranks/1/rank.1/stderr; do
  if [ -s "$f" ]; then echo "rank 1 printed:"; cat "$f"; exit 1; fi
done
echo "identical: $(wc -c <"$a") bytes"
