// The elastic model behind the common SwingModel interface: it owns the
// support path (which ElasticLiftModel only references), starts hanging at
// rest, and turns the model's own observation into the common Observation
// (suspension point, hook block, load, members with tensions).
#include "elastic_swing_model.hpp"

#include <cstdio>
#include <optional>
#include <string>

#include "plumb/elastic_model.hpp"
#include "plumb/errors.hpp"

namespace plumb {
namespace {

RopeData hoist_rope_data(const RopeElasticity& r) {
    RopeData d;
    d.nominal_diameter = r.diameter;
    d.fill_factor = r.fill_factor;
    d.modulus = r.modulus;
    d.axial_stiffness = r.axial_stiffness;
    return d;
}

ElasticParameters parameters_from_job(const Job& job) {
    if (!job.rope) throw InputError("the elastic model (analysis.model: elastic) needs the section 'rope'");
    const RopeElasticity& rope = *job.rope;
    ElasticParameters p;
    p.hook_block_mass = job.hook_block.mass;
    p.load_mass = job.load.mass;
    p.gravity = job.environment.gravity;
    p.hoist_rope = hoist_rope_data(rope);
    p.parts_of_line = job.hoist.parts_of_line;
    p.lead_length = rope.lead_length;
    p.rigging_rope.axial_stiffness =
        rope.rigging_axial_stiffness > 0 ? rope.rigging_axial_stiffness : p.hoist_rope.ea();
    p.rigging_legs = job.rigging.legs_bearing;
    p.rigging_length = job.rigging.length;
    p.damping_ratio = rope.damping_ratio;
    p.hook_block_drag = DragData::default_for_mass(job.hook_block.mass);
    p.load_drag = DragData::default_for_mass(job.load.mass);
    const Environment& env = job.environment;
    p.wind.steady_speed = env.wind_speed;
    p.wind.direction = env.wind_direction;
    p.wind.gust_peak = env.gust_peak;
    p.wind.gust_start = env.gust_start;
    p.wind.gust_duration = env.gust_duration;
    return p;
}

Member member_from(const MemberObservation& m, const Eigen::Vector3d& velocity) {
    Member member = Member::along(m.vector, velocity);
    member.tension = m.tension;
    member.resultant = m.tension;  // a rope pulls only along itself
    return member;
}

// With a lift-off, the ground lies where the load rests at the start.
ElasticParameters with_ground(ElasticParameters p, const SupportPath& path, const std::optional<LiftOff>& lift_off) {
    if (!lift_off) return p;
    const std::vector<double> x0 = ElasticLiftModel(p, path).resting_on_ground(lift_off->slack_length);
    p.ground = GroundData{true, x0[5]};
    return p;
}

class ElasticSwingModel final : public SwingModel {
public:
    ElasticSwingModel(const ElasticParameters& p, SupportPath path, std::optional<LiftOff> lift_off)
        : path_(std::move(path)), model_(with_ground(p, path_, lift_off), path_), lift_off_(lift_off) {}
    ElasticSwingModel(const ElasticSwingModel&) = delete;  // model_ refers to path_
    ElasticSwingModel& operator=(const ElasticSwingModel&) = delete;

    std::size_t state_size() const override { return model_.state_size(); }
    std::vector<StateComponent> state_components() const override { return model_.state_components(); }
    std::size_t second_order_dof() const override { return model_.second_order_dof(); }
    void derivatives(double t, const Regime& r, std::span<const double> x, std::span<double> dxdt) const override {
        model_.derivatives(t, r, x, dxdt);
    }
    bool jacobian(double t, const Regime& r, std::span<const double> x, std::span<double> J) const override {
        return model_.jacobian(t, r, x, J);
    }
    std::size_t event_count() const override { return model_.event_count(); }
    void events(double t, const Regime& r, std::span<const double> x, std::span<double> g) const override {
        model_.events(t, r, x, g);
    }
    EventAction on_event(double t, std::span<const double> x, std::size_t index, int direction,
                         Regime& r) const override {
        return model_.on_event(t, x, index, direction, r);
    }
    std::uint64_t initial_mode(std::span<const double> x0) const override { return model_.initial_mode(x0); }

    std::vector<double> initial_state() const override {
        return lift_off_ ? model_.resting_on_ground(lift_off_->slack_length) : model_.hanging_at_rest(0);
    }

    Observation observe(double t, const Regime& r, std::span<const double> x) const override {
        const ElasticObservation e = model_.observe(t, r, x);
        Observation o;
        o.time = t;
        o.support = e.support;  // the path evaluated once, by the model
        o.hook_block = e.hook - e.suspension_point;
        o.load_cg = e.load - e.suspension_point;
        o.member(MemberId::hoist_rope) = member_from(e.hoist_rope, e.hook_velocity - e.suspension_velocity);
        o.member(MemberId::rigging) = member_from(e.rigging, e.load_velocity - e.hook_velocity);
        o.member(MemberId::hoist_rope).slack = e.hoist_rope.slack;
        o.member(MemberId::rigging).slack = e.rigging.slack;
        o.load_on_ground = e.load_on_ground;
        return o;
    }

