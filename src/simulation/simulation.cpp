// Run a model and record what the checks need. Peaks come from each step's
// interpolant: sampled at both ends and the midpoint, then refined by Brent's
// method wherever a bound on the quantity's curvature says an extremum between
// the samples could beat the record (docs/benchmark.md, "Peak finder"), so a
// peak between samples is not missed or flattened.
#include "plumb/simulation.hpp"

#include <array>
#include <cmath>
#include <limits>
#include <optional>
#include <utility>

#include "plumb/extremum_search.hpp"

namespace plumb {

namespace {

// Sample intervals per step: both ends and the midpoint (docs/benchmark.md,
// "Peak finder", gives the argument that no extremum is missed).
constexpr int samples_per_step = 2;

// The factor on the estimated third derivative of a quantity that bounds it
// over a step (see third_derivative_bound()).
constexpr double derivative_safety = 4;

// Refinement that could raise a record by less than this share of it is skipped:
// it changes no printed digit.
constexpr double negligible_gain = 1e-10;

// The bound on the interpolation error of the samples' parabola over a step
// of length h for a quantity whose third derivative is at most m3 (see
// search_span(): m3 h^3 / (72 sqrt 3), the constant written out so that no
// division is left for run time).
double interpolation_error(double m3, double h) { return m3 * h * h * h * (1 / 124.70765814495915); }

// No bound on a quantity's third derivative (no history yet): search_span()
// then searches every part of the step.
constexpr double no_bound = std::numeric_limits<double>::infinity();

// Where, between samples j and j+1 of a step of length h, a quantity could
// exceed `bar` (beyond a negligible gain): the part to search, in sample units
// (s = 0, 1, 2 at the step's samples v), or none. From the parabola P through
// the three samples and a bound m3 on the quantity's third derivative over the
// step: the error e = Q - P vanishes at the three samples, so (Rolle) e'
// vanishes once in each half and e'' once in the step, whence |e''| <= m3 h,
// |e'| <= m3 h^2 and |e| <= m3 |(t-a)(t-m)(t-b)| / 6 <= m3 h^3 / (72 sqrt 3).
// Where |P'| exceeds m3 h^2 with one sign over the part, Q is monotone there
// and its largest value is a sample, already counted; elsewhere Q <= P + |e|.
std::optional<std::pair<double, double>> search_span(const std::array<double, samples_per_step + 1>& v, int j,
                                                     double m3, double h, double bar) {
    const double bend = v[0] - 2 * v[1] + v[2];  // P(s) = v1 + g (s - 1) + bend/2 (s - 1)^2
    const double g = 0.5 * (v[2] - v[0]);
    const double slope_from = g + bend * (j - 1), slope_to = slope_from + bend;  // dP/ds at the part's ends
    const double slack = m3 * h * h * (h / 2);  // m3 h^2 per second, per sample unit (h/2 seconds)
    if ((slope_from > slack && slope_to > slack) || (slope_from < -slack && slope_to < -slack)) return std::nullopt;
    const double error = interpolation_error(m3, h);
    const double margin = v[1] + error - (bar + negligible_gain * std::fabs(bar));  // P + |e| - bar at s = 1
    double from = j, to = j + 1;
    if (bend < 0) {
        // P + |e| >= bar between the roots of bend/2 u^2 + g u + margin (u = s - 1).
        const double discriminant = g * g - 2 * bend * margin;
        if (!(discriminant >= 0)) return std::nullopt;
        const double root = std::sqrt(discriminant);
        from = std::max(from, 1 + (-g + root) / bend);
        to = std::min(to, 1 + (-g - root) / bend);
        if (!(from <= to)) return std::nullopt;
    } else if (!(std::max(v[j], v[j + 1]) + error > bar + negligible_gain * std::fabs(bar))) {
        return std::nullopt;  // P is convex: on the part it stays below its ends
    }
    return std::pair{from, to};
}

// Whether the quantity could exceed `bar` (beyond a negligible gain) anywhere
// in the step: a quick test before search_span() looks at each part. The
// parabola P through the samples rises at most |bend| / 2 above its middle
// sample inside the step (its vertex lies in the step only when |slope| <=
// |bend|, and then P(vertex) - v1 = slope^2 / (2 |bend|)), so P stays below
// max(v) + |bend| / 2, and the quantity below that plus search_span()'s |e|.
//
// step_reach() is that bound's distance beyond the samples, the same below them.
double step_reach(const std::array<double, samples_per_step + 1>& v, double m3, double h) {
    const double bend = v[0] - 2 * v[1] + v[2];
    return std::fabs(bend) / 2 + interpolation_error(m3, h);
}

bool step_could_exceed(const std::array<double, samples_per_step + 1>& v, double m3, double h, double bar) {
    const double highest = std::max({v[0], v[1], v[2]}) + step_reach(v, m3, h);
    return !(highest <= bar + negligible_gain * std::fabs(bar));
}

// The extreme (largest, or smallest when seeking the minimum) of one quantity.
struct ExtremeTracker {
    Quantity quantity;
    bool minimum = false;
    PerQuantity<Peak> SimulationResult::*record = nullptr;  // which record of the result it fills
    bool seen = false;

