#!/usr/bin/env bash
# Writes the report of a real `plumb advise JOB --report HTML` for
# chromium_report.sh and prints the number of plots it should hold. The job
# is given a quick-stop deceleration (motion.emergency_deceleration, an
# invented 0.5 m/s^2) so that the worst-case stop is searched and plotted.
# usage: plumb_advise_report_run.sh PLUMB JOB PLOTS HTML PAPER
# (PAPER is ignored: plumb's report suits both A4 and US Letter.)
# A plan that fails (exit status 1) still gets its report.
set -uo pipefail
plumb=$1 job=$2 plots=$3 html=$4
folder=$(mktemp -d) || exit 1
trap 'rm -rf "$folder"' EXIT
sed 's/^motion:$/motion:\n  emergency_deceleration: 0.5 m\/s^2/' "$job" >"$folder/job.yaml" || exit 1
grep -q '^  emergency_deceleration:' "$folder/job.yaml" || { echo "no motion: section in $job" >&2; exit 1; }
"$plumb" advise "$folder/job.yaml" --report "$html" >/dev/null
status=$?
if ((status != 0 && status != 1)); then
    echo "plumb advise failed with exit status $status" >&2
    exit 1
fi
echo "$plots"