    const SupportTrajectory& trajectory() const override { return path_; }
    const SupportMotion& motion() const override { return path_.channel(SupportPath::x); }

    ModelDescription describe() const override {
        const ElasticParameters& p = model_.parameters();
        ModelDescription d;
        d.name = "elastic model";
        d.static_loads = hanging_static_loads(p.hook_block_mass, p.load_mass, p.gravity);
        d.assumptions = {
            "Three-dimensional motion: the hook block and the load are point masses that move in any "
            "direction under the moving suspension point.",
            "The hoist rope and the rigging are elastic members that pull but never push; the hook's "
            "stiffness is n^2 EA / (n L + lead length) for n parts of line of fall length L.",
            "A slack rope or rigging is a state the model follows (slack onset and re-tightening are "
            "located events), not the end of its validity; snatch loads are predicted.",
            "Material damping is a viscous dashpot in each member giving the stated damping ratio to "
            "its axial mode; sheave friction and rope mass are ignored.",
            "The load hangs from one point at its centre of gravity: no rotation of the load, no "
            "sling legs swinging apart.",
            "The drive follows the planned support motion exactly, whatever the swing.",
            "Air drag on the hook block and the load (1/2 rho Cd A |v|^2 on the velocity relative to the "
            "air; Cd 1 and 1 m^2 per tonne of mass: common practice, no source) with the job's steady "
            "wind and gust.",
            "What the elastic model leaves out: the load's size and rotation, sheave friction, rope mass "
            "and the deflection of jib, boom and crane; setting the load down on the ground ends "
            "the run. Allow for them as the crane manufacturer and your standard require.",
        };
        if (lift_off_) {
            d.assumptions.push_back(
                "Lift-off: the load starts resting on rigid level ground with the rigging slack by " +
                length_words(lift_off_->slack_length) +
                "; it leaves the ground when the rigging's upward pull reaches its weight, and "
                "it is held in place (no sliding) until then.");
        }
        if (path_.slewing()) {
            d.assumptions.push_back(
                "Slewing: the suspension point turns about the vertical slew axis (carried by the travel, if "
                "any) at the planned slew angle and radius exactly; jib and tower are rigid (no deflection, "
                "no twist).");
        }
        d.validity = ValidityRule::always_valid;
        d.dynamic_factor_scope =
            "everything the elastic model simulates: swing, hoisting and lowering, slewing, lift-off, slack and snatch, "
            "the ropes' axial bounce and wind; brake and impact effects are not included";
        d.swing_damping = "The swing is damped in the model only by air drag on the hook block and load and, "
                          "slightly, by the ropes' axial damping: it continues nearly undiminished until the next move.";
        d.vertical_bounce_period = model_.vertical_bounce_period(0);
        // The ropes' axial modes are fast and lightly damped (eigenvalues near
        // the imaginary axis), where BDF of orders 3 to 5 is not stable: at
        // loose tolerances it misstated the swing by up to 47 % in the
        // benchmark. Orders 1 and 2 are A-stable and step over those modes
        // (docs/benchmark.md, "The targets").
        d.bdf_highest_order = 2;
        return d;
    }

private:
    static std::string length_words(double metres) {
        if (metres == 0) return "0 m (just taut)";
        char text[32];
        std::snprintf(text, sizeof text, "%.4g m", metres);
        return text;
    }

    SupportPath path_;
    ElasticLiftModel model_;
    std::optional<LiftOff> lift_off_;
};

}  // namespace

std::unique_ptr<SwingModel> make_elastic_swing_model(const Job& job) {
    return make_elastic_swing_model(job, SupportMotion::from_spec(job.motion));
}

std::unique_ptr<SwingModel> make_elastic_swing_model(const Job& job, SupportMotion x_travel) {
    auto channel = [](const std::vector<Move>& moves) {
        return moves.empty() ? SupportMotion::at_rest() : SupportMotion::from_moves(moves);
    };
    SupportMotion x = std::move(x_travel), y = channel(job.motion.y_moves),
                  hoist = channel(job.motion.hoist_moves);
    if (const std::optional<SlewSpec>& slew = job.motion.slew) {
        SupportPath path(std::move(x), std::move(y), std::move(hoist), job.hoist.rope_length,
                         channel(slew->slew_moves), channel(slew->radius_moves),
                         JibStart{slew->initial_radius, slew->initial_angle});
        return std::make_unique<ElasticSwingModel>(parameters_from_job(job), std::move(path), job.lift_off);
    }
    SupportPath path(std::move(x), std::move(y), std::move(hoist), job.hoist.rope_length);
    return std::make_unique<ElasticSwingModel>(parameters_from_job(job), std::move(path), job.lift_off);
}

}  // namespace plumb