    double score(double value) const { return minimum ? -value : value; }
};

// The trackers the quantity table asks for: whole run (peaks and least values),
// residual swing and lift-off.
void add_trackers(std::vector<ExtremeTracker>& whole_run, std::vector<ExtremeTracker>& residual,
                  std::vector<ExtremeTracker>& lift_off) {
    for (const QuantitySpec& q : quantity_table()) {
        if (is_derived(q)) continue;  // derived from their base quantity's record
        if (has_record(q, Record::peak)) whole_run.push_back({q.id, false, &SimulationResult::peak});
        if (has_record(q, Record::least)) whole_run.push_back({q.id, true, &SimulationResult::least});
        if (has_record(q, Record::residual)) residual.push_back({q.id, false, &SimulationResult::residual});
        if (has_record(q, Record::lift_off)) lift_off.push_back({q.id, false, &SimulationResult::lift_off});
    }
}

// The tension each member's snatch load is read from.
constexpr std::array<Quantity, member_count> member_tension{Quantity::hoist_rope_tension, Quantity::rigging_tension};

// The peak tension of one member since it last came taut.
struct SnatchTracker {
    bool active = false;
    bool seen = false;
    Peak peak;
};

}  // namespace

// The simulated quantities with a record beyond the time series: their values
// at a step's samples are read once per step and shared by all their records.
std::vector<Quantity> recorded_quantities() {
    std::vector<Quantity> out;
    for (const QuantitySpec& q : quantity_table()) {
        if (!is_derived(q) && (q.records & ~unsigned{Record::series}) != 0) out.push_back(q.id);
    }
    return out;
}

using SampleValues = std::array<double, samples_per_step + 1>;

struct SimulationWorkspace::Buffers {
    // Every tracker the table asks for, and of them those of this run's
    // recorded quantities (SimulationRequest::recorded).
    std::vector<ExtremeTracker> all_whole_run, all_residual, all_lift_off;
    std::vector<ExtremeTracker> whole_run, residual, lift_off;
    std::array<SnatchTracker, member_count> snatch{};
    std::vector<Quantity> all_recorded = recorded_quantities();
    std::vector<Quantity> recorded;
    std::vector<double> x, x0, breaks;
    std::array<double, samples_per_step + 1> times{};
    std::array<Observation, samples_per_step + 1> samples{};
    PerQuantity<SampleValues> values{};  // of the recorded quantities at the samples
    std::vector<SampleValues> zone_values;  // clearance to each keep-out zone at the samples
    PerQuantity<double> third_bound{};     // the bound on |third derivative| over this step
    PerQuantity<double> highest{}, lowest{};  // bounds of the quantity over this step (step_reach())
    PerQuantity<double> curvature{};       // second derivative estimated on the previous step ...
    double curvature_time = 0;             // ... at this time (its midpoint; the same for every quantity)
    PerQuantity<double> third{};           // |third derivative| estimated between the previous two steps
    Buffers() { add_trackers(all_whole_run, all_residual, all_lift_off); }

