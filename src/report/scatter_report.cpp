// The report of `plumb scatter --report` (answer_reports.hpp): the uncertain
// inputs, the failure probability of each check with its confidence
// intervals and the method named, and the distribution of each check's peak
// drawn as a histogram with the limit line.
#include "plumb/answer_reports.hpp"

#include <algorithm>
#include <cmath>
#include <optional>

#include "plumb/report_parts.hpp"
#include "plumb/text_layout.hpp"

namespace plumb {

using text::num;
using text::percent;

namespace {

const char* distribution_name(Distribution::Kind k) {
    switch (k) {
        case Distribution::Kind::uniform: return "uniform";
        case Distribution::Kind::normal: return "normal";
        case Distribution::Kind::lognormal: return "lognormal";
    }
    return "?";
}

std::string with_unit(double v, const std::string& unit) { return unit.empty() ? num(v) : num(v) + " " + unit; }

std::string parameters_of(const UncertainInput& in) {
    const Distribution& d = in.distribution;
    switch (d.kind) {
        case Distribution::Kind::uniform: return "from " + with_unit(d.a, in.unit) + " to " + with_unit(d.b, in.unit);
        case Distribution::Kind::normal:
            return "mean " + with_unit(d.a, in.unit) + ", standard deviation " + with_unit(d.b, in.unit);
        case Distribution::Kind::lognormal:
            return "ln x: mean " + num(d.a) + ", standard deviation " + num(d.b);
    }
    return "-";
}

std::string bounds_of(const UncertainInput& in) {
    const Distribution& d = in.distribution;
    if (d.kind == Distribution::Kind::uniform) return "-";
    const bool low = std::isfinite(d.lower), high = std::isfinite(d.upper);
    if (!low && !high) return "none";
    return (low ? with_unit(d.lower, in.unit) : std::string("-inf")) + " to " +
           (high ? with_unit(d.upper, in.unit) : std::string("+inf"));
}

ReportTable inputs_table(const ScatterResult& r) {
    ReportTable t;
    t.caption = "Uncertain inputs (the job file's scatter section)";
    t.columns = {{"key in the job file"}, {"distribution"}, {"parameters"}, {"truncated to"}};
    for (const UncertainInput& in : r.inputs) {
        t.add_row({in.key, distribution_name(in.distribution.kind), parameters_of(in), bounds_of(in)});
    }
    return t;
}

std::string interval_text(const Interval& i) { return num(i.lower) + " to " + num(i.upper); }

ReportTable probabilities_table(const ScatterResult& r) {
    ReportTable t;
    t.caption = "Probability of failing each check";
    t.columns = {{"check"}, {"failures / samples", ColumnAlign::right}, {"probability", ColumnAlign::right},
                 {"95 % interval, Wilson", ColumnAlign::right}, {"95 % interval, Clopper-Pearson", ColumnAlign::right}};
    for (const CheckFailure& f : r.checks) {
        t.add_row({f.name, std::to_string(f.failures) + " / " + std::to_string(f.samples), num(f.probability),
                   interval_text(f.wilson), interval_text(f.clopper_pearson)},
                  f.failures > 0 ? "fail" : "");
    }
    return t;
}

// Subset simulation's estimates (plumb scatter --subset), one row a check.
ReportTable small_probabilities_table(const ScatterResult& r) {
    ReportTable t;
    t.caption = "Probability of failing each check by subset simulation";
    t.columns = {{"check"}, {"probability", ColumnAlign::right}, {"coefficient of variation", ColumnAlign::right},
                 {"levels", ColumnAlign::right}, {"model runs", ColumnAlign::right}, {"remark"}};
    for (const SmallProbability& p : r.small) {
        const FailureEstimate& e = p.estimate;
        std::string remark = e.flat ? "not estimated: the margin does not change with the inputs"
                             : !e.reached_failure ? "stopped at the level limit: the probability is an upper estimate"
                                                  : "";
        if (p.refused > 0) remark += (remark.empty() ? "" : "; ") + std::to_string(p.refused) + " runs refused, counted as failing";
        t.add_row({p.check, e.flat ? "-" : num(e.probability), e.flat ? "-" : num(e.coefficient_of_variation),
                   std::to_string(e.levels), std::to_string(e.evaluations), remark});
    }
    return t;
}

ReportTable peaks_table(const ScatterResult& r, UnitSystem u) {
    ReportTable t;
    t.caption = "Peaks over the samples (percentiles by linear interpolation of the sorted sample)";
    t.columns = {{"quantity"}, {"mean", ColumnAlign::right}, {"5 %", ColumnAlign::right}, {"50 %", ColumnAlign::right},
                 {"95 %", ColumnAlign::right}, {"99 %", ColumnAlign::right}};
    for (const PeakSpread& p : r.peaks) {
        const QuantitySpec* spec = nullptr;
        for (const QuantitySpec& q : quantity_table()) {
            if (p.key == q.key) spec = &q;
        }
        const auto shown = [&](double si) {
            if (!std::isfinite(si)) return std::string("-");
            return spec ? text::qty(si, spec->dimension, u) : num(si);
        };
        t.add_row({spec ? spec->words : p.key, shown(p.mean), shown(p.p5), shown(p.p50), shown(p.p95), shown(p.p99)});
    }
    return t;
}

// The check's value as a share of its limit in each sample, in %, NaN where not made.
std::vector<double> utilisations(const ScatterResult& r, std::size_t k) {
    std::vector<double> v;
    for (const SweepCaseResult& c : r.cases.cases) {
        v.push_back(k < c.check_utilisations.size() ? 100.0 * c.check_utilisations[k] : NAN);
    }
    return v;
}

// A check that compares a peak of the quantity table (its key the check's
// name) with a limit that is the same in every sample (the peak over the
// utilisation does not change): the peaks in the output's units and that limit.
struct PeaksAgainstLimit {
    const QuantitySpec* spec = nullptr;
    double limit = 0;  // SI
    std::vector<double> peaks;  // SI, NaN where the check was not made
};

std::optional<PeaksAgainstLimit> peaks_against_limit(const ScatterResult& r, std::size_t k) {
    const std::vector<std::string>& keys = r.cases.peak_keys;
    const auto at = std::find(keys.begin(), keys.end(), r.cases.check_names[k]);
    if (at == keys.end()) return std::nullopt;
    const auto q = static_cast<std::size_t>(at - keys.begin());
    PeaksAgainstLimit out;
    for (const QuantitySpec& spec : quantity_table()) {
        if (spec.key == *at) out.spec = &spec;
    }
    std::optional<double> limit;
    for (const SweepCaseResult& c : r.cases.cases) {
        const double used = k < c.check_utilisations.size() ? c.check_utilisations[k] : NAN;
        const bool made = std::isfinite(used) && q < c.peaks.size();
        out.peaks.push_back(made ? c.peaks[q] : NAN);
        if (!made || used <= 0) continue;
        const double this_limit = c.peaks[q] / used;
        if (!limit) limit = this_limit;
        if (std::fabs(this_limit - *limit) > 1e-6 * std::fabs(*limit)) return std::nullopt;  // the limit varies
    }
    if (!limit || !out.spec) return std::nullopt;
    out.limit = *limit;
    return out;
}

// Of each check made in any sample: its peak against the limit line in the
// output's units where the limit is fixed, else its value as a share of its limit.
void histograms(HtmlDocument& doc, const ScatterResult& r, double caution_fraction, UnitSystem u) {
    for (std::size_t k = 0; k < r.cases.check_names.size(); ++k) {
        const std::string& name = r.cases.check_names[k];
        Histogram h;
        h.height = 150.0;
        if (const std::optional<PeaksAgainstLimit> p = peaks_against_limit(r, k)) {
            const Dimension d = p->spec->dimension;
            h.title = name + ": peak " + p->spec->words;
            h.quantity = std::string("peak ") + p->spec->words;
            h.unit = unit_of(d, u);
            for (const double v : p->peaks) h.values.push_back(std::isfinite(v) ? shown_value(v, d, u) : NAN);
            h.limits = {limit_line(p->limit, d, u, "limit"), limit_line(caution_fraction * p->limit, d, u, "CAUTION")};
        } else {
            h.title = name + ": value as a share of its limit";
            h.quantity = "utilisation";
            h.unit.assign(1, '%');  // assigned, not from a literal: GCC 12 warns falsely (-Wrestrict) on the literal
            h.values = utilisations(r, k);
            h.limits = {{100.0, "limit 100 %"}, {100.0 * caution_fraction, "CAUTION " + percent(caution_fraction)}};
        }
        const auto binned = static_cast<std::size_t>(
            std::count_if(h.values.begin(), h.values.end(), [](double v) { return std::isfinite(v); }));
        if (binned == 0) continue;  // a check no sample could make: its table row says so
        const std::size_t left_out = h.values.size() - binned;
        doc.figure(render_histogram(h),
                   std::to_string(binned) + " samples binned" +
                       (left_out > 0 ? "; " + std::to_string(left_out) + " samples where the check was not made or the sample could not be run are left out" : "") +
                       ". Right of the limit line the check fails.");
    }
}

}  // namespace

std::string format_scatter_report(const LiftAssessment& base, const ScatterResult& result, std::uint64_t seed,
                                  const ReportProvenance& provenance, UnitSystem units) {
    const Job& job = base.job;
    HtmlDocument doc = open_report("Lift scatter", "plumb scatter", job, provenance);
    doc.verdict_banner(cases_banner(base, result.cases, "samples"));

    doc.begin_section("Uncertain inputs");
    doc.table(inputs_table(result));
    doc.paragraph(std::to_string(result.cases.cases.size()) + " samples by Latin hypercube sampling from seed " +
                  std::to_string(seed) + " (the same seed gives the same samples on every machine). Every other "
                  "input is as the section Inputs lists it.");

    doc.begin_section("Failure probabilities");
    doc.paragraph("Method: Latin hypercube sampling, each sample a full simulation checked against the job's limits, "
                  "the failures counted as in plain Monte Carlo sampling. The 95 % confidence intervals are "
                  "Wilson's score interval and the Clopper-Pearson interval (never shorter than its confidence "
                  "requires). A sample that could not be run counts as a failure of every check.");
    doc.table(probabilities_table(result));
    if (result.input_errors > 0) {
        doc.paragraph(std::to_string(result.input_errors) + " samples were refused by the job-file checks.");
    }
    doc.paragraph("With no failure among n samples the probability is only known to lie below the upper end of "
                  "its interval (about 3.7 / n for Clopper-Pearson): plain sampling cannot show a smaller one.");
    if (!result.small.empty()) {
        doc.paragraph("Method: subset simulation (Au & Beck, Probabilistic Engineering Mechanics 16, 2001), " +
                      std::to_string(result.settings.level_samples) +
                      " samples a level, level probability 0.1, modified Metropolis chains in the standard normal "
                      "space of the inputs; the limit state is each check's unused share of its limit. The "
                      "coefficient of variation is Au & Beck's estimate, which tends to understate the scatter. " +
                      std::to_string(result.small_model_runs) + " distinct model runs in all.");
        doc.table(small_probabilities_table(result));
    }
    doc.table(checks_over_cases_table(result.cases, "samples"));

    doc.begin_section("Distributions of the peaks", SectionStart::new_page);
    histograms(doc, result, job.limits.caution_fraction, units);
    doc.table(peaks_table(result, units));

    return close_cases_report(doc, base, "sample", units);
}

}  // namespace plumb
