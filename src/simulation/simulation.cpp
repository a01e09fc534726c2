// Run a model and record what the checks need. Peaks come from each step's
// interpolant: sampled at a few points, then refined by Brent's method, so a
// peak between output samples is not missed or flattened.
#include "plumb/simulation.hpp"

#include <array>
#include <boost/math/tools/minima.hpp>
#include <cmath>
#include <limits>

namespace plumb {

namespace {

// Sample intervals per step; with the step sizes the error control picks, a
// quantity has at most one extremum between neighbouring samples.
constexpr int samples_per_step = 4;

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
    std::vector<ExtremeTracker> whole_run, residual, lift_off;
    std::array<SnatchTracker, member_count> snatch{};
    std::vector<Quantity> recorded = recorded_quantities();
    std::vector<double> x, x0, breaks;
    std::array<double, samples_per_step + 1> times{};
    std::array<Observation, samples_per_step + 1> samples{};
    PerQuantity<SampleValues> values{};  // of the recorded quantities at the samples
    std::vector<SampleValues> zone_values;  // clearance to each keep-out zone at the samples
    Buffers() { add_trackers(whole_run, residual, lift_off); }
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
          recorded_(buffers.recorded), whole_run_(buffers.whole_run), residual_(buffers.residual),
          lift_off_(buffers.lift_off), snatch_(buffers.snatch), zone_values_(buffers.zone_values) {
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
        for (Quantity q : recorded_) {
            for (int j = 0; j <= samples_per_step; ++j) values_[q][j] = quantity_value(samples_[j], q);
        }
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
        if ((spec.records & ~unsigned{Record::series}) != 0) return values_[q][j];
        return quantity_value(samples_[j], q);
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
        const Peak candidate = step_extreme(values_[tracker.quantity], tracker.minimum, so_far,
                                            [&](double t) { return value_at(t, tracker.quantity); });
        if (!seen || tracker.score(candidate.value) > so_far) {
            record = candidate;
            seen = true;
        }
    }

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
            const Peak candidate = step_extreme(zone_values_[k], true, so_far, [&](double t) {
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
    // (larger is better; -infinity: none yet); value_at reads the quantity
    // from the interpolant.
    template <class ValueAt>
    Peak step_extreme(const SampleValues& values, bool minimum, double so_far, ValueAt value_at) const {
        auto score_at = [&](int j) { return minimum ? -values[j] : values[j]; };
        auto natural = [&](double score) { return minimum ? -score : score; };
        int best = 0;
        for (int j = 1; j <= samples_per_step; ++j) {
            if (score_at(j) > score_at(best)) best = j;
        }
        const double sampled = score_at(best);
        Peak candidate{natural(sampled), times_[best]};
        // A parabola through the best sample and its neighbours estimates how far
        // the true extremum between samples rises above it. Refine (Brent's method
        // on the interpolant) only where that could beat the record; the margin
        // covers the parabola's own error, which is of higher order.
        const int mid = std::clamp(best, 1, samples_per_step - 1);
        const double f0 = score_at(mid - 1), f1 = score_at(mid), f2 = score_at(mid + 1);
        const double curvature = f0 - 2 * f1 + f2;  // negative at a maximum
        double lo = times_[best], hi = times_[best];
        double estimate = sampled;
        if (curvature < 0) {
            const double vertex = 0.5 * (f0 - f2) / curvature;  // in samples from mid
            const double vertex_value = f1 - 0.125 * (f2 - f0) * (f2 - f0) / curvature;
            // The extremum lies between the best sample and a neighbour on the
            // side of the vertex (for a best sample at an end of the step, only
            // the part inside this step: the next step searches the rest).
            const double at = mid + vertex;
            if (at > best && best < samples_per_step) hi = times_[best + 1];
            if (at < best && best > 0) lo = times_[best - 1];
            if (hi > lo) estimate = std::max(sampled, vertex_value);
        }
        if (hi > lo && estimate + 0.5 * (estimate - sampled) + 1e-12 * std::fabs(so_far) >= so_far) {
            auto negative_score = [&](double t) { return minimum ? value_at(t) : -value_at(t); };
            const auto [t, f] = boost::math::tools::brent_find_minima(negative_score, lo, hi,
                                                                      std::numeric_limits<double>::digits / 2);
            if (-f > sampled) candidate = {natural(-f), t};
        }
        return candidate;
    }

    // First time in this step the watched level is reached, found by bisection
    // on the interpolant between the samples that bracket it.
    std::optional<double> crossing(const WatchLevel& w) {
        auto reached = [&](double value) { return w.below ? value <= w.level : value >= w.level; };
        for (int j = 0; j <= samples_per_step; ++j) {
            if (!reached(sample_value(j, w.quantity))) continue;
            if (j == 0) return times_[0];
            double before = times_[j - 1], after = times_[j];
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
    const std::vector<Quantity>& recorded_;
    std::vector<ExtremeTracker>& whole_run_;
    std::vector<ExtremeTracker>& residual_;
    std::vector<ExtremeTracker>& lift_off_;
    std::array<SnatchTracker, member_count>& snatch_;
    std::vector<SampleValues>& zone_values_;  // clearance to each keep-out zone at the samples
    const DenseStep* step_ = nullptr;
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