    // The trackers and sample values of the quantities this run records
    // (after the first run, without allocating).
    void select(const PerQuantity<bool>& wanted) {
        auto keep = [&](const std::vector<ExtremeTracker>& all, std::vector<ExtremeTracker>& chosen) {
            chosen.clear();
            for (const ExtremeTracker& t : all) {
                if (wanted[t.quantity]) chosen.push_back(t);
            }
        };
        keep(all_whole_run, whole_run);
        keep(all_residual, residual);
        keep(all_lift_off, lift_off);
        recorded.clear();
        for (Quantity q : all_recorded) {
            if (wanted[q]) recorded.push_back(q);
        }
    }
};

SimulationWorkspace::SimulationWorkspace() : buffers_(std::make_unique<Buffers>()) {}
SimulationWorkspace::~SimulationWorkspace() = default;

namespace {

class Recorder final : public StepSink {
public:
    using Buffers = SimulationWorkspace::Buffers;

    Recorder(const SwingModel& model, const SimulationRequest& request, double residual_from,
             SimulationResult& result, Buffers& buffers)
        : model_(model), request_(request), residual_from_(residual_from), result_(result),
          x_(buffers.x), times_(buffers.times), samples_(buffers.samples), values_(buffers.values),
          third_bound_(buffers.third_bound), highest_(buffers.highest), lowest_(buffers.lowest),
          curvature_(buffers.curvature), curvature_time_(buffers.curvature_time),
          third_(buffers.third),
          recorded_(buffers.recorded), whole_run_(buffers.whole_run), residual_(buffers.residual),
          lift_off_(buffers.lift_off), snatch_(buffers.snatch), zone_values_(buffers.zone_values) {
        buffers.select(request.recorded);
        x_.resize(model.state_size());
        for (ExtremeTracker& t : whole_run_) t.seen = false;
        for (ExtremeTracker& t : residual_) t.seen = false;
        for (ExtremeTracker& t : lift_off_) t.seen = false;
        snatch_.fill(SnatchTracker{});
        result.first_crossing.assign(request.watch.size(), std::nullopt);
        const std::size_t zones = request.obstacles != nullptr ? request.obstacles->zones.size() : 0;
        ClosestApproach none;  // beaten by the first step
        none.at.clearance = std::numeric_limits<double>::infinity();
        result.closest_approach.assign(zones, none);
        zone_values_.resize(zones);
        for (auto& intervals : result.slack) intervals.clear();
        result.lift_off_time.reset();
        result.stopped_at.reset();
        result.started_on_ground = false;
        result.lift_off = {};
    }

