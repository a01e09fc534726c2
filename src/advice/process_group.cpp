// Cases spread over processes and gathered back in case order. The results
// travel as bytes (doubles by their bit patterns), so a gathered result is
// the one a single process would have computed, bit for bit.
#include "plumb/process_group.hpp"

#include <algorithm>
#include <cstdint>
#include <cstring>
#include <new>

#include "plumb/errors.hpp"

namespace plumb {
namespace {

class SingleProcess final : public ProcessGroup {
public:
    int rank() const override { return 0; }
    int size() const override { return 1; }
    std::vector<std::string> all_gather(const std::string& mine) const override { return {mine}; }
    std::vector<std::string> gather_to_first(const std::string& mine) const override { return {mine}; }
};

class Writer {
public:
    void number(std::uint64_t v) { bytes_.append(reinterpret_cast<const char*>(&v), sizeof v); }
    void real(double v) {
        std::uint64_t bits;
        std::memcpy(&bits, &v, sizeof bits);
        number(bits);
    }
    void text(const std::string& s) {
        number(s.size());
        bytes_ += s;
    }
    void texts(const std::vector<std::string>& list) {
        number(list.size());
        for (const std::string& s : list) text(s);
    }
    void reals(const std::vector<double>& list) {
        number(list.size());
        for (double v : list) real(v);
    }
    std::string take() { return std::move(bytes_); }

private:
    std::string bytes_;
};

class Reader {
public:
    explicit Reader(const std::string& bytes) : bytes_(bytes) {}
    std::uint64_t number() {
        if (bytes_.size() - at_ < sizeof(std::uint64_t)) throw std::runtime_error("a gathered result is cut short");
        std::uint64_t v;
        std::memcpy(&v, bytes_.data() + at_, sizeof v);
        at_ += sizeof v;
        return v;
    }
    double real() {
        const std::uint64_t bits = number();
        double v;
        std::memcpy(&v, &bits, sizeof v);
        return v;
    }
    std::string text() {
        const std::uint64_t n = number();
        if (bytes_.size() - at_ < n) throw std::runtime_error("a gathered result is cut short");
        std::string s = bytes_.substr(at_, n);
        at_ += n;
        return s;
    }
    std::vector<std::string> texts() {
        std::vector<std::string> list(number());
        for (std::string& s : list) s = text();
        return list;
    }
    std::vector<double> reals() {
        std::vector<double> list(number());
        for (double& v : list) v = real();
        return list;
    }

private:
    const std::string& bytes_;
    std::size_t at_ = 0;
};

// One process's outcome of its work: an exit status and a message (status 0: it ran).
std::string encode_outcome(int status, const std::string& message) {
    Writer w;
    w.number(static_cast<std::uint64_t>(status));
    w.text(message);
    return w.take();
}

// Run the work, catching what it throws as an outcome every process can read.
std::string run_caught(const std::function<SweepResult()>& work, SweepResult& result) {
    try {
        result = work();
        return encode_outcome(0, "");
    } catch (const Error& e) {
        return encode_outcome(e.exit_code(), e.what());
    } catch (const std::bad_alloc&) {
        return encode_outcome(static_cast<int>(ExitStatus::numerical_failure), "internal error: out of memory");
    } catch (const std::exception& e) {
        return encode_outcome(static_cast<int>(ExitStatus::numerical_failure),
                              std::string("internal error: ") + e.what());
    }
}

// Every process learns every outcome and raises the first failure, so that all end with one status.
void raise_first_failure(const ProcessGroup& group, const std::string& outcome) {
    const std::vector<std::string> outcomes = group.all_gather(outcome);
    for (std::size_t r = 0; r < outcomes.size(); ++r) {
        Reader in(outcomes[r]);
        const int status = static_cast<int>(in.number());
        if (status == 0) continue;
        const std::string where = group.size() > 1 ? " (on process " + std::to_string(r) + " of the MPI run)" : "";
        throw Error(in.text() + where, static_cast<ExitStatus>(status));
    }
}

SweepResult merge(const std::vector<std::string>& parts) {
    SweepResult all;
    for (const std::string& bytes : parts) {
        SweepResult part = decode_sweep_result(bytes);
        if (all.check_names.empty()) {
            all.check_names = std::move(part.check_names);
            all.peak_keys = std::move(part.peak_keys);
            all.assumptions = std::move(part.assumptions);
        } else if (!part.check_names.empty() && part.check_names != all.check_names) {
            throw std::runtime_error("processes of one run list different checks");
        }
        all.total_cases = part.total_cases;
        std::move(part.cases.begin(), part.cases.end(), std::back_inserter(all.cases));
    }
    std::stable_sort(all.cases.begin(), all.cases.end(),
                     [](const SweepCaseResult& a, const SweepCaseResult& b) { return a.index < b.index; });
    return all;
}

SweepResult gather(const ProcessGroup& group, const std::function<SweepResult()>& work, bool everywhere) {
    if (group.size() == 1) return work();  // errors as they are, nothing to agree on
    SweepResult mine;
    raise_first_failure(group, run_caught(work, mine));
    const std::string bytes = encode_sweep_result(mine);
    return merge(everywhere ? group.all_gather(bytes) : group.gather_to_first(bytes));
}

}  // namespace

const ProcessGroup& single_process() {
    static const SingleProcess one;
    return one;
}

std::vector<std::size_t> share_of(const ProcessGroup& group, std::size_t count) {
    std::vector<std::size_t> indices;
    for (std::size_t i = static_cast<std::size_t>(group.rank()); i < count; i += static_cast<std::size_t>(group.size()))
        indices.push_back(i);
    return indices;
}

std::string encode_sweep_result(const SweepResult& r) {
    Writer w;
    w.texts(r.check_names);
    w.texts(r.peak_keys);
    w.texts(r.assumptions);
    w.number(r.total_cases);
    w.number(r.cases.size());
    for (const SweepCaseResult& c : r.cases) {
        w.number(c.index);
        w.texts(c.values);
        w.text(c.overall);
        w.reals(c.peaks);
        w.texts(c.check_verdicts);
        w.reals(c.check_utilisations);
        w.text(c.error);
    }
    return w.take();
}

SweepResult decode_sweep_result(const std::string& bytes) {
    Reader in(bytes);
    SweepResult r;
    r.check_names = in.texts();
    r.peak_keys = in.texts();
    r.assumptions = in.texts();
    r.total_cases = in.number();
    r.cases.resize(in.number());
    for (SweepCaseResult& c : r.cases) {
        c.index = in.number();
        c.values = in.texts();
        c.overall = in.text();
        c.peaks = in.reals();
        c.check_verdicts = in.texts();
        c.check_utilisations = in.reals();
        c.error = in.text();
    }
    return r;
}

SweepResult gather_cases(const ProcessGroup& group, const std::function<SweepResult()>& work) {
    return gather(group, work, false);
}

SweepResult gather_cases_everywhere(const ProcessGroup& group, const std::function<SweepResult()>& work) {
    return gather(group, work, true);
}

}  // namespace plumb
