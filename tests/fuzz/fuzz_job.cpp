// A structure-aware fuzz target for the job parser and the whole pipeline.
//
// An input whose first byte is printable ASCII is taken as job-file text as
// it stands (seed it with cases/*.yaml). Any other input drives a generator
// that places values into a valid job: typical values scaled over four
// decades, extreme numbers, wrong or missing units and bad text, with and
// without jerk, pauses, several moves or a speed-history CSV, limits and
// analysis settings, a held acceleration, keep-out zones with the load's size,
// and the elastic model's sections (rope data, wind, lift-off, slewing). Every
// job the parser accepts on the rigid model is simulated, checked and
// formatted (summary, JSON, CSV); elastic jobs are parsed only (a run takes a
// good part of a second, too slow for a fuzzer).
//
// What counts as a finding: a crash, a sanitizer report, or any exception
// other than InputError (bad input, exit 2). A NumericalError (exit 3) on a
// job that passed validation is a finding too when PLUMB_FUZZ_STRICT=1 is
// set; by default it is let through, because a short CI run must fail only on
// what the hardening contract already promises (DEVELOPERS.md, "Fuzzing").
#include <fuzzer/FuzzedDataProvider.h>
#include <unistd.h>

#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include "plumb/assessment.hpp"
#include "plumb/errors.hpp"
#include "plumb/job_file.hpp"
#include "plumb/modes.hpp"
#include "plumb/model.hpp"
#include "plumb/motion.hpp"
#include "plumb/report.hpp"
#include "plumb/work_budget.hpp"

namespace {

// Jobs whose fast mode would take more oscillations than this are parsed but
// not simulated: they are valid, only too slow for many executions a second.
constexpr double fuzz_cycle_budget = 2e4;

const std::filesystem::path& scratch_folder() {
    static const std::filesystem::path folder = [] {
        std::filesystem::path p = std::filesystem::temp_directory_path() /
                                  ("plumb-fuzz-" + std::to_string(::getpid()));
        std::filesystem::create_directories(p);
        return p;
    }();
    return folder;
}

class JobWriter {
public:
    explicit JobWriter(FuzzedDataProvider& data) : data_(data) {}