    void on_step(const DenseStep& step) override {
        // The first sample is the last one of the previous step, unless a break
        // (where the support's acceleration may jump) lies between them.
        const Regime& regime = step.regime;
        const bool continues = step_seen_ && regime == regime_ && step.t_begin == times_.back();
        step_ = &step;
        regime_ = regime;
        if (continues) samples_[0] = samples_.back();
        for (int j = continues ? 1 : 0; j <= samples_per_step; ++j) {
            times_[j] = step.t_begin + (step.t_end - step.t_begin) * j / samples_per_step;
            samples_[j] = observe(times_[j]);
        }
        times_[0] = step.t_begin;
        h_ = step.t_end - step.t_begin;
        const double per_half_step_squared = 4 / (h_ * h_);
        const double per_interval = 1 / (times_[1] - curvature_time_);
        for (Quantity q : recorded_) {
            for (int j = 0; j <= samples_per_step; ++j) values_[q][j] = quantity_value(samples_[j], q);
            third_bound_[q] = third_derivative_bound(q, per_half_step_squared, per_interval, !step_seen_);
            const SampleValues& v = values_[q];
            const double reach = step_reach(v, third_bound_[q], h_);
            highest_[q] = std::max({v[0], v[1], v[2]}) + reach;
            lowest_[q] = std::min({v[0], v[1], v[2]}) - reach;
        }
        curvature_time_ = times_[1];
        step_seen_ = true;
        // While the load rests on the ground the ropes carry less than its
        // weight by design: least values and slack crossings count from lift-off.
        const bool on_ground = samples_[0].load_on_ground;
        for (ExtremeTracker& tracker : whole_run_) {
            if (!(tracker.minimum && on_ground)) update(tracker);
        }
        update_approaches();
        // The motion's end is a break, so a step lies wholly before or after it.
        if (step.t_begin >= residual_from_) {
            for (ExtremeTracker& tracker : residual_) update(tracker);
        }
        for (std::size_t i = 0; i < request_.watch.size(); ++i) {
            if (request_.watch[i].after_motion && step.t_begin < residual_from_) continue;
            if (request_.watch[i].below && on_ground) continue;
            if (!result_.first_crossing[i]) result_.first_crossing[i] = crossing(request_.watch[i]);
        }
        record_lift_off(step.t_begin);
        record_slack(step.t_begin);
        record_time_series();
    }

    void on_event(const EventRecord& event) override {
        if (event.action == EventAction::stop) result_.stopped_at = event.time;
    }

private:
    Observation observe(double t) {
        step_->state_at(t, x_);
        Observation o = model_.observe(t, regime_, x_);
        if (request_.obstacles != nullptr) o.clearance = least_clearance(o, *request_.obstacles);
        return o;
    }
    double value_at(double t, Quantity q) { return quantity_value(observe(t), q); }
    // A quantity at sample j of this step: read once per step if it has records.
    double sample_value(int j, Quantity q) const {
        const QuantitySpec& spec = quantity_spec(q);
        if ((spec.records & ~unsigned{Record::series}) != 0 && request_.recorded[q]) return values_[q][j];
        return quantity_value(samples_[j], q);
    }

    // The time at s sample intervals into this step.
    double time_at(double s) const { return s >= samples_per_step ? times_.back() : times_[0] + s * (h_ / samples_per_step); }

    // A bound on |third derivative| of q over this step (for search_span()):
    // derivative_safety times the larger of the two latest estimates from the
    // change of the sampled second derivative between neighbouring steps (the
    // second difference of a step's samples is Q'' at some point of that
    // step). The first step has none: it is searched whole.
    //
    // per_half_step_squared = 4 / h^2 and per_interval = 1 / (the time since
    // the previous step's midpoint) are the same for every quantity: worked
    // out once per step by the caller.
    double third_derivative_bound(Quantity q, double per_half_step_squared, double per_interval, bool first) {
        const SampleValues& v = values_[q];
        const double curvature = (v[0] - 2 * v[1] + v[2]) * per_half_step_squared;
        const double third = first ? std::numeric_limits<double>::infinity()
                                   : std::fabs(curvature - curvature_[q]) * per_interval;
        const double m3 = derivative_safety * std::max(third, third_[q]);
        third_[q] = first ? 0.0 : third;
        curvature_[q] = curvature;
        return std::isnan(m3) ? std::numeric_limits<double>::infinity() : m3;
    }

