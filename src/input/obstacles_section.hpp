// The job file's keep-out zones: the section `obstacles`, the load's outline
// `load.size` and the limit `limits.clearance` (docs/job-file.md, section
// "obstacles"). Written against the job parser's Section (job_file.cpp: find,
// require, section, quantity, text, fail_at, check_range ...) and instantiated
// there, so that every value goes through the one reading of numbers, units
// and the file's declared `units:`, and every error names its key path.
#pragma once

#include <yaml-cpp/yaml.h>

#include <cmath>
#include <string>
#include <string_view>
#include <vector>

#include "input/input_bounds.hpp"
#include "input/input_text.hpp"
#include "plumb/job.hpp"
#include "plumb/units.hpp"

namespace plumb::input {

inline const std::vector<std::string_view> obstacles_keys{"suspension_height", "zones"};
inline const std::vector<std::string_view> zone_keys{"name", "box", "plane", "cylinder"};
inline const std::vector<std::string_view> box_keys{"x_min", "x_max", "y_min", "y_max", "z_min", "z_max"};
inline const std::vector<std::string_view> plane_keys{"x1", "y1", "x2", "y2", "keep_out"};
inline const std::vector<std::string_view> cylinder_keys{"x", "y", "radius", "bottom", "top"};
inline const std::vector<std::string_view> load_size_keys{"length", "width", "height", "radius"};

namespace obstacles_detail {

// A coordinate of the site: any sign, within the site's extent.
template <class Section>
double coordinate(const Section& s, std::string_view key) {
    const double v = s.quantity(key, Dimension::length);
    s.check_range(key, v, Dimension::length, -max_site_extent, true, max_site_extent, true);
    return v;
}

// low < high along one axis of a box or a cylinder's height.
template <class Section>
void check_ordered(const Section& s, std::string_view low_key, double low, std::string_view high_key, double high) {
    if (!(low < high))
        s.fail_at(high_key, "'" + std::string(high_key) + "' must be more than '" + std::string(low_key) + "' (" +
                                show(high, Dimension::length) + " is not more than " + show(low, Dimension::length) +
                                ")");
}

template <class Section>
void read_box(const Section& s, KeepOutZone& z) {
    z.shape = ZoneShape::box;
    const char* axes[3][2] = {{"x_min", "x_max"}, {"y_min", "y_max"}, {"z_min", "z_max"}};
    for (int i = 0; i < 3; ++i) {
        z.low[i] = coordinate(s, axes[i][0]);
        z.high[i] = coordinate(s, axes[i][1]);
        check_ordered(s, axes[i][0], z.low[i], axes[i][1], z.high[i]);
    }
}

template <class Section>
void read_plane(const Section& s, KeepOutZone& z) {
    z.shape = ZoneShape::plane;
    z.low = {coordinate(s, "x1"), coordinate(s, "y1"), 0};
    z.high = {coordinate(s, "x2"), coordinate(s, "y2"), 0};
    if (std::hypot(z.high[0] - z.low[0], z.high[1] - z.low[1]) < 1e-3)
        s.fail_at("x2", "the two points of the line (x1, y1) and (x2, y2) must be at least 1 mm apart in plan");
    const auto& side = s.require("keep_out");
    const std::string word(trim(s.text(side)));
    if (word == "right") std::swap(z.low, z.high);  // the keep-out side is left of low -> high
    else if (word != "left")
        s.fail_at(side, "expected 'left' or 'right' (the keep-out side, seen walking from (x1, y1) to (x2, y2)), "
                        "got '" + word + "'");
}

template <class Section>
void read_cylinder(const Section& s, KeepOutZone& z) {
    z.shape = ZoneShape::cylinder;
    z.low = {coordinate(s, "x"), coordinate(s, "y"), coordinate(s, "bottom")};
    z.high = {z.low[0], z.low[1], coordinate(s, "top")};
    check_ordered(s, "bottom", z.low[2], "top", z.high[2]);
    z.radius = s.quantity("radius", Dimension::length);
    s.check_range("radius", z.radius, Dimension::length, 0, false, max_site_extent, true);
}

template <class Section>
KeepOutZone read_zone(const Section& s) {
    KeepOutZone z;
    z.name = s.text(s.require("name"));
    int shapes = 0;
    for (const char* key : {"box", "plane", "cylinder"}) shapes += s.find(key) != nullptr;
    if (shapes != 1)
        s.fail_at(shapes == 0 ? std::string_view("box") : std::string_view("plane"),
                  "give exactly one shape for the zone: box, plane or cylinder");
    if (const auto* e = s.find("box")) read_box(s.section(*e, box_keys), z);
    if (const auto* e = s.find("plane")) read_plane(s.section(*e, plane_keys), z);
    if (const auto* e = s.find("cylinder")) read_cylinder(s.section(*e, cylinder_keys), z);
    return z;
}

template <class Section>
LoadSize read_load_size(const Section& s) {
    LoadSize size;
    if (const auto* e = s.find("radius")) {
        for (const char* key : {"length", "width", "height"})
            if (const auto* box = s.find(key))
                s.fail_at_key(*box, "give either radius (a sphere) or length, width and height (a box), not both");
        size.radius = s.quantity(*e, Dimension::length);
        s.check_range("radius", size.radius, Dimension::length, 0, false, max_load_size, true);
        return size;
    }
    double* sides[] = {&size.length, &size.width, &size.height};
    const char* keys[] = {"length", "width", "height"};
    for (int i = 0; i < 3; ++i) {
        *sides[i] = s.quantity(keys[i], Dimension::length);
        s.check_range(keys[i], *sides[i], Dimension::length, 0, false, max_load_size, true);
    }
    return size;
}

}  // namespace obstacles_detail

// The section `obstacles` with the load's size, or, without the section, the
// refusal of `load.size` and `limits.clearance` (read only with zones).
// limits is the section `limits` when the job has one.
template <class Section>
void read_obstacles(const Section& top, const Section& load, const Section* limits, Job& job) {
    const auto* section = top.find("obstacles");
    const auto* size = load.find("size");
    if (section == nullptr) {
        if (size != nullptr)
            load.fail_at_key(*size, "'size' is read only for the clearance to keep-out zones: give the section "
                                    "'obstacles' or remove this key");
        if (limits != nullptr && job.limits.clearance)
            limits->fail_at_key(*limits->find("clearance"), "'clearance' needs keep-out zones: give the section "
                                                            "'obstacles' or remove this limit");
        return;
    }
    const Section s = top.section(*section, obstacles_keys);
    Obstacles& o = job.obstacles;
    o.suspension_height = s.quantity("suspension_height", Dimension::length);
    s.check_range("suspension_height", o.suspension_height, Dimension::length, 0, false, max_site_extent, true);
    const double hanging = job.hoist.rope_length + job.rigging.length;
    if (!(o.suspension_height > hanging))
        s.fail_at("suspension_height", "must be more than the rope length plus the rigging length (" +
                                           show(hanging, Dimension::length) +
                                           "): the load's centre of gravity would hang at or below the floor datum");
    const auto& list = s.require("zones");
    if (!list.value.IsSequence() || list.value.size() == 0)
        s.fail_at(list, "expected a list of keep-out zones (each starting with '- name:')");
    if (list.value.size() > max_keep_out_zones)
        s.fail_at(list, "more than " + std::to_string(max_keep_out_zones) + " keep-out zones (" +
                            std::to_string(list.value.size()) + ")");
    std::size_t index = 0;
    for (const YAML::Node& item : list.value) {
        ++index;  // 1-based, as for the moves
        const std::string path = list.path + "[" + std::to_string(index) + "]";
        const YAML::Mark mark = item.Mark().is_null() ? list.mark() : item.Mark();
        const Section zone(s.ctx(), item, path, mark, zone_keys);
        o.zones.push_back(obstacles_detail::read_zone(zone));
        for (std::size_t k = 0; k + 1 < o.zones.size(); ++k)
            if (o.zones[k].name == o.zones.back().name)
                zone.fail_at("name", "zone name '" + o.zones.back().name + "' is given twice (zones[" +
                                         std::to_string(k + 1) + "]); names identify the zones in the outputs");
    }
    if (size == nullptr)
        load.fail_at("size", "keep-out zones need the load's outline: give load.size as length, width and "
                             "height (a box) or radius (a sphere)");
    o.load_size = obstacles_detail::read_load_size(load.section(*size, load_size_keys));
}

}  // namespace plumb::input
