#!/usr/bin/env bash
# Writes the report of a real `plumb sweep` or `plumb scatter` with --report
# HTML for chromium_report.sh and prints the number of plots it should hold.
#   sweep:   the job over acceleration (4 values) x rope length (3 values): one map
#   scatter: the job with the scatter section of docs/scatter.md, 60 samples:
#            one histogram per check made (PLOTS gives the count)
# usage: plumb_answer_report_run.sh sweep|scatter PLUMB JOB PLOTS HTML PAPER
# (PAPER is ignored.) Cases or samples that fail a check (exit status 1) still get their report.
set -uo pipefail
kind=$1 plumb=$2 job=$3 plots=$4 html=$5
folder=$(mktemp -d) || exit 1
trap 'rm -rf "$folder"' EXIT
case $kind in
sweep)
    "$plumb" sweep "$job" --vary 'motion.moves[1].acceleration=0.05m/s^2:0.2m/s^2:4' \
        --vary 'hoist.rope_length=5m:9m:3' --threads 2 --output "$folder/sweep.csv" --report "$html" >/dev/null 2>&1
    ;;
scatter)
    cat "$job" - >"$folder/job.yaml" <<'YAML'
scatter:
  load.mass: {distribution: normal, mean: 14 t, sd: 0.5 t, min: 12 t, max: 16 t}
  motion.moves[1].acceleration: {distribution: uniform, min: 0.08 m/s^2, max: 0.14 m/s^2}
  hoist.rope_length: {distribution: lognormal, mean: 7.5 m, sd: 0.3 m}
YAML
    "$plumb" scatter "$folder/job.yaml" --samples 60 --threads 2 --report "$html" >/dev/null
    ;;
*)
    echo "unknown kind $kind" >&2
    exit 1
    ;;
esac
status=$?
if ((status != 0 && status != 1)); then
    echo "plumb $kind failed with exit status $status" >&2
    exit 1
fi
echo "$plots"
