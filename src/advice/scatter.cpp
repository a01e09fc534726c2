// Scatter: Latin hypercube samples of the uncertain inputs, each sample a case
// of the general runner (the value written into the job text and read by the
// job-file parser), then percentiles of every peak and the probability of
// failing every check with 95 % intervals.
#include "plumb/scatter.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>
#include <sstream>

#include <yaml-cpp/yaml.h>

#include "plumb/errors.hpp"
#include "plumb/report.hpp"
#include "input/input_file.hpp"

namespace plumb {
namespace {

// A number with its unit, e.g. "14 t"; the unit must match the others of the input.
double read_number(const YAML::Node& spec, const char* name, const std::string& key, std::string& unit) {
    if (!spec[name]) throw UsageError("scatter." + key + ": missing '" + std::string(name) + "'");
    const std::string text = spec[name].as<std::string>();
    const VariedField f = parse_varied_field(key + "=" + text + ":" + text + ":1");
    if (unit.empty()) unit = f.unit;
    else if (f.unit != unit) throw UsageError("scatter." + key + ": every number needs the same unit ('" + unit + "')");
    return f.from;
}

}  // namespace

namespace {

std::vector<UncertainInput> read_scatter_section(const std::string& job_path);

}  // namespace

// The scatter section as data. A section of the wrong shape (a list, a bare
// value where a distribution's map belongs) is an input error located in the
// job file, never a parser library's message.
std::vector<UncertainInput> read_uncertain_inputs(const std::string& job_path) {
    try {
        return read_scatter_section(job_path);
    } catch (const YAML::Exception& e) {
        SourceLocation where;
        where.file = job_path;
        where.line = e.mark.is_null() ? 0 : e.mark.line + 1;
        where.column = e.mark.is_null() ? 0 : e.mark.column + 1;
        where.key_path = "scatter";
        throw InputError(where, "the scatter section must map each uncertain key to {distribution: ..., "
                                "and its numbers with units} (docs/scatter.md); " + e.msg);
    }
}

namespace {

std::vector<UncertainInput> read_scatter_section(const std::string& job_path) {
    const YAML::Node root = YAML::Load(input::read_input_file(job_path, 1 << 20, "job file"));
    const YAML::Node section = root["scatter"];
    if (!section || !section.IsMap() || section.size() == 0)
        throw UsageError("the job file has no scatter section naming uncertain inputs (see docs/scatter.md)");
    std::vector<UncertainInput> inputs;
    for (const auto& item : section) {
        UncertainInput in;
        in.key = item.first.as<std::string>();
        const YAML::Node spec = item.second;
        if (!spec.IsMap())
            throw YAML::RepresentationException(spec.Mark(), "the value of '" + in.key + "' is not a map");
        const std::string kind = spec["distribution"] ? spec["distribution"].as<std::string>() : "";
        const bool has_min = static_cast<bool>(spec["min"]), has_max = static_cast<bool>(spec["max"]);
        if (kind == "uniform") {
            const double lo = read_number(spec, "min", in.key, in.unit), hi = read_number(spec, "max", in.key, in.unit);
            if (!(lo < hi)) throw UsageError("scatter." + in.key + ": min must be below max");
            in.distribution = Distribution::uniform(lo, hi);
        } else if (kind == "normal" || kind == "lognormal") {
            const double mean = read_number(spec, "mean", in.key, in.unit), sd = read_number(spec, "sd", in.key, in.unit);
            if (!(sd > 0)) throw UsageError("scatter." + in.key + ": sd must be positive");
            in.distribution = kind == "normal" ? Distribution::normal(mean, sd) : Distribution::lognormal(mean, sd);
            if (has_min) in.distribution.lower = read_number(spec, "min", in.key, in.unit);
            if (has_max) in.distribution.upper = read_number(spec, "max", in.key, in.unit);
            if (kind == "normal" && (has_min || has_max))
                in.distribution = Distribution::truncated_normal(mean, sd, in.distribution.lower, in.distribution.upper);
        } else {
            throw UsageError("scatter." + in.key + ": distribution must be uniform, normal or lognormal");
        }
        inputs.push_back(std::move(in));
    }
    return inputs;
}

}  // namespace

double sample_percentile(std::vector<double> values, double p) {
    if (values.empty()) return std::nan("");
    std::sort(values.begin(), values.end());
    const double h = (static_cast<double>(values.size()) - 1) * p;
    const std::size_t lo = static_cast<std::size_t>(std::floor(h));
    const std::size_t hi = std::min(lo + 1, values.size() - 1);
    return values[lo] + (h - static_cast<double>(lo)) * (values[hi] - values[lo]);
}

namespace {

std::string value_text(const UncertainInput& in, double v) {
    const std::string text = job_number_text(v);
    return in.unit.empty() ? text : text + " " + in.unit;
}

// Every model run of the subset simulations, by its point in standard normal
// space: the first level is the same for every check (the same seed), so its
// runs are made once and shared; a batch's new points run spread over the
// processes and come back to every process.
class SubsetRuns {
public:
    SubsetRuns(const std::string& job_path, const std::vector<UncertainInput>& inputs, int threads,
               const ProcessGroup& group)
        : job_path_(job_path), inputs_(inputs), threads_(threads), group_(group) {
        for (const UncertainInput& in : inputs) keys_.push_back(in.key);
    }

