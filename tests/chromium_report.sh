#!/usr/bin/env bash
# Opens a lift-plan attachment in headless Chromium and checks what a
# reviewer would get: the page loads without errors or outside requests, prints
# to a PDF of a sensible page count on A4 and on US Letter, and the rendered
# DOM holds the verdict, the checks table and every plot. Also leaves a PNG
# screenshot beside the PDFs for a person to look at.
#
# usage: chromium_report.sh OUTPUT_DIR MIN_PAGES MAX_PAGES PROGRAM [ARGUMENTS...]
# The program is run as PROGRAM ARGUMENTS... HTML PAPER (PAPER: a4 or letter):
# it writes the report to HTML and prints the number of plots it holds.
# Exit 0 pass, 1 fail, 77 skipped (no Chromium: ctest reports SKIPPED, not passed).
set -uo pipefail

out=$1
min_pages=$2  # title, verdict and checks; plots on a page of their own; cautions and sign-off
max_pages=$3  # more would mean plots or tables cut across pages or blown up
shift 3
sample=("$@")
chromium=${PLUMB_CHROMIUM:-/usr/bin/chromium}

if [[ ! -x $chromium ]]; then
    echo "SKIPPED: no Chromium at $chromium (install Debian's chromium package or set PLUMB_CHROMIUM);" \
         "the report was not checked in a browser."
    exit 77
fi

fail() {
    echo "FAIL: $*"
    exit 1
}

rm -rf "$out"
mkdir -p "$out" || fail "cannot make $out"
profiles=$(mktemp -d) || fail "cannot make a temporary folder"
trap 'rm -rf "$profiles"' EXIT

# Chromium with a fresh profile each run; no network of its own, no sandbox
# (containers), no GPU. Output and logging go to the named files.
run_chromium() {
    local name=$1
    shift
    local profile
    profile=$(mktemp -d "$profiles/profile.XXXXXX")
    timeout 120 "$chromium" --headless --no-sandbox --disable-gpu --disable-quic --no-first-run \
        --disable-background-networking --disable-component-update --disable-sync \
        --disable-dev-shm-usage --user-data-dir="$profile" \
        --enable-logging=stderr --v=0 --log-net-log="$out/$name.netlog.json" "$@" \
        2>"$out/$name.log"
}

# Messages from the page itself (console, script errors) and requests it made
# to anywhere: a self-contained report has neither. Chromium's own background
# requests carry no file:// isolation key and are not counted.
check_clean_load() {
    local name=$1
    if grep -q "CONSOLE" "$out/$name.log"; then
        grep "CONSOLE" "$out/$name.log"
        fail "$name: the page wrote to the console"
    fi
    if grep -q '"network_isolation_key":"file://' "$out/$name.netlog.json"; then
        grep -o '"url":"[^"]*"' "$out/$name.netlog.json" | sort -u
        fail "$name: the page requested something from the network"
    fi
}

for paper in a4 letter; do
    html="$out/report-$paper.html"
    plots=$("${sample[@]}" "$html" "$paper") || fail "the program writing the report failed"
    url="file://$html"

    # 1. The DOM as Chromium built it.
    run_chromium "dom-$paper" --dump-dom "$url" >"$out/dom-$paper.html" || fail "$paper: Chromium could not load $url"
    check_clean_load "dom-$paper"
    dom="$out/dom-$paper.html"
    grep -q '</html>' "$dom" || fail "$paper: the DOM is incomplete"
    grep -q 'id="verdict"' "$dom" || fail "$paper: no verdict banner"
    grep -Eq 'Result: (PASS|CAUTION|FAIL)' "$dom" || fail "$paper: the verdict banner has no verdict word"
    grep -q '<table class="data"' "$dom" || fail "$paper: no checks table"
    grep -q 'id="sign-off"' "$dom" || fail "$paper: no reviewer sign-off"
    grep -q 'id="cautions"' "$dom" || fail "$paper: no cautions"
    svgs=$(grep -o '<svg ' "$dom" | wc -l)
    [[ $svgs -eq $plots ]] || fail "$paper: $svgs plots in the DOM, $plots written"
    if grep -Eq '<script|<link|<img| src=| href=|url\(' "$dom"; then
        fail "$paper: the DOM refers to something outside the file"
    fi

    # 2. Print to PDF; count its pages (Chromium writes one "/Type /Page" per page).
    pdf="$out/report-$paper.pdf"
    run_chromium "pdf-$paper" --no-pdf-header-footer --print-to-pdf="$pdf" "$url" || fail "$paper: printing to PDF failed"
    check_clean_load "pdf-$paper"
    [[ $(head -c 5 "$pdf") == "%PDF-" ]] || fail "$paper: $pdf is not a PDF"
    pages=$(grep -ac '/Type /Page\b' "$pdf")
    if ((pages < min_pages || pages > max_pages)); then
        fail "$paper: the PDF has $pages pages, expected $min_pages to $max_pages"
    fi
    echo "$paper: $pages pages, $svgs plots, verdict, checks table, cautions and sign-off present"
done

# 3. A screenshot of the whole document, for a person to look at.
png="$out/report.png"
run_chromium screenshot --hide-scrollbars --window-size=900,3800 --screenshot="$png" "file://$out/report-a4.html" ||
    fail "the screenshot failed"
check_clean_load screenshot
[[ $(head -c 8 "$png" | od -An -tx1 | tr -d ' \n') == "89504e470d0a1a0a" ]] || fail "$png is not a PNG"
echo "screenshot: $png"
echo "PASS"