    std::string job() {
        // How wild the values get: at 0 every value is a plausible one in a
        // right unit; the higher, the more extreme, random or broken values.
        chaos_ = data_.ConsumeIntegral<std::uint8_t>() / 4;
        std::string y;
        switch (data_.ConsumeIntegralInRange(0, 2)) {  // the file's declared units, if any
            case 1: y += "units: si\n"; break;
            case 2: y += "units: us\n"; break;
            default: break;
        }
        y += "job:\n  title: " + text("Fuzzed lift") + "\n";
        if (data_.ConsumeBool()) y += "  reference: " + text("FZ-1") + "\n";
        elastic_ = data_.ConsumeIntegralInRange(0, 3) == 0;
        y += "motion:\n";
        const int motion_kind = data_.ConsumeIntegralInRange(0, 7);
        if (motion_kind == 0) {
            y += "  speed_history: history.csv\n";
            write_history();
        } else if (motion_kind == 1) {
            y += "  held_acceleration:\n    acceleration: " + quantity(0.3, {"m/s^2"}) + "\n    duration: " +
                 quantity(10, {"s"}) + "\n";
        } else if (elastic_ && motion_kind == 2) {
            y += slew();
        } else {
            y += "  moves:\n";
            const int moves = data_.ConsumeIntegralInRange(1, 4);
            for (int i = 0; i < moves; ++i) y += move();
        }
        y += "hoist:\n";
        y += "  rope_length: " + quantity(10, {"m", "ft", "mm", ""}) + "\n";
        if (data_.ConsumeBool()) y += "  parts_of_line: " + whole(1, 12, -1, 70) + "\n";
        y += "  rated_load: " + quantity(30, {"t", "kN", "lb", "kg"}) + "\n";
        if (data_.ConsumeBool()) y += "  rope_wll: " + quantity(8, {"t", "kN"}) + "\n";
        if (data_.ConsumeBool()) y += "  rope_minimum_breaking_load: " + quantity(300, {"kN", "t"}) + "\n";
        y += "hook_block:\n  mass: " + quantity(300, {"kg", "t", "lb"}) + "\n";
        y += "rigging:\n  length: " + quantity(2, {"m", "ft"}) + "\n";
        if (data_.ConsumeBool()) {
            y += "  legs: " + whole(2, 4, 0, 5) + "\n";
            switch (data_.ConsumeIntegralInRange(0, 2)) {
                case 0: y += "  leg_angle_from_horizontal: " + quantity(60, {"deg", "rad"}) + "\n"; break;
                case 1: y += "  leg_angle_from_vertical: " + quantity(30, {"deg"}) + "\n"; break;
                default:
                    y += "  leg_length: " + quantity(3, {"m"}) + "\n  spread: " + quantity(2, {"m"}) + "\n";
            }
            if (data_.ConsumeBool()) y += "  leg_wll: " + quantity(10, {"t", "kN"}) + "\n";
        }
        y += "load:\n  mass: " + quantity(8, {"t", "kg", "lb"}) + "\n";
        const bool zones = data_.ConsumeIntegralInRange(0, 3) == 0;
        if (zones || wild()) y += load_size();
        // Rigid model only (the elastic model refuses them, naming the key).
        const bool rigid_keys = !elastic_ || wild();
        if (rigid_keys && data_.ConsumeBool()) y += "  radius_of_gyration: " + quantity(1, {"m"}) + "\n";
        if (rigid_keys && data_.ConsumeBool()) y += "  initial_angle: " + quantity(2, {"deg", "rad"}) + "\n";
        if (rigid_keys && data_.ConsumeBool()) y += "  initial_rate: " + quantity(1, {"deg/s", "rad/s"}) + "\n";
        std::string environment;
        if (data_.ConsumeBool()) environment += "  gravity: " + quantity(9.81, {"m/s^2", ""}) + "\n";
        if (elastic_ && data_.ConsumeBool()) {
            environment += "  wind_speed: " + quantity(8, {"m/s", "km/h"}) + "\n  wind_direction: " + quantity(90, {"deg"}) + "\n";
            if (data_.ConsumeBool())
                environment += "  gust_peak: " + quantity(5, {"m/s"}) + "\n  gust_start: " + quantity(5, {"s"}) +
                               "\n  gust_duration: " + quantity(4, {"s"}) + "\n";
        }
        if (!environment.empty()) y += "environment:\n" + environment;
        if (zones) y += obstacles();
        if (data_.ConsumeBool()) y += limits(zones);
        y += analysis();
        if (elastic_) y += rope();
        if (elastic_ && data_.ConsumeIntegralInRange(0, 3) == 0) y += "lift_off:\n  slack_length: " + quantity(0.1, {"m"}) + "\n";
        return y;
    }

    bool keep_time_series() { return data_.ConsumeBool(); }

private:
    std::string move() {
        std::string m = "    - distance: " + quantity(data_.ConsumeBool() ? 10 : -5, {"m", "ft"}) + "\n";
        m += "      top_speed: " + quantity(0.5, {"m/s", "m/min", "ft/min"}) + "\n";
        m += "      acceleration: " + quantity(0.3, {"m/s^2"}) + "\n";
        if (data_.ConsumeBool()) m += "      deceleration: " + quantity(0.25, {"m/s^2"}) + "\n";
        if (data_.ConsumeBool()) m += "      jerk: " + quantity(0.5, {"m/s^3"}) + "\n";
        if (data_.ConsumeBool()) m += "      pause_before: " + quantity(3, {"s", "min"}) + "\n";
        return m;
    }

