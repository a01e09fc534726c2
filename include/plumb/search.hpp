// Searches over one scalar, written for callables that each run a full
// simulation: the largest scale that still passes, and the worst case over a
// parameter. See docs/advice.md.
#pragma once

#include <functional>
#include <string>

namespace plumb {

struct LargestPassing {
    bool any_passes = false;    // false: even the lower end fails; value is then meaningless
    bool whole_range_passes = false;  // the upper end passes: value is the upper end, not a limit
    double value = 0;           // the largest passing value found
    bool passes_at_value = false;      // re-run at value
    double probe_above = 0;            // value * (1 + margin)
    bool fails_above = false;          // re-run at probe_above
    // The problem behaved as a monotone one: passes at value and fails just
    // above (or the whole range passes). False means the answer cannot be
    // trusted as a limit: pass/fail changes more than once.
    bool verified = false;
    int evaluations = 0;
    std::string note;  // plain words for the report when not verified
};

// The largest s in [lo, hi] (0 < lo < hi) for which passes(s) holds, by
// bisection until the bracket is narrower than relative_tolerance times its
// lower end; then passes() is called again at the value found and at
// (1 + margin) times it, which must fail if passing is monotone in s.
// relative_tolerance must be below margin.
LargestPassing largest_passing(const std::function<bool(double)>& passes, double lo, double hi,
                               double relative_tolerance = 1e-3, double margin = 0.02);

struct WorstCase {
    double argument = 0;  // where badness is largest
    double badness = 0;   // its value there
    int evaluations = 0;
};

// The largest value of badness(x) on [lo, hi]: a scan of scan_points equally
// spaced points (ends included), then Brent's method (Boost.Math
// brent_find_minima) between the neighbours of the best scan point. A
// maximum narrower than the scan spacing can be missed: choose scan_points so
// that the spacing resolves the features looked for (for a swing, a few
// points per period).
WorstCase worst_case(const std::function<double(double)>& badness, double lo, double hi, int scan_points,
                     int bits = 40);

}  // namespace plumb