    std::vector<const SweepCaseResult*> run(const std::vector<std::vector<double>>& points) {
        std::vector<std::vector<double>> fresh;
        for (const std::vector<double>& z : points)
            if (!runs_.count(z) && std::find(fresh.begin(), fresh.end(), z) == fresh.end()) fresh.push_back(z);
        if (!fresh.empty()) {
            auto values_of = [&](std::size_t i) {
                std::vector<std::string> values;
                for (std::size_t d = 0; d < inputs_.size(); ++d)
                    values.push_back(value_text(inputs_[d], inputs_[d].distribution.from_standard_normal(fresh[i][d])));
                return values;
            };
            const SweepResult done = gather_cases_everywhere(group_, [&] {
                return run_job_cases(job_path_, keys_, share_of(group_, fresh.size()), values_of, threads_, {});
            });
            for (const SweepCaseResult& c : done.cases) runs_.emplace(fresh[c.index], c);
        }
        std::vector<const SweepCaseResult*> found;
        for (const std::vector<double>& z : points) found.push_back(&runs_.at(z));
        return found;
    }
    std::size_t count() const { return runs_.size(); }

private:
    std::string job_path_;
    const std::vector<UncertainInput>& inputs_;
    std::vector<std::string> keys_;
    int threads_;
    const ProcessGroup& group_;
    std::map<std::vector<double>, SweepCaseResult> runs_;
};

// The checks to estimate: those named, or every check made in the Latin hypercube runs.
std::vector<std::size_t> checks_to_estimate(const SweepResult& cases, const std::vector<std::string>& named) {
    std::vector<std::size_t> chosen;
    const std::vector<std::string>& names = cases.check_names;
    if (names.empty()) throw InputError("subset simulation: no sample could be run, so no check is known");
    std::string known;
    for (const std::string& n : names) known += (known.empty() ? "" : ", ") + n;
    for (const std::string& n : named) {
        const auto at = std::find(names.begin(), names.end(), n);
        if (at == names.end()) throw UsageError("--subset-checks: no check '" + n + "'; the checks are " + known);
        chosen.push_back(static_cast<std::size_t>(at - names.begin()));
    }
    if (!named.empty()) return chosen;
    for (std::size_t k = 0; k < names.size(); ++k) {
        const bool made = std::any_of(cases.cases.begin(), cases.cases.end(), [&](const SweepCaseResult& c) {
            return k < c.check_utilisations.size() && std::isfinite(c.check_utilisations[k]);
        });
        if (made) chosen.push_back(k);
    }
    return chosen;
}

std::vector<SmallProbability> small_probabilities(const std::string& job_path, const ScatterResult& r,
                                                  const ProcessGroup& group, std::size_t& model_runs) {
    const ScatterSettings& s = r.settings;
    SubsetSettings subset;
    subset.samples_per_level = s.level_samples;
    SubsetRuns runs(job_path, r.inputs, s.threads, group);
    std::vector<SmallProbability> found;
    for (std::size_t k : checks_to_estimate(r.cases, s.subset_checks)) {
        SmallProbability p;
        p.check = r.cases.check_names[k];
        // The check's unused share of its limit; a run that was refused, could not
        // finish or made no such check counts as failing: nothing unchecked passes.
        const BatchLimitState margin = [&](const std::vector<std::vector<double>>& points) {
            std::vector<double> g;
            for (const SweepCaseResult* c : runs.run(points)) {
                const bool made = k < c->check_utilisations.size() && std::isfinite(c->check_utilisations[k]);
                if (!made) ++p.refused;
                g.push_back(made ? 1 - c->check_utilisations[k] : -1.0);
            }
            return g;
        };
        p.estimate = subset_simulation(margin, r.inputs.size(), subset, s.seed);
        found.push_back(std::move(p));
    }
    model_runs = runs.count();
    return found;
}

}  // namespace

ScatterResult run_scatter(const std::string& job_path, std::size_t samples, std::uint64_t seed, int threads) {
    ScatterSettings s;
    s.samples = samples;
    s.seed = seed;
    s.threads = threads;
    return run_scatter(job_path, s);
}

ScatterResult run_scatter(const std::string& job_path, const ScatterSettings& settings, const ProcessGroup& group) {
    const std::size_t samples = settings.samples;
    if (samples < 2 || samples > 10'000'000) throw UsageError("--samples must be from 2 to 10,000,000");
    if (settings.subset && (settings.level_samples < 10 || settings.level_samples % 10 != 0 ||
                            settings.level_samples > 1'000'000))
        throw UsageError("--subset-level-samples must be a multiple of 10 from 10 to 1,000,000");
    ScatterResult r;
    r.settings = settings;
    r.inputs = read_uncertain_inputs(job_path);
    // Drawn once, in one fixed order, before any case runs: the same numbers for any thread or process count.
    RandomStream stream(settings.seed);
    const std::vector<std::vector<double>> u = latin_hypercube(samples, r.inputs.size(), stream);
    std::vector<std::string> keys;
    for (const UncertainInput& in : r.inputs) keys.push_back(in.key);
    auto values_of = [&](std::size_t i) {
        std::vector<std::string> values;
        for (std::size_t d = 0; d < r.inputs.size(); ++d)
            values.push_back(value_text(r.inputs[d], r.inputs[d].distribution.quantile(u[i][d])));
        return values;
    };
    // Each process its share; every process needs the check names when subset simulation follows.
    auto work = [&] {
        SweepResult mine = run_job_cases(job_path, keys, share_of(group, samples), values_of, settings.threads, {});
        mine.total_cases = samples;
        return mine;
    };
    r.cases = settings.subset ? gather_cases_everywhere(group, work) : gather_cases(group, work);
    if (settings.subset) r.small = small_probabilities(job_path, r, group, r.small_model_runs);
    if (!group.is_first()) return r;

    const std::vector<std::string>& peak_keys = r.cases.peak_keys;
    for (std::size_t q = 0; q < peak_keys.size(); ++q) {
        std::vector<double> v;
        double sum = 0;
        for (const SweepCaseResult& c : r.cases.cases) {
            if (q < c.peaks.size()) {
                v.push_back(c.peaks[q]);
                sum += c.peaks[q];
            }
        }
        PeakSpread s{peak_keys[q], v.empty() ? std::nan("") : sum / static_cast<double>(v.size()),
                     sample_percentile(v, 0.05), sample_percentile(v, 0.50), sample_percentile(v, 0.95),
                     sample_percentile(v, 0.99)};
        r.peaks.push_back(s);
    }
    for (const SweepCaseResult& c : r.cases.cases)
        if (c.check_verdicts.empty()) ++r.input_errors;
    for (std::size_t k = 0; k < r.cases.check_names.size(); ++k) {
        CheckFailure f;
        f.name = r.cases.check_names[k];
        f.samples = samples;
        for (const SweepCaseResult& c : r.cases.cases) {
            // A sample that could not be run is counted as failing: nothing unchecked reads as a pass.
            if (c.check_verdicts.empty() || c.check_verdicts[k] == "FAIL") ++f.failures;
        }
        f.probability = static_cast<double>(f.failures) / static_cast<double>(samples);
        f.wilson = wilson_interval(f.failures, samples);
        f.clopper_pearson = clopper_pearson_interval(f.failures, samples);
        r.checks.push_back(f);
    }
    return r;
}

namespace {

std::string format_small_probabilities(const ScatterResult& r) {
    std::ostringstream out;
    char line[256];
    out << "\nProbability of failing each check (method: subset simulation, Au & Beck 2001: " << r.settings.level_samples
        << " samples a level, level probability p0 = 0.1,\nmodified Metropolis chains in the standard normal space of the "
           "inputs, seed "
        << r.settings.seed << ")\n";
    std::snprintf(line, sizeof line, "  %-20s %-12s %-8s %-7s %s\n", "check", "P", "CoV", "levels", "model runs");
    out << line;
    for (const SmallProbability& p : r.small) {
        const FailureEstimate& e = p.estimate;
        if (e.flat) {
            std::snprintf(line, sizeof line, "  %-20s not estimated: its margin does not change with the inputs near %s (%zu runs)\n",
                          p.check.c_str(), e.levels == 1 ? "the samples" : "the failure region", e.evaluations);
            out << line;
            continue;
        }
        std::snprintf(line, sizeof line, "  %-20s %-12.4g %-8.3f %-7d %zu%s\n", p.check.c_str(), e.probability,
                      e.coefficient_of_variation, e.levels, e.evaluations,
                      e.reached_failure ? "" : "  (stopped at the level limit before reaching failure: P is an upper estimate)");
        out << line;
        if (p.refused > 0) out << "    " << p.refused << " runs refused or not finished, counted as failing\n";
    }
    out << "  CoV: the estimate's coefficient of variation by Au & Beck (with the correlation along the chains,\n"
           "  the levels taken as independent, which tends to understate it). Model runs: of this check's\n"
           "  estimate, the first level shared by all checks; "
        << r.small_model_runs << " distinct model runs in all.\n";
    return out.str();
}

}  // namespace

std::string format_scatter(const ScatterResult& r) {
    std::ostringstream out;
    char line[256];
    out << "plumb scatter: " << r.cases.cases.size() << " Latin hypercube samples of\n";
    for (const UncertainInput& in : r.inputs) out << "  " << in.key << (in.unit.empty() ? "" : " [" + in.unit + "]") << "\n";
    out << "\nPeaks (SI units: m, rad, N); percentiles by linear interpolation of the sorted sample\n";
    std::snprintf(line, sizeof line, "  %-26s %12s %12s %12s %12s %12s\n", "peak", "mean", "5 %", "50 %", "95 %", "99 %");
    out << line;
    for (const PeakSpread& p : r.peaks) {
        std::snprintf(line, sizeof line, "  %-26s %12.5g %12.5g %12.5g %12.5g %12.5g\n", p.key.c_str(), p.mean, p.p5,
                      p.p50, p.p95, p.p99);
        out << line;
    }
    out << "\nProbability of failing each check (method: Latin hypercube sampling, counted as plain sampling;\n"
           "95 % intervals by Wilson's score method and by Clopper-Pearson; a sample that could not be run counts as a failure)\n";
    for (const CheckFailure& f : r.checks) {
        std::snprintf(line, sizeof line, "  %-20s %6zu / %-6zu P = %-10.4g Wilson %.4g-%.4g  Clopper-Pearson %.4g-%.4g\n",
                      f.name.c_str(), f.failures, f.samples, f.probability, f.wilson.lower, f.wilson.upper,
                      f.clopper_pearson.lower, f.clopper_pearson.upper);
        out << line;
    }
    if (r.input_errors > 0) out << "  " << r.input_errors << " samples were refused by the job-file checks\n";
    out << "  Plain sampling cannot show a probability much below 3.7 / samples"
        << (r.settings.subset ? ": see subset simulation below.\n" : "; --subset estimates smaller ones.\n");
    if (r.settings.subset) out << format_small_probabilities(r);
    out << "\nCautions\n";
    for (const std::string& c : lift_cautions()) out << "  - " << c << "\n";
    out << "\nModel assumptions\n";
    for (const std::string& a : r.cases.assumptions) out << "  - " << a << "\n";
    return out.str();
}

}  // namespace plumb
