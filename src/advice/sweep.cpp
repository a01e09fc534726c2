// Sweeps. A case is the job file with the varied keys set to their values as
// text ("0.125 m/s^2"), read exactly as if written in the file: the job-file
// parser reads each distinct value of each key once (with the other keys as in
// the file) and the case's Job is the parsed base Job with those numbers set
// (JobCases). A case the parser might judge differently as a whole (a value it
// refused, a key outside the table of plain numbers, a rule across fields the
// combination could break) is parsed whole from its text instead, as every
// case once was. Cases run on a pool of threads, one simulation workspace per
// thread, and land in a vector by index: the order and the numbers do not
// depend on the thread count.
#include "plumb/sweep.hpp"

#include <cmath>
#include <limits>

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cstdio>
#include <filesystem>
#include <map>
#include <mutex>
#include <sstream>
#include <thread>

#include <yaml-cpp/yaml.h>

#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"
#include "plumb/report.hpp"
#include "plumb/simulation.hpp"
#include "input/input_bounds.hpp"
#include "input/input_file.hpp"
#include "input/move_duration.hpp"

namespace plumb {
namespace {

// Split "12.5 m/s^2" or "12.5m/s^2" into the number and the unit text.
std::pair<double, std::string> number_and_unit(const std::string& text, const std::string& spec) {
    const char* begin = text.c_str();
    char* end = nullptr;
    const double v = std::strtod(begin, &end);
    if (end == begin || !std::isfinite(v)) throw UsageError("--vary " + spec + ": '" + text + "' is not a number");
    std::string unit(end);
    unit.erase(0, unit.find_first_not_of(' '));
    unit.erase(unit.find_last_not_of(' ') + 1);
    return {v, unit};
}

std::vector<std::string> split(const std::string& text, char separator) {
    std::vector<std::string> parts;
    std::string part;
    std::istringstream in(text);
    while (std::getline(in, part, separator)) parts.push_back(part);
    if (!text.empty() && text.back() == separator) parts.emplace_back();
    return parts;
}

// The node at a key path such as motion.moves[1].acceleration (1-based
// indices, as the parser's messages count moves).
YAML::Node node_at(YAML::Node root, const std::string& key) {
    YAML::Node node = root;
    for (const std::string& part : split(key, '.')) {
        const std::size_t bracket = part.find('[');
        const std::string name = part.substr(0, bracket);
        if (name.empty()) throw UsageError("--vary: bad key '" + key + "'");
        if (!node.IsMap()) throw UsageError("--vary: '" + key + "' does not name a field of the job file");
        node.reset(node[name]);
        if (bracket != std::string::npos) {
            const int index = std::atoi(part.c_str() + bracket + 1);
            if (!node.IsSequence() || index < 1 || static_cast<std::size_t>(index) > node.size()) {
                throw UsageError("--vary: '" + key + "': no item [" + part.substr(bracket + 1) + " in the job file");
            }
            node.reset(node[static_cast<std::size_t>(index - 1)]);
        }
    }
    if (node.IsDefined() && !node.IsScalar()) throw UsageError("--vary: '" + key + "' is a section, not a number");
    return node;
}

std::vector<int> grid_position(std::size_t index, const std::vector<VariedField>& fields) {
    std::vector<int> position(fields.size());
    for (std::size_t f = fields.size(); f-- > 0;) {
        position[f] = static_cast<int>(index % fields[f].count);
        index /= fields[f].count;
    }
    return position;
}

// The quantities with a peak that the job's outputs list.
std::vector<const QuantitySpec*> peak_quantities(const Job& job) {
    std::vector<const QuantitySpec*> list;
    for (const QuantitySpec& q : quantity_table())
        if (has_record(q, Record::peak) && reported_for(q, job)) list.push_back(&q);
    return list;
}

}  // namespace

namespace {

// The number a varied key names in a Job, for the keys a case may set in the
// parsed job (plain numbers that no other field is read from), and the field
// the parser fills from it when the file leaves that one out (a move's
// deceleration defaults to its acceleration). Other keys: none.
struct JobNumber {
    double* value = nullptr;
    double* follower = nullptr;
};

double* given(std::optional<double>& v) { return v ? &*v : nullptr; }

JobNumber move_number(Move& m, const std::string& name) {
    if (name == "distance") return {&m.distance};
    if (name == "top_speed") return {&m.top_speed};
    if (name == "acceleration") return {&m.acceleration, &m.deceleration};
    if (name == "deceleration") return {&m.deceleration};
    if (name == "pause_before") return {&m.pause_before};
    if (name == "jerk") return {given(m.jerk)};
    return {};
}

JobNumber job_number(Job& job, const std::string& key) {
    const std::vector<std::string> parts = split(key, '.');
    if (parts.size() == 3 && parts[0] == "motion") {
        const std::size_t bracket = parts[1].find('[');
        const std::string list = parts[1].substr(0, bracket);
        std::vector<Move>* moves = list == "moves"         ? &job.motion.moves
                                   : list == "y_moves"     ? &job.motion.y_moves
                                   : list == "hoist_moves" ? &job.motion.hoist_moves
                                                           : nullptr;
        if (moves == nullptr || bracket == std::string::npos) return {};
        const long index = std::atol(parts[1].c_str() + bracket + 1);
        if (index < 1 || static_cast<std::size_t>(index) > moves->size()) return {};
        return move_number((*moves)[static_cast<std::size_t>(index - 1)], parts[2]);
    }
    if (parts.size() != 2) return {};
    const std::string& section = parts[0];
    const std::string& name = parts[1];
    const std::map<std::string, double*> plain = {
        {"motion.emergency_deceleration", given(job.motion.emergency_deceleration)},
        {"hoist.rope_length", &job.hoist.rope_length},
        {"hoist.rated_load", &job.hoist.rated_load},
        {"hoist.rope_wll", given(job.hoist.rope_wll)},
        {"hoist.rope_minimum_breaking_load", given(job.hoist.rope_minimum_breaking_load)},
        {"hoist.sheave_efficiency", &job.hoist.sheave_efficiency},
        {"hook_block.mass", &job.hook_block.mass},
        {"rigging.length", &job.rigging.length},
        {"rigging.leg_wll", given(job.rigging.leg_wll)},
        {"load.mass", &job.load.mass},
        {"load.radius_of_gyration", &job.load.radius_of_gyration},
        {"load.initial_angle", &job.load.initial_angle},
        {"load.initial_rate", &job.load.initial_rate},
        {"environment.gravity", &job.environment.gravity},
        {"environment.wind_speed", &job.environment.wind_speed},
        {"environment.wind_direction", &job.environment.wind_direction},
        {"environment.gust_peak", &job.environment.gust_peak},
        {"environment.gust_start", &job.environment.gust_start},
        {"environment.gust_duration", &job.environment.gust_duration},
        {"analysis.duration_after", given(job.analysis.duration_after)},
    };
    const auto at = plain.find(section + "." + name);
    return at == plain.end() ? JobNumber{} : JobNumber{at->second};
}

// Whether a job built from separately read values might break one of the
// parser's rules across fields (docs/job-file.md): then the case is parsed whole.
bool may_break_a_rule_across_fields(const Job& job) {
    const Hoist& h = job.hoist;
    if (h.rope_wll && h.rope_minimum_breaking_load && !(*h.rope_minimum_breaking_load > *h.rope_wll)) return true;
    if (!(job.hook_block.mass + job.load.mass <= input::max_total_mass)) return true;
    for (const std::vector<Move>* moves : {&job.motion.moves, &job.motion.y_moves, &job.motion.hoist_moves}) {
        if (!(input::moves_duration_bound(*moves) <= input::max_motion_duration)) return true;
    }
    return !job.motion.hoist_moves.empty();  // the rope length along the hoist moves: the parser's to judge
}

// The job text with the keys set to the values (job-file text).
std::string job_text_with(const YAML::Node& original, const std::vector<std::string>& keys,
                          const std::vector<std::string>& values) {
    YAML::Node root = YAML::Clone(original);
    for (std::size_t f = 0; f < keys.size(); ++f) node_at(root, keys[f]) = values[f];
    YAML::Emitter out;
    out << root;
    return out.c_str();
}

}  // namespace

// How the cases of one sweep are read: the base job parsed once and every
// distinct value of every key read once by the parser.
struct JobCases::Plan {
    std::string job_path, folder;
    YAML::Node original;
    std::vector<std::string> keys;
    std::vector<std::size_t> indices;
    std::function<std::vector<std::string>(std::size_t)> values_of;
    std::optional<Job> base;  // none: every case is parsed whole
    // Per key, the SI number the parser read for each value text; none where
    // it refused the value (that case is parsed whole, for its message).
    std::vector<std::map<std::string, std::optional<double>>> numbers;
    // Per key, the follower's number for each value text, where it differs from the base's.
    std::vector<std::map<std::string, std::optional<double>>> followers;
};

JobCases::JobCases(const std::string& job_path, std::vector<std::string> keys, std::vector<std::size_t> indices,
                   std::function<std::vector<std::string>(std::size_t)> values_of, bool parse_every_case)
    : plan_(std::make_unique<Plan>()) {
    Plan& p = *plan_;
    const std::string parent = std::filesystem::path(job_path).parent_path().string();
    p.job_path = job_path;
    p.folder = parent.empty() ? "." : parent;
    p.original = YAML::Load(input::read_input_file(job_path, 1 << 20, "job file"));
    p.keys = std::move(keys);
    p.indices = std::move(indices);
    p.values_of = std::move(values_of);
    if (parse_every_case || p.indices.empty()) return;
    // Distinct values per key; a key with a value per case (sampled inputs)
    // gains nothing from reading its values apart.
    std::vector<std::map<std::string, std::optional<double>>> numbers(p.keys.size()), followers(p.keys.size());
    for (std::size_t index : p.indices) {
        const std::vector<std::string> values = p.values_of(index);
        for (std::size_t f = 0; f < p.keys.size(); ++f) numbers[f].emplace(values[f], std::nullopt);
    }
    for (const auto& n : numbers)
        if (2 * n.size() > p.indices.size()) return;
    // The base: the file's own values, and the first case's for keys the file leaves out.
    std::vector<std::string> base_values = p.values_of(p.indices.front());
    for (std::size_t f = 0; f < p.keys.size(); ++f) {
        const YAML::Node node = node_at(YAML::Clone(p.original), p.keys[f]);
        if (node.IsDefined() && !node.IsNull()) base_values[f] = node.Scalar();
    }
    try {
        p.base = parse_job(job_text_with(p.original, p.keys, base_values), p.job_path, p.folder);
    } catch (const InputError&) {
        return;  // parse every case whole
    }
    Job& base = *p.base;
    for (std::size_t f = 0; f < p.keys.size(); ++f) {
        const JobNumber in_base = job_number(base, p.keys[f]);
        if (in_base.value == nullptr) {
            p.base.reset();  // a key outside the table: every case is parsed whole
            return;
        }
        for (auto& [text, number] : numbers[f]) {
            std::vector<std::string> values = base_values;
            values[f] = text;
            try {
                Job alone = parse_job(job_text_with(p.original, p.keys, values), p.job_path, p.folder);
                const JobNumber read = job_number(alone, p.keys[f]);
                if (read.value == nullptr) continue;
                number = *read.value;
                if (read.follower != nullptr && *read.follower != *in_base.follower)
                    followers[f].emplace(text, *read.follower);
            } catch (const InputError&) {
            }
        }
    }
    p.numbers = std::move(numbers);
    p.followers = std::move(followers);
}

JobCases::~JobCases() = default;

std::size_t JobCases::size() const { return plan_->indices.size(); }

bool JobCases::parses_every_case() const { return !plan_->base; }

SweepCaseResult JobCases::run(std::size_t k, SimulationWorkspace& workspace, SweepResult& shared,
                              std::mutex& names_mutex) const {
    const Plan& p = *plan_;
    SweepCaseResult r;
    r.index = p.indices[k];
    r.values = p.values_of(r.index);
    try {
        const Job job = case_job(r.values);
        const LiftAssessment a = assess_lift(job, false, workspace);
        r.overall = a.prediction.valid_until() ? "FAIL" : verdict_word(a.overall);
        const std::vector<const QuantitySpec*> peaks = peak_quantities(job);
        for (const QuantitySpec* q : peaks) r.peaks.push_back(a.prediction.peak(q->id).value);
        std::vector<std::string>& check_names = shared.check_names;
        std::lock_guard lock(names_mutex);
        if (check_names.empty()) {
            for (const CheckResult& c : a.checks) check_names.push_back(c.name);
            for (const QuantitySpec* q : peaks) shared.peak_keys.push_back(q->key);
            shared.assumptions = a.prediction.model.assumptions;
        }
        for (const std::string& name : check_names) {
            const auto c = std::find_if(a.checks.begin(), a.checks.end(), [&](const CheckResult& x) { return x.name == name; });
            r.check_verdicts.push_back(c == a.checks.end() ? "NOT CHECKED" : verdict_word(c->verdict));
            const bool made = c != a.checks.end() && c->verdict != Verdict::not_checked;
            r.check_utilisations.push_back(made ? c->utilisation : std::numeric_limits<double>::quiet_NaN());
        }
    } catch (const InputError& e) {
        r.overall = "INPUT ERROR";
        r.error = e.what();
    } catch (const NumericalError& e) {
        r.overall = "NUMERICAL ERROR";
        r.error = e.what();
    }
    return r;
}

Job JobCases::case_job(const std::vector<std::string>& values) const {
    const Plan& p = *plan_;
    if (p.base) {
        Job job = *p.base;
        bool whole = false;
        // Followers first, so that a varied key wins over a field filled from another.
        for (std::size_t f = 0; f < p.keys.size() && !whole; ++f) {
            const auto follower = p.followers[f].find(values[f]);
            if (follower != p.followers[f].end()) *job_number(job, p.keys[f]).follower = *follower->second;
        }
        for (std::size_t f = 0; f < p.keys.size() && !whole; ++f) {
            const auto number = p.numbers[f].find(values[f]);
            whole = number == p.numbers[f].end() || !number->second;
            if (!whole) *job_number(job, p.keys[f]).value = *number->second;
        }
        if (!whole && !may_break_a_rule_across_fields(job)) return job;
    }
    return parse_job(job_text_with(p.original, p.keys, values), p.job_path, p.folder);
}

void run_job_case_queue(const JobCases& cases, std::atomic<std::size_t>& next, std::atomic<std::size_t>& done,
                        SweepResult& result, std::mutex& names_mutex) {
    SimulationWorkspace workspace;
    for (std::size_t k = next++; k < cases.size(); k = next++) {
        result.cases[k] = cases.run(k, workspace, result, names_mutex);
        ++done;
    }
}

namespace {

std::string csv_field(const std::string& text) {
    if (text.find_first_of(",\"\n") == std::string::npos) return text;
    std::string quoted = "\"";
    for (char c : text) quoted += (c == '"') ? std::string("\"\"") : std::string(1, c == '\n' ? ' ' : c);
    return quoted + "\"";
}

}  // namespace

std::string job_number_text(double v) {
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.12g", v);
    return buffer;
}


std::string VariedField::text(int i) const {
    const double v = count == 1 ? from : from + (to - from) * i / (count - 1);
    return unit.empty() ? job_number_text(v) : job_number_text(v) + " " + unit;
}

VariedField parse_varied_field(const std::string& spec) {
    const std::size_t equals = spec.find('=');
    if (equals == std::string::npos) throw UsageError("--vary " + spec + ": expected KEY=FROM:TO:COUNT");
    VariedField f;
    f.key = spec.substr(0, equals);
    const std::vector<std::string> parts = split(spec.substr(equals + 1), ':');
    if (parts.size() != 3) throw UsageError("--vary " + spec + ": expected KEY=FROM:TO:COUNT");
    auto [from, unit] = number_and_unit(parts[0], spec);
    auto [to, to_unit] = number_and_unit(parts[1], spec);
    if (unit.empty()) unit = to_unit;
    if (!to_unit.empty() && to_unit != unit)
        throw UsageError("--vary " + spec + ": FROM and TO must have the same unit ('" + unit + "', '" + to_unit + "')");
    f.from = from;
    f.to = to;
    f.unit = unit;
    char* end = nullptr;
    const long count = std::strtol(parts[2].c_str(), &end, 10);
    if (end == parts[2].c_str() || *end != '\0' || count < 1 || count > 100000)
        throw UsageError("--vary " + spec + ": COUNT must be a whole number from 1 to 100000");
    f.count = static_cast<int>(count);
    return f;
}

SweepShard parse_shard(const std::string& spec) {
    SweepShard s;
    char slash = 0;
    std::istringstream in(spec);
    if (!(in >> s.index >> slash >> s.count) || slash != '/' || !in.eof() || s.count < 1 || s.index < 1 ||
        s.index > s.count)
        throw UsageError("--shard " + spec + ": expected I/N with 1 <= I <= N");
    return s;
}

SweepResult run_job_cases(const std::string& job_path, const std::vector<std::string>& keys,
                          const std::vector<std::size_t>& indices,
                          const std::function<std::vector<std::string>(std::size_t)>& values_of, int threads,
                          const std::function<void(std::size_t, std::size_t)>& progress) {
    const JobCases cases(job_path, keys, indices, values_of);
    SweepResult result;
    std::mutex names_mutex;
    result.cases.resize(indices.size());
    std::atomic<std::size_t> next{0}, done{0};
    std::vector<std::exception_ptr> failures(static_cast<std::size_t>(std::max(1, threads)));
    auto worker = [&](std::size_t id) {
        try {
            run_job_case_queue(cases, next, done, result, names_mutex);
        } catch (...) {
            failures[id] = std::current_exception();
            next = indices.size();
        }
    };
    // The first case alone, so that the check names are known before any other case reads them.
    if (!indices.empty()) {
        SimulationWorkspace workspace;
        result.cases[0] = cases.run(0, workspace, result, names_mutex);
        next = 1;
        done = 1;
    }
    std::vector<std::thread> pool;
    for (int t = 1; t < threads; ++t) pool.emplace_back(worker, static_cast<std::size_t>(t));
    std::thread watcher;
    std::atomic<bool> finished{false};
    if (progress) {
        watcher = std::thread([&] {
            while (!finished) {
                progress(done, indices.size());
                std::this_thread::sleep_for(std::chrono::milliseconds(200));
            }
        });
    }
    worker(0);
    for (std::thread& t : pool) t.join();
    finished = true;
    if (watcher.joinable()) watcher.join();
    for (const std::exception_ptr& f : failures)
        if (f) std::rethrow_exception(f);
    return result;
}

SweepResult run_sweep(const std::string& job_path, const std::vector<VariedField>& fields, SweepShard shard,
                      int threads, const std::function<void(std::size_t, std::size_t)>& progress) {
    std::size_t total = 1;
    for (const VariedField& f : fields) {
        total *= static_cast<std::size_t>(f.count);
        if (total > 10'000'000) throw UsageError("--vary: more than 10,000,000 cases");
    }
    // Shard I of N takes every N-th case: shards of similar cost.
    std::vector<std::size_t> mine;
    for (std::size_t i = static_cast<std::size_t>(shard.index - 1); i < total; i += shard.count) mine.push_back(i);
    std::vector<std::string> keys;
    for (const VariedField& f : fields) keys.push_back(f.key);
    auto values_of = [&](std::size_t index) {
        const std::vector<int> position = grid_position(index, fields);
        std::vector<std::string> values;
        for (std::size_t f = 0; f < fields.size(); ++f) values.push_back(fields[f].text(position[f]));
        return values;
    };
    SweepResult result = run_job_cases(job_path, keys, mine, values_of, threads, progress);
    result.total_cases = total;
    return result;
}

std::string format_sweep_csv(const std::vector<VariedField>& fields, const SweepResult& result) {
    std::ostringstream out;
    out << "# plumb sweep: " << result.total_cases << " cases; peaks in SI units (m, rad, N); utilisation = share of the limit used\n";
    for (const std::string& c : lift_cautions()) out << "# " << c << "\n";
    for (const std::string& a : result.assumptions) out << "# Model assumption: " << a << "\n";
    out << "case";
    for (const VariedField& f : fields) out << "," << csv_field(f.key);
    out << ",overall";
    for (const std::string& key : result.peak_keys) out << ",peak_" << key;
    for (const std::string& c : result.check_names) out << "," << c << "_verdict," << c << "_utilisation";
    out << ",error\n";
    for (const SweepCaseResult& r : result.cases) {
        out << r.index;
        for (const std::string& v : r.values) out << "," << csv_field(v);
        out << "," << r.overall;
        char buffer[64];
        for (std::size_t q = 0; q < result.peak_keys.size(); ++q) {
            out << ",";
            if (q < r.peaks.size()) {
                std::snprintf(buffer, sizeof buffer, "%.9g", r.peaks[q]);
                out << buffer;
            }
        }
        for (std::size_t c = 0; c < result.check_names.size(); ++c) {
            if (c < r.check_verdicts.size()) {
                // A check not made has no utilisation: an empty cell.
                buffer[0] = '\0';
                if (std::isfinite(r.check_utilisations[c]))
                    std::snprintf(buffer, sizeof buffer, "%.6g", r.check_utilisations[c]);
                out << "," << r.check_verdicts[c] << "," << buffer;
            } else {
                out << ",,";
            }
        }
        out << "," << csv_field(r.error) << "\n";
    }
    return out.str();
}

std::string merge_sweep_csvs(const std::vector<std::string>& shard_texts) {
    std::string header;
    std::map<std::size_t, std::string> rows;
    for (const std::string& text : shard_texts) {
        std::istringstream in(text);
        std::string line, this_header;
        while (std::getline(in, line)) {
            if (line.empty()) continue;
            if (line[0] == '#' || line.rfind("case,", 0) == 0) {
                this_header += line + "\n";
                continue;
            }
            const std::size_t index = std::stoull(line.substr(0, line.find(',')));
            if (!rows.emplace(index, line + "\n").second)
                throw UsageError("merge: case " + std::to_string(index) + " appears in two shards");
        }
        if (header.empty()) header = this_header;
        else if (this_header != header) throw UsageError("merge: the shards come from different sweeps (their headers differ)");
    }
    // The header's first line states the number of cases: every one must be there.
    const std::size_t from = header.find(": ") + 2;
    const std::size_t total = std::stoull(header.substr(from));
    if (rows.size() != total || (!rows.empty() && rows.rbegin()->first != total - 1))
        throw UsageError("merge: " + std::to_string(rows.size()) + " of " + std::to_string(total) +
                         " cases found; a shard is missing");
    std::string merged = header;
    for (const auto& [index, row] : rows) merged += row;
    return merged;
}

std::string format_sweep_map(const std::vector<VariedField>& fields, const SweepResult& result) {
    if (fields.size() != 2 || result.cases.size() != result.total_cases) return "";
    std::ostringstream out;
    out << "Verdicts: rows " << fields[0].key << ", columns " << fields[1].key
        << " (. pass, c caution, X fail, ? input or numerical error)\n";
    out << "  columns from " << fields[1].text(0) << " to " << fields[1].text(fields[1].count - 1) << "\n";
    for (int i = 0; i < fields[0].count; ++i) {
        char label[64];
        std::snprintf(label, sizeof label, "%14s  ", fields[0].text(i).c_str());
        out << label;
        for (int j = 0; j < fields[1].count; ++j) {
            const std::string& v = result.cases[static_cast<std::size_t>(i * fields[1].count + j)].overall;
            out << (v == "PASS" ? '.' : v == "CAUTION" ? 'c' : v == "FAIL" ? 'X' : '?');
        }
        out << "\n";
    }
    return out.str();
}

}  // namespace plumb
