// Events of the elastic model: slack onset and re-tightening of each member,
// lift-off of the load from the ground, and the load coming back down onto it
// (docs/model.md, "Elastic model", events).
#include "elastic_members.hpp"

namespace plumb {

namespace {

// Away from its own regime an event function is held at a constant that never
// crosses zero.
constexpr double inactive = 1.0;

double upward_pull_on_load(const elastic_detail::Member& rigging) { return -rigging.tension * rigging.u.z(); }

// Member i's slack bit follows the direction its stretch crossed zero in.
EventAction switch_slack_bit(std::uint64_t bit, int direction, Regime& r) {
    const std::uint64_t before = r.mode;
    if (direction < 0) r.mode |= bit;
    if (direction > 0) r.mode &= ~bit;
    return r.mode == before ? EventAction::record : EventAction::restart;
}

}  // namespace

void ElasticLiftModel::events(double t, const Regime& r, std::span<const double> x, std::span<double> g) const {
    if ((r.mode & elastic_mode::load_on_ground) != 0) {
        // The lift-off function needs the rigging's tension: the whole snapshot.
        const elastic_detail::Snapshot s = elastic_detail::snapshot(*this, t, r, x);
        g[elastic_event::hoist_rope_stretch] = s.hoist_rope.stretch;
        g[elastic_event::rigging_stretch] = s.rigging.stretch;
        g[elastic_event::lift_off] = upward_pull_on_load(s.rigging) - p_.load_mass * p_.gravity;
        g[elastic_event::touch_down] = inactive;
        return;
    }
    // In the air only positions matter: the stretches as the snapshot forms
    // them (length less unstretched length), without the forces, velocities
    // and wind it would work out too. The integrators evaluate these at
    // several points of every step.
    using elastic_detail::Vec3;
    const SupportKinematics k = support_.at(t, r.interval);
    const Vec3 hook(x[0], x[1], x[2]), load(x[3], x[4], x[5]);
    g[elastic_event::hoist_rope_stretch] = (hook - k.position).norm() - k.rope_length;
    g[elastic_event::rigging_stretch] = (load - hook).norm() - p_.rigging_length;
    g[elastic_event::lift_off] = inactive;
    g[elastic_event::touch_down] = p_.ground.present ? load.z() - p_.ground.load_resting_height : inactive;
}

EventAction ElasticLiftModel::on_event(double /*t*/, std::span<const double> /*x*/, std::size_t index,
                                       int direction, Regime& r) const {
    switch (index) {
    case elastic_event::hoist_rope_stretch:
        return switch_slack_bit(elastic_mode::hoist_rope_slack, direction, r);
    case elastic_event::rigging_stretch:
        return switch_slack_bit(elastic_mode::rigging_slack, direction, r);
    case elastic_event::lift_off:
        if (direction > 0 && (r.mode & elastic_mode::load_on_ground)) {
            r.mode &= ~elastic_mode::load_on_ground;
            return EventAction::restart;
        }
        return EventAction::record;
    case elastic_event::touch_down:
        // Setting the load down again (an impact on the ground) is outside
        // the model: the run ends there.
        return direction < 0 ? EventAction::stop : EventAction::record;
    default:
        return EventAction::record;
    }
}

std::uint64_t ElasticLiftModel::initial_mode(std::span<const double> x0) const {
    // On the ground if the load starts at (or below) its resting height; each
    // member slack if it starts shorter than its unstretched length.
    const std::uint64_t ground =
        p_.ground.present && x0[5] <= p_.ground.load_resting_height ? elastic_mode::load_on_ground : 0;
    const elastic_detail::Snapshot s = elastic_detail::snapshot(*this, 0.0, Regime{0, ground}, x0);
    std::uint64_t mode = ground;
    if (s.hoist_rope.stretch < 0) mode |= elastic_mode::hoist_rope_slack;
    if (s.rigging.stretch < 0) mode |= elastic_mode::rigging_slack;
    return mode;
}

}  // namespace plumb