    // The largest score on the part `span` (in sample units) of this step:
    // Brent's method on the interpolant, started at the vertex of the
    // parabola through the samples' scores (extremum_search.hpp).
    template <class Score>
    Peak largest_score(const SampleValues& scores, std::pair<double, double> span, Score score) const {
        const double bend = scores[0] - 2 * scores[1] + scores[2];
        const double slope = 0.5 * (scores[2] - scores[0]);
        const double vertex = bend < 0 ? 1 - slope / bend : (span.first + span.second) / 2;
        std::array<KnownPoint, 3> known;
        for (int j = 0; j <= samples_per_step; ++j) known[j] = {times_[j], -scores[j]};
        const auto [t, f] = minimise_from([&](double at) { return -score(at); }, time_at(span.first),
                                          time_at(span.second), time_at(std::clamp(vertex, span.first, span.second)),
                                          known, std::numeric_limits<double>::digits / 2);
        return {-f, t};
    }

    void update(ExtremeTracker& tracker) {
        update_record(tracker, (result_.*tracker.record)[tracker.quantity], tracker.seen);
    }

    // The mode changes only at events, where the integrator restarts: a step
    // lies wholly in one mode, read from its first sample.
    void record_lift_off(double t_begin) {
        const bool on_ground = samples_[0].load_on_ground;
        if (!step_seen_before_ && on_ground) result_.started_on_ground = true;
        if (!result_.started_on_ground) return;
        if (!on_ground && !result_.lift_off_time) result_.lift_off_time = t_begin;
        if (result_.lift_off_time && t_begin >= *result_.lift_off_time + request_.lift_off_window) return;
        for (ExtremeTracker& tracker : lift_off_) update(tracker);
    }

    // Slack onset and re-tightening of each member, and the peak tension
    // after each re-tightening (the snatch load).
    void record_slack(double t_begin) {
        for (std::size_t m = 0; m < member_count; ++m) {
            std::vector<SlackInterval>& intervals = result_.slack[m];
            const bool slack = samples_[0].members[m].slack;
            const bool was_slack = !intervals.empty() && !intervals.back().end;
            SnatchTracker& snatch = snatch_[m];
            if (slack && !was_slack) {
                intervals.push_back({t_begin, std::nullopt, std::nullopt});
                snatch.active = false;
            } else if (!slack && was_slack) {
                intervals.back().end = t_begin;
                snatch = SnatchTracker{true, false, {}};
            }
            if (!snatch.active) continue;
            const ExtremeTracker peak{member_tension[m], false, nullptr, snatch.seen};
            update_record(peak, snatch.peak, snatch.seen);
            intervals.back().snatch = snatch.peak;
        }
        step_seen_before_ = true;
    }

    // Bring a record (largest, or least, of one quantity) up to this step.
    void update_record(const ExtremeTracker& tracker, Peak& record, bool& seen) {
        const double so_far = seen ? tracker.score(record.value) : -std::numeric_limits<double>::infinity();
        // Nothing in this step can beat the record: the common case, settled
        // by the step's bound alone (the same answer step_extreme() would give).
        if (seen && score_bound(tracker.quantity, tracker.minimum) <= so_far) return;
        const Peak candidate = step_extreme(values_[tracker.quantity], tracker.minimum, so_far,
                                            third_bound_[tracker.quantity],
                                            [&](double t) { return value_at(t, tracker.quantity); });
        if (!seen || tracker.score(candidate.value) > so_far) {
            record = candidate;
            seen = true;
        }
    }

    // The largest score of a recorded quantity anywhere in this step (its value,
    // or minus it when seeking the least), by the step's bound.
    double score_bound(Quantity q, bool minimum) const { return minimum ? -lowest_[q] : highest_[q]; }

