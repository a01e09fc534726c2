// Sweeps. Each case is the job file's YAML with the varied keys set to their
// values as text ("0.125 m/s^2") and parsed again by the job-file parser, so
// a varied value is read, unit-checked and validated exactly as if written in
// the file. Cases run on a pool of threads and land in a vector by index: the
// order and the numbers do not depend on the thread count.
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
#include "input/input_file.hpp"

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

std::vector<const QuantitySpec*> peak_quantities() {
    std::vector<const QuantitySpec*> list;
    for (const QuantitySpec& q : quantity_table())
        if (has_record(q, Record::peak)) list.push_back(&q);
    return list;
}

}  // namespace

SweepCaseResult run_job_case(const std::string& job_text, const std::string& job_path, const std::string& folder,
                             const std::vector<std::string>& keys, std::vector<std::string> values,
                             std::size_t index, SweepResult& shared, std::mutex& names_mutex) {
    std::vector<std::string>& check_names = shared.check_names;
    SweepCaseResult r;
    r.index = index;
    r.values = std::move(values);
    YAML::Node root = YAML::Load(job_text);
    for (std::size_t f = 0; f < keys.size(); ++f) node_at(root, keys[f]) = r.values[f];
    YAML::Emitter out;
    out << root;
    try {
        const LiftAssessment a = assess_lift(parse_job(out.c_str(), job_path, folder), false);
        r.overall = a.prediction.valid_until() ? "FAIL" : verdict_word(a.overall);
        for (const QuantitySpec* q : peak_quantities()) r.peaks.push_back(a.prediction.peak(q->id).value);
        std::lock_guard lock(names_mutex);
        if (check_names.empty()) {
            for (const CheckResult& c : a.checks) check_names.push_back(c.name);
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

std::vector<std::string> sweep_peak_keys() {
    std::vector<std::string> keys;
    for (const QuantitySpec* q : peak_quantities()) keys.push_back(q->key);
    return keys;
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
    const std::string job_text = input::read_input_file(job_path, 1 << 20, "job file");
    const std::string parent = std::filesystem::path(job_path).parent_path().string();
    const std::string folder = parent.empty() ? "." : parent;
    SweepResult result;
    std::mutex names_mutex;
    result.cases.resize(indices.size());
    std::atomic<std::size_t> next{0}, done{0};
    auto one = [&](std::size_t k) {
        result.cases[k] = run_job_case(job_text, job_path, folder, keys, values_of(indices[k]), indices[k], result,
                                       names_mutex);
    };
    std::vector<std::exception_ptr> failures(static_cast<std::size_t>(std::max(1, threads)));
    auto worker = [&](std::size_t id) {
        try {
            for (std::size_t k = next++; k < indices.size(); k = next++) {
                one(k);
                ++done;
            }
        } catch (...) {
            failures[id] = std::current_exception();
            next = indices.size();
        }
    };
    // The first case alone, so that the check names are known before any other case reads them.
    if (!indices.empty()) {
        one(0);
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
    for (const QuantitySpec* q : peak_quantities()) out << ",peak_" << q->key;
    for (const std::string& c : result.check_names) out << "," << c << "_verdict," << c << "_utilisation";
    out << ",error\n";
    for (const SweepCaseResult& r : result.cases) {
        out << r.index;
        for (const std::string& v : r.values) out << "," << csv_field(v);
        out << "," << r.overall;
        char buffer[64];
        for (std::size_t q = 0; q < peak_quantities().size(); ++q) {
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