    std::string load_size() {
        if (data_.ConsumeBool()) return "  size: {radius: " + quantity(0.8, {"m"}) + "}\n";
        return "  size: {length: " + quantity(2, {"m"}) + ", width: " + quantity(1.2, {"m"}) +
               ", height: " + quantity(1, {"m", "ft"}) + "}\n";
    }

    std::string obstacles() {
        std::string o = "obstacles:\n  suspension_height: " + quantity(20, {"m"}) + "\n  zones:\n";
        const int zones = wild() ? data_.ConsumeIntegralInRange(0, 4) : data_.ConsumeIntegralInRange(1, 3);
        for (int i = 0; i < zones; ++i) {
            o += "    - name: " + (wild() ? text("zone") : "\"zone " + std::to_string(i) + "\"") + "\n";
            switch (data_.ConsumeIntegralInRange(0, 2)) {
                case 0:
                    o += "      box: {x_min: " + quantity(3, {"m"}) + ", x_max: " + quantity(6, {"m"}) +
                         ", y_min: " + quantity(-2, {"m"}) + ", y_max: " + quantity(2, {"m"}) +
                         ", z_min: 0 m, z_max: " + quantity(3, {"m"}) + "}\n";
                    break;
                case 1:
                    o += "      cylinder: {x: " + quantity(5, {"m"}) + ", y: " + quantity(1, {"m"}) +
                         ", radius: " + quantity(0.4, {"m"}) + ", bottom: 0 m, top: " + quantity(10, {"m"}) + "}\n";
                    break;
                default:
                    o += "      plane: {x1: " + quantity(12, {"m"}) + ", y1: -5 m, x2: " + quantity(12, {"m"}) +
                         ", y2: 5 m, keep_out: " + (data_.ConsumeBool() ? "right" : "left") + "}\n";
            }
        }
        return o;
    }

    // The elastic model's slewing motion (the slew axis at the origin).
    std::string slew() {
        std::string m = "  slew:\n    initial_radius: " + quantity(20, {"m"}) + "\n    initial_angle: " +
                        quantity(10, {"deg"}) + "\n    slew_moves:\n";
        m += "      - distance: " + quantity(data_.ConsumeBool() ? 90 : -45, {"deg", "rad"}) + "\n";
        m += "        top_speed: " + quantity(4, {"deg/s", "rad/s"}) + "\n";
        m += "        acceleration: " + quantity(0.5, {"deg/s^2"}) + "\n";
        if (data_.ConsumeBool()) m += "        jerk: " + quantity(0.3, {"deg/s^3"}) + "\n";
        if (data_.ConsumeBool()) {
            m += "    radius_moves:\n      - distance: " + quantity(-5, {"m"}) + "\n        top_speed: " +
                 quantity(0.5, {"m/s"}) + "\n        acceleration: " + quantity(0.2, {"m/s^2"}) + "\n";
        }
        return m;
    }

    std::string rope() {
        if (data_.ConsumeIntegralInRange(0, 3) == 0) return "rope:\n  axial_stiffness: " + quantity(2e7, {"N", "kN"}) + "\n";
        std::string r = "rope:\n  diameter: " + quantity(16, {"mm", "in"}) + "\n  fill_factor: " + quantity(0.55, {""}) + "\n";
        if (!wild()) r += "  modulus: " + quantity(100, {"GPa", "MPa", "ksi"}) + "\n";
        if (data_.ConsumeBool()) r += "  damping_ratio: " + quantity(0.02, {""}) + "\n";
        return r;
    }

