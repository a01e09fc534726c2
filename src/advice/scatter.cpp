// Scatter: Latin hypercube samples of the uncertain inputs, each sample a case
// of the general runner (the value written into the job text and read by the
// job-file parser), then percentiles of every peak and the probability of
// failing every check with 95 % intervals.
#include "plumb/scatter.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
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

std::vector<UncertainInput> read_uncertain_inputs(const std::string& job_path) {
    const YAML::Node root = YAML::Load(input::read_input_file(job_path, 1 << 20, "job file"));
    const YAML::Node section = root["scatter"];
    if (!section || !section.IsMap() || section.size() == 0)
        throw UsageError("the job file has no scatter section naming uncertain inputs (see docs/scatter.md)");
    std::vector<UncertainInput> inputs;
    for (const auto& item : section) {
        UncertainInput in;
        in.key = item.first.as<std::string>();
        const YAML::Node spec = item.second;
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

double sample_percentile(std::vector<double> values, double p) {
    if (values.empty()) return std::nan("");
    std::sort(values.begin(), values.end());
    const double h = (static_cast<double>(values.size()) - 1) * p;
    const std::size_t lo = static_cast<std::size_t>(std::floor(h));
    const std::size_t hi = std::min(lo + 1, values.size() - 1);
    return values[lo] + (h - static_cast<double>(lo)) * (values[hi] - values[lo]);
}

ScatterResult run_scatter(const std::string& job_path, std::size_t samples, std::uint64_t seed, int threads) {
    if (samples < 2 || samples > 10'000'000) throw UsageError("--samples must be from 2 to 10,000,000");
    ScatterResult r;
    r.inputs = read_uncertain_inputs(job_path);
    // Drawn once, in one fixed order, before any case runs: the same numbers for any thread count.
    RandomStream stream(seed);
    const std::vector<std::vector<double>> u = latin_hypercube(samples, r.inputs.size(), stream);
    std::vector<std::string> keys;
    for (const UncertainInput& in : r.inputs) keys.push_back(in.key);
    std::vector<std::size_t> indices(samples);
    for (std::size_t i = 0; i < samples; ++i) indices[i] = i;
    auto values_of = [&](std::size_t i) {
        std::vector<std::string> values;
        for (std::size_t d = 0; d < r.inputs.size(); ++d) {
            const UncertainInput& in = r.inputs[d];
            const std::string v = job_number_text(in.distribution.quantile(u[i][d]));
            values.push_back(in.unit.empty() ? v : v + " " + in.unit);
        }
        return values;
    };
    r.cases = run_job_cases(job_path, keys, indices, values_of, threads, {});
    r.cases.total_cases = samples;

    const std::vector<std::string> peak_keys = sweep_peak_keys();
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
    out << "  Plain sampling cannot show a probability much below 3.7 / samples; subset simulation is not yet offered.\n";
    out << "\nCautions\n";
    for (const std::string& c : lift_cautions()) out << "  - " << c << "\n";
    out << "\nModel assumptions\n";
    for (const std::string& a : r.cases.assumptions) out << "  - " << a << "\n";
    return out.str();
}

}  // namespace plumb
