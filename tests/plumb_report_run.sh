#!/usr/bin/env bash
# Writes the report of a real `plumb check JOB --report HTML` for
# chromium_report.sh and prints the number of plots it should hold.
# usage: plumb_report_run.sh PLUMB JOB PLOTS HTML PAPER
# (PAPER is ignored: plumb's report suits both A4 and US Letter.)
# A check that fails (exit status 1) still writes its report.
set -uo pipefail
plumb=$1 job=$2 plots=$3 html=$4
"$plumb" check "$job" --report "$html" >/dev/null
status=$?
if ((status != 0 && status != 1)); then
    echo "plumb check failed with exit status $status" >&2
    exit 1
fi
echo "$plots"