    std::string limits(bool zones) {
        std::string l = "limits:\n";
        if (zones || wild()) l += "  clearance: " + quantity(0.5, {"m"}) + "\n";
        if (data_.ConsumeBool()) l += "  hook_rope_angle: " + quantity(5, {"deg"}) + "\n";
        if (data_.ConsumeBool()) l += "  load_angle: " + quantity(5, {"deg"}) + "\n";
        if (data_.ConsumeBool()) l += "  load_offset: " + quantity(0.5, {"m"}) + "\n";
        if (data_.ConsumeBool()) l += "  residual_swing: " + quantity(0.1, {"m"}) + "\n";
        if (data_.ConsumeBool()) l += "  rope_tension: " + quantity(90, {"%"}) + "\n";
        if (data_.ConsumeBool()) l += "  dynamic_factor: " + quantity(2.5, {""}) + "\n";
        if (data_.ConsumeBool()) l += "  caution_at: " + quantity(50, {"%"}) + "\n";
        return l;
    }

    std::string analysis() {
        std::string a = "analysis:\n  duration_after: " + quantity(10, {"s"}) + "\n";
        if (elastic_) a += "  model: elastic\n";
        if (data_.ConsumeBool()) a += "  output_step: " + quantity(0.05, {"s"}) + "\n";
        if (data_.ConsumeBool()) a += "  relative_tolerance: " + quantity(1e-8, {""}) + "\n";
        if (data_.ConsumeBool()) a += "  absolute_tolerance: " + quantity(1e-10, {""}) + "\n";
        static const char* const methods[] = {"runge-kutta", "cvode-adams", "cvode-bdf"};
        if (data_.ConsumeBool()) a += std::string("  integrator: ") + methods[data_.ConsumeIntegralInRange(0, 2)] + "\n";
        return a;
    }

    void write_history() {
        std::string csv = data_.ConsumeBool() ? "time [s], speed [m/s]\n" : "time [s], speed [m/min]\n";
        const int rows = data_.ConsumeIntegralInRange(2, 60);
        double t = 0;
        for (int i = 0; i < rows; ++i) {
            const bool edge = i == 0 || i == rows - 1;
            const double speed = edge && !wild() ? 0.0 : data_.ConsumeFloatingPointInRange<double>(-1.0, 1.0);
            csv += number(t) + ", " + number(speed) + "\n";
            t += wild() ? data_.ConsumeFloatingPointInRange<double>(-0.1, 0.3)
                        : data_.ConsumeFloatingPointInRange<double>(0.4, 5.0);
        }
        std::ofstream(scratch_folder() / "history.csv", std::ios::binary | std::ios::trunc) << csv;
    }

    static std::string number(double v) {
        char buf[64];
        std::snprintf(buf, sizeof buf, "%.17g", v);
        return buf;
    }

    // True with a probability that grows with the chaos level.
    bool wild() { return data_.ConsumeIntegralInRange(0, 255) < chaos_; }

    // A whole number: mostly in [low, high], when wild in [wild_low, wild_high].
    std::string whole(int low, int high, int wild_low, int wild_high) {
        return std::to_string(wild() ? data_.ConsumeIntegralInRange(wild_low, wild_high)
                                     : data_.ConsumeIntegralInRange(low, high));
    }

    // A value for a key: mostly a typical value scaled by up to 3 either way in
    // the first (plausible) unit given; when wild, scaled over four decades,
    // in any of the units or a wrong one, extreme, random or not a number.
    std::string quantity(double typical, const std::vector<const char*>& units) {
        static const char* const extremes[] = {"0", "-1", "1e308", "5e-324", "1e-300", "1e154", "nan", ".inf",
                                               "-.inf", "1e999", "0x10", "+0", "-0", "1e-7", "4e5"};
        if (!wild()) {
            const std::string value = number(typical * std::pow(10.0, data_.ConsumeFloatingPointInRange<double>(-0.5, 0.5)));
            return units[0][0] ? value + " " + units[0] : value;
        }
        std::string value;
        const int kind = data_.ConsumeIntegralInRange(0, 11);
        if (kind <= 7) {
            value = number(typical * std::pow(10.0, data_.ConsumeFloatingPointInRange<double>(-2.0, 2.0)));
        } else if (kind == 8) {
            value = extremes[data_.ConsumeIntegralInRange<std::size_t>(0, std::size(extremes) - 1)];
        } else if (kind == 9) {
            value = number(data_.ConsumeFloatingPoint<double>());
        } else if (kind == 10) {
            return text("12");
        } else {
            value = number(typical);
        }
        const std::size_t u = data_.ConsumeIntegralInRange<std::size_t>(0, units.size());
        if (u == units.size()) return value + (data_.ConsumeBool() ? " furlong" : "");
        return units[u][0] ? value + " " + units[u] : value;
    }