    // The closest approach to each keep-out zone: the least clearance by the
    // same sampling and refinement as the table's least values, and where the
    // load and the zone are at that time.
    void update_approaches() {
        if (zone_values_.empty()) return;
        const Obstacles& obstacles = *request_.obstacles;
        for (int j = 0; j <= samples_per_step; ++j) {
            const LoadOutline load = load_outline(samples_[j], obstacles);
            for (std::size_t k = 0; k < zone_values_.size(); ++k)
                zone_values_[k][j] = approach(load, obstacles.zones[k]).clearance;
        }
        for (std::size_t k = 0; k < zone_values_.size(); ++k) {
            const KeepOutZone& zone = obstacles.zones[k];
            ClosestApproach& record = result_.closest_approach[k];
            const double so_far = -record.at.clearance;
            // No curvature history per zone: the bound is infinite and both
            // halves of the step are searched (only jobs with zones pay it).
            const Peak candidate = step_extreme(zone_values_[k], true, so_far, no_bound, [&](double t) {
                return approach(load_outline(observe(t), obstacles), zone).clearance;
            });
            if (-candidate.value > so_far) {
                record.time = candidate.time;
                record.at = approach(load_outline(observe(candidate.time), obstacles), zone);
            }
        }
    }

    // The extreme (largest, or smallest when minimum) of one quantity in this
    // step, from its values at the samples. so_far is the record's score
    // (larger is better; -infinity: none yet); m3 bounds the quantity's third
    // derivative over the step (search_span()); value_at reads the quantity
    // from the interpolant. Searches between two samples only where the bound
    // says an extremum there could beat both the record and the best sample.
    template <class ValueAt>
    Peak step_extreme(const SampleValues& values, bool minimum, double so_far, double m3, ValueAt value_at) const {
        SampleValues scores;
        for (int j = 0; j <= samples_per_step; ++j) scores[j] = minimum ? -values[j] : values[j];
        int best = 0;
        for (int j = 1; j <= samples_per_step; ++j) {
            if (scores[j] > scores[best]) best = j;
        }
        Peak candidate{scores[best], times_[best]};  // as a score until the end
        if (!step_could_exceed(scores, m3, h_, std::max(so_far, candidate.value))) {
            return {minimum ? -candidate.value : candidate.value, candidate.time};
        }
        for (int j = 0; j < samples_per_step; ++j) {
            const double bar = std::max(so_far, candidate.value);
            const auto span = search_span(scores, j, m3, h_, bar);
            if (!span) continue;
            const Peak found =
                largest_score(scores, *span, [&](double t) { return minimum ? -value_at(t) : value_at(t); });
            if (found.value > candidate.value) candidate = found;
        }
        return {minimum ? -candidate.value : candidate.value, candidate.time};
    }

    // First time in this step the watched level is reached: between the samples
    // that bracket it, or, where no sample reaches it, at an extremum between
    // two samples that the bound says might; then by bisection.
    std::optional<double> crossing(const WatchLevel& w) {
        // The level out of reach in this step (no sample, no crest between them).
        if (request_.recorded[w.quantity] && score_bound(w.quantity, w.below) < (w.below ? -w.level : w.level))
            return std::nullopt;
        auto reached = [&](double value) { return w.below ? value <= w.level : value >= w.level; };
        if (reached(sample_value(0, w.quantity))) return times_[0];
        const ExtremeTracker toward{w.quantity, w.below, nullptr};  // scores rise toward the level
        std::array<double, samples_per_step + 1> scores;
        for (int j = 0; j <= samples_per_step; ++j) scores[j] = toward.score(sample_value(j, w.quantity));
        const double m3 = request_.recorded[w.quantity] ? third_bound_[w.quantity] : no_bound;
        const bool some_sample_reaches = reached(sample_value(1, w.quantity)) || reached(sample_value(2, w.quantity));
        if (!some_sample_reaches && !step_could_exceed(scores, m3, h_, toward.score(w.level))) return std::nullopt;
        for (int j = 1; j <= samples_per_step; ++j) {
            double before = times_[j - 1], after = times_[j];
            if (!reached(sample_value(j, w.quantity))) {
                const auto span = search_span(scores, j - 1, m3, h_, toward.score(w.level));
                if (!span) continue;
                const Peak extremum = largest_score(
                    scores, *span, [&](double t) { return toward.score(value_at(t, w.quantity)); });
                if (!reached(toward.score(extremum.value))) continue;
                after = extremum.time;
            }
            for (int i = 0; i < 60 && after - before > 1e-12; ++i) {
                const double mid = (before + after) / 2;
                (reached(value_at(mid, w.quantity)) ? after : before) = mid;
            }
            return after;
        }
        return std::nullopt;
    }