    // Text: mostly the typical one; when wild, fuzzed bytes in a double-quoted scalar.
    std::string text(const char* typical) {
        if (!wild()) return std::string("\"") + typical + "\"";
        std::string raw = data_.ConsumeRandomLengthString(48);
        std::string quoted = "\"";
        for (char c : raw) {
            if (c == '"' || c == '\\') quoted += '\\';
            if (c == '\n') quoted += "\\n";
            else quoted += c;
        }
        return quoted + "\"";
    }

    FuzzedDataProvider& data_;
    int chaos_ = 0;
    bool elastic_ = false;  // the job asks for the elastic model
};

// PLUMB_FUZZ_STATS=1: at exit, how many inputs were generated jobs, were
// accepted by the parser and were simulated (to judge the generator).
struct Stats {
    long inputs = 0, generated = 0, accepted = 0, simulated = 0;
    ~Stats() {
        if (std::getenv("PLUMB_FUZZ_STATS") != nullptr)
            std::fprintf(stderr, "plumb_fuzz_job: %ld inputs, %ld generated, %ld accepted, %ld simulated\n",
                         inputs, generated, accepted, simulated);
    }
};
Stats stats;

bool strict() {
    static const bool s = std::getenv("PLUMB_FUZZ_STRICT") != nullptr;
    return s;
}

// Simulate, check and format a job the parser accepted.
void run_pipeline(const plumb::Job& job, bool keep_time_series) {
    const plumb::ModelDescription model = plumb::describe_lift_model(job);
    if (!model.modes) return;  // the fuzzer's jobs use the rigid model, which has modes
    const plumb::SwingModes& modes = *model.modes;
    const double end =
        plumb::simulated_end_time(job, plumb::SupportMotion::from_spec(job.motion).end_of_motion(), model.modes);
    if (plumb::fast_mode_cycles(modes, end) > fuzz_cycle_budget) return;
    if (keep_time_series && end / job.analysis.output_step > 2e4) keep_time_series = false;
    ++stats.simulated;
    try {
        const plumb::LiftAssessment a = plumb::assess_lift(job, keep_time_series);
        for (plumb::UnitSystem units : {plumb::UnitSystem::si, plumb::UnitSystem::us_customary}) {
            (void)plumb::format_summary(a, units);
            (void)plumb::format_json(a, units);
            if (keep_time_series) (void)plumb::format_csv(a, units);
        }
    } catch (const plumb::NumericalError& e) {
        if (strict()) {
            std::fprintf(stderr, "a job that passed validation failed numerically: %s\n", e.what());
            std::abort();
        }
    }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* bytes, std::size_t size) {
    if (size == 0) return 0;
    ++stats.inputs;
    std::string text;
    bool keep_time_series = false;
    if (bytes[0] >= 0x20 && bytes[0] < 0x7f) {
        text.assign(reinterpret_cast<const char*>(bytes), size);
    } else {
        ++stats.generated;
        FuzzedDataProvider data(bytes + 1, size - 1);
        JobWriter writer(data);
        text = writer.job();
        keep_time_series = writer.keep_time_series();
    }
    plumb::Job job;
    try {
        job = plumb::parse_job(text, "fuzz.yaml", scratch_folder().string());
        ++stats.accepted;
        run_pipeline(job, keep_time_series);
    } catch (const plumb::InputError&) {
        // bad input, refused as it should be
    }
    return 0;
}