    void record_time_series() {
        if (request_.output_step <= 0) return;
        for (;;) {
            const double t = static_cast<double>(next_output_) * request_.output_step;
            if (t > step_->t_end + 1e-9 * request_.output_step) break;
            result_.trace.push_back(observe(std::clamp(t, step_->t_begin, step_->t_end)));
            ++next_output_;
        }
    }

    const SwingModel& model_;
    const SimulationRequest& request_;
    double residual_from_;
    SimulationResult& result_;
    std::vector<double>& x_;
    std::array<double, samples_per_step + 1>& times_;
    std::array<Observation, samples_per_step + 1>& samples_;
    PerQuantity<SampleValues>& values_;
    PerQuantity<double>& third_bound_;
    PerQuantity<double>& highest_;
    PerQuantity<double>& lowest_;
    PerQuantity<double>& curvature_;
    double& curvature_time_;
    PerQuantity<double>& third_;
    const std::vector<Quantity>& recorded_;
    std::vector<ExtremeTracker>& whole_run_;
    std::vector<ExtremeTracker>& residual_;
    std::vector<ExtremeTracker>& lift_off_;
    std::array<SnatchTracker, member_count>& snatch_;
    std::vector<SampleValues>& zone_values_;  // clearance to each keep-out zone at the samples
    const DenseStep* step_ = nullptr;
    double h_ = 0;  // this step's length
    bool step_seen_ = false;
    bool step_seen_before_ = false;  // a step before this one was recorded
    Regime regime_;  // of the current step
    long next_output_ = 0;
};

// Integration intervals: the support path's, cut at the end time.
void integration_breaks(const SupportTrajectory& path, double end_time, std::vector<double>& breaks) {
    breaks.clear();
    for (double start : path.breaks()) {
        if (start < end_time) breaks.push_back(start);
    }
    breaks.push_back(end_time);
}

}  // namespace

double slack_duration(const std::vector<SlackInterval>& intervals, double end_time) {
    double total = 0;
    for (const SlackInterval& i : intervals) total += i.end.value_or(end_time) - i.start;
    return total;
}

const SimulationResult& run_simulation(const SwingModel& model, const SimulationRequest& request,
                                       const IntegrateFunction& integrator, SimulationWorkspace& workspace) {
    SimulationWorkspace::Buffers& buffers = *workspace.buffers_;
    SimulationResult& result = workspace.result_;
    result.peak = {};
    result.least = {};
    result.residual = {};
    result.trace.clear();
    result.stats = {};
    result.residual_from = std::min(model.trajectory().end_of_motion(), request.end_time);
    Recorder recorder(model, request, result.residual_from, result, buffers);
    integration_breaks(model.trajectory(), request.end_time, buffers.breaks);
    const std::vector<double> initial = model.initial_state();
    buffers.x0.assign(initial.begin(), initial.end());
    result.stats = integrator(model, buffers.x0, buffers.breaks, request.integrator, recorder);
    return result;
}

const SimulationResult& simulate(const SwingModel& model, const SimulationRequest& request,
                                 SimulationWorkspace& workspace) {
    return run_simulation(model, request, integrate, workspace);
}

SimulationResult simulate(const SwingModel& model, const SimulationRequest& request) {
    return simulate(model, request, integrate);
}

SimulationResult simulate(const SwingModel& model, const SimulationRequest& request,
                          const IntegrateFunction& integrator) {
    SimulationWorkspace workspace;
    run_simulation(model, request, integrator, workspace);
    return workspace.release_result();
}

}  // namespace plumb
