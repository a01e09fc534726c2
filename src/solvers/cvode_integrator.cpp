// SUNDIALS CVODE behind RAII owners, set up in the order of SUNDIALS' own C++
// examples: context, vectors, solver memory, init, tolerances, user data,
// matrix, linear solver. Every return code is checked; a failure becomes a
// NumericalError with the time reached. No exception crosses a C callback:
// each callback catches everything, keeps it and returns SUNDIALS' error
// code; the exception is rethrown once CVODE has returned.
#include <cvode/cvode.h>
#include <nvector/nvector_serial.h>
#include <sunlinsol/sunlinsol_dense.h>
#include <sunmatrix/sunmatrix_dense.h>
#include <sunnonlinsol/sunnonlinsol_fixedpoint.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <exception>
#include <optional>
#include <stdexcept>
#include <string>

#include "integrators_impl.hpp"
#include "plumb/errors.hpp"

namespace plumb {
namespace detail {
namespace {

// Owns one SUNDIALS object: made by a SUNDIALS constructor (checked for null),
// released by its destructor function, never copied.
template <typename Handle, auto release>
class Owned {
public:
    Owned(Handle handle, const char* made_by) : handle_(handle) {
        if (!handle_) throw NumericalError(std::string(made_by) + " failed", 0);
    }
    ~Owned() { release(handle_); }
    Owned(const Owned&) = delete;
    Owned& operator=(const Owned&) = delete;
    Handle get() const { return handle_; }

private:
    Handle handle_;
};

using SundialsContext = Owned<SUNContext, [](SUNContext c) { SUNContext_Free(&c); }>;
using SerialVector = Owned<N_Vector, N_VDestroy>;
using DenseMatrix = Owned<SUNMatrix, SUNMatDestroy>;
using DenseLinearSolver = Owned<SUNLinearSolver, [](SUNLinearSolver s) { SUNLinSolFree(s); }>;
using CvodeMemory = Owned<void*, [](void* m) { CVodeFree(&m); }>;
using NonlinearSolver = Owned<SUNNonlinearSolver, [](SUNNonlinearSolver s) { SUNNonlinSolFree(s); }>;

SUNContext new_context() {
    SUNContext ctx = nullptr;
    if (SUNContext_Create(nullptr, &ctx) != 0) return nullptr;
    return ctx;
}

std::string flag_name(int flag) {
    char* name = CVodeGetReturnFlagName(flag);
    std::string text = name ? name : "unknown flag";
    std::free(name);
    return text;
}

}  // namespace

// What the C callbacks need: the system, the regime being integrated, the
// first exception a callback caught, and the last message CVODE reported
// (instead of letting it print to stderr).
struct CallbackData {
    const DynamicSystem* system = nullptr;
    Regime regime;
    std::size_t size = 0;
    std::vector<double> jacobian;  // row-major, size^2
    std::exception_ptr error;
    std::string last_message;
};

namespace {

// Run a callback's body; an exception is kept for the caller and CVODE gets
// an unrecoverable failure code.
template <class Body>
int guarded(void* user_data, Body&& body) {
    auto* data = static_cast<CallbackData*>(user_data);
    try {
        return body(*data);
    } catch (...) {
        if (!data->error) data->error = std::current_exception();
        return -1;
    }
}

bool all_finite(const double* x, std::size_t n) {
    return std::all_of(x, x + n, [](double v) { return std::isfinite(v); });
}

int right_hand_side(double t, N_Vector y, N_Vector ydot, void* user_data) {
    return guarded(user_data, [&](CallbackData& data) {
        const double* x = N_VGetArrayPointer(y);
        if (!all_finite(x, data.size)) return 1;  // recoverable: CVODE retries with a smaller step
        double* dxdt = N_VGetArrayPointer(ydot);
        data.system->derivatives(t, data.regime, {x, data.size}, {dxdt, data.size});
        return all_finite(dxdt, data.size) ? 0 : 1;
    });
}

int jacobian(double t, N_Vector y, N_Vector, SUNMatrix J, void* user_data, N_Vector, N_Vector, N_Vector) {
    return guarded(user_data, [&](CallbackData& data) {
        const double* x = N_VGetArrayPointer(y);
        const std::size_t n = data.size;
        if (!data.system->jacobian(t, data.regime, {x, n}, data.jacobian)) return -1;
        for (std::size_t i = 0; i < n; ++i) {
            for (std::size_t j = 0; j < n; ++j) {
                SM_ELEMENT_D(J, static_cast<sunindextype>(i), static_cast<sunindextype>(j)) = data.jacobian[i * n + j];
            }
        }
        return all_finite(data.jacobian.data(), n * n) ? 0 : 1;
    });
}

int event_functions(double t, N_Vector y, double* g, void* user_data) {
    return guarded(user_data, [&](CallbackData& data) {
        const double* x = N_VGetArrayPointer(y);
        data.system->events(t, data.regime, {x, data.size}, {g, data.system->event_count()});
        return 0;
    });
}

void keep_error_message(int, const char*, const char*, char* message, void* user_data) {
    try {
        static_cast<CallbackData*>(user_data)->last_message = message;
    } catch (...) {
        // Out of memory for the text: the flag name alone is reported.
    }
}

class CvodeDenseStep final : public DenseStep {
public:
    CvodeDenseStep(void* mem, N_Vector work, std::size_t size) : mem_(mem), work_(work), size_(size) {}
    void state_at(double t, std::span<double> x) const override {
        const int flag = CVodeGetDky(mem_, t, 0, work_);
        if (flag != CV_SUCCESS) throw NumericalError("CVodeGetDky: " + flag_name(flag), t);
        const double* y = N_VGetArrayPointer(work_);
        std::copy(y, y + size_, x.begin());
    }

private:
    void* mem_;
    N_Vector work_;
    std::size_t size_;
};

}  // namespace

// Everything CVODE needs for one state size, method and iteration, made once
// and reused by every run of the same (CVodeReInit starts a new run).
struct CvodeWorkspace {
    CvodeWorkspace(std::size_t n, IntegratorMethod m, NonlinearIteration i)
        : size(n), method(m), iteration(i), context(new_context(), "SUNContext_Create"),
          y(N_VNew_Serial(static_cast<sunindextype>(n), context.get()), "N_VNew_Serial"),
          interpolated(N_VNew_Serial(static_cast<sunindextype>(n), context.get()), "N_VNew_Serial"),
          tolerance(N_VNew_Serial(static_cast<sunindextype>(n), context.get()), "N_VNew_Serial"),
          cvode(CVodeCreate(m == IntegratorMethod::cvode_bdf ? CV_BDF : CV_ADAMS, context.get()), "CVodeCreate"),
          matrix(SUNDenseMatrix(static_cast<sunindextype>(n), static_cast<sunindextype>(n), context.get()),
                 "SUNDenseMatrix"),
          // Adams with CVODE's default Newton iteration needs a linear solver too.
          solver(SUNLinSol_Dense(y.get(), matrix.get(), context.get()), "SUNLinSol_Dense"),
          step(cvode.get(), interpolated.get(), n) {
        data.size = n;
        data.jacobian.resize(n * n);
        // Anderson acceleration off (m = 0): the plain functional iteration.
        if (i == NonlinearIteration::fixed_point)
            fixed_point.emplace(SUNNonlinSol_FixedPoint(y.get(), 0, context.get()), "SUNNonlinSol_FixedPoint");
    }

    std::size_t size;
    IntegratorMethod method;
    NonlinearIteration iteration;
    SundialsContext context;
    SerialVector y, interpolated, tolerance;
    // Fixed-point iteration only; declared before the CVODE memory that
    // refers to it, so that it is freed after it.
    std::optional<NonlinearSolver> fixed_point;
    CvodeMemory cvode;
    DenseMatrix matrix;
    DenseLinearSolver solver;
    CvodeDenseStep step;
    CallbackData data;
    std::vector<int> roots;
    bool initialised = false;
};

void prepare_cvode_workspace(std::unique_ptr<CvodeWorkspace>& workspace, std::size_t size, IntegratorMethod method,
                             NonlinearIteration iteration) {
    if (!workspace || workspace->size != size || workspace->method != method || workspace->iteration != iteration) {
        workspace.reset();  // free the old one first
        workspace = std::make_unique<CvodeWorkspace>(size, method, iteration);
    }
}

namespace {

// One run on a workspace: the loop over intervals and events.
class CvodeRun {
public:
    CvodeRun(CvodeWorkspace& w, const DynamicSystem& system, const IntegratorSettings& settings, StepSink& sink)
        : w_(w), mem_(w.cvode.get()), settings_(settings), sink_(sink), events_(system.event_count()) {
        w_.data.system = &system;
        w_.data.error = nullptr;
        w_.data.last_message.clear();
        w_.roots.resize(events_);
    }

    IntegrationStats run(std::span<const double> x0, std::span<const double> breaks,
                         const std::vector<double>& atol) {
        const DynamicSystem& system = *w_.data.system;
        t_ = breaks.front();
        std::copy(x0.begin(), x0.end(), N_VGetArrayPointer(w_.y.get()));
        w_.data.regime = Regime{0, system.initial_mode(x0)};
        if (!w_.initialised) {
            check(CVodeSetErrHandlerFn(mem_, keep_error_message, &w_.data), "CVodeSetErrHandlerFn");
            check(CVodeInit(mem_, right_hand_side, t_, w_.y.get()), "CVodeInit");
            check(CVodeSetUserData(mem_, &w_.data), "CVodeSetUserData");
            if (w_.fixed_point) {
                check(CVodeSetNonlinearSolver(mem_, w_.fixed_point->get()), "CVodeSetNonlinearSolver");
            } else {
                check(CVodeSetLinearSolver(mem_, w_.solver.get(), w_.matrix.get()), "CVodeSetLinearSolver");
            }
            w_.initialised = true;
        } else {
            check(CVodeReInit(mem_, t_, w_.y.get()), "CVodeReInit");
        }
        set_tolerances(atol);
        // Every run sets it: the workspace may come from a run with another cap.
        const int own_order = w_.method == IntegratorMethod::cvode_bdf ? 5 : 12;
        if (settings_.max_order < 0 || settings_.max_order > own_order)
            throw UsageError("IntegratorSettings::max_order must lie between 1 and " +
                             std::to_string(own_order) + " (0: the method's own)");
        check(CVodeSetMaxOrd(mem_, settings_.max_order > 0 ? settings_.max_order : own_order), "CVodeSetMaxOrd");
        // Newton iteration: the analytic Jacobian when the system has one
        // (asked once, at the start); otherwise CVODE's own difference quotients.
        if (!w_.fixed_point) {
            const bool analytic = system.jacobian(t_, w_.data.regime, x0, w_.data.jacobian);
            check(CVodeSetJacFn(mem_, analytic ? jacobian : nullptr), "CVodeSetJacFn");
        }
        check(CVodeRootInit(mem_, static_cast<int>(events_), events_ > 0 ? event_functions : nullptr), "CVodeRootInit");

        for (std::size_t k = 0; k + 1 < breaks.size(); ++k) {
            w_.data.regime.interval = k;
            if (k > 0) reinit();  // restart at the break
            if (!integrate_to(breaks[k + 1])) break;
            t_ = breaks[k + 1];
        }
        add_counters();
        return stats_;
    }

    double time_reached() const { return t_; }

private:
    void check(int flag, const char* call) {
        if (w_.data.error) rethrow_from_system(w_.data.error, t_);
        if (flag < 0) {
            std::string message = std::string(call) + " returned " + flag_name(flag);
            if (!w_.data.last_message.empty()) message += ": " + w_.data.last_message;
            throw NumericalError(message, t_);
        }
    }

    void set_tolerances(const std::vector<double>& atol) {
        const bool one_value = std::all_of(atol.begin(), atol.end(), [&](double a) { return a == atol.front(); });
        if (one_value) {
            check(CVodeSStolerances(mem_, settings_.relative_tolerance, atol.front()), "CVodeSStolerances");
        } else {
            std::copy(atol.begin(), atol.end(), N_VGetArrayPointer(w_.tolerance.get()));
            check(CVodeSVtolerances(mem_, settings_.relative_tolerance, w_.tolerance.get()), "CVodeSVtolerances");
        }
    }

    void reinit() {
        add_counters();
        check(CVodeReInit(mem_, t_, w_.y.get()), "CVodeReInit");
    }

    // Returns false when an event stopped the run.
    bool integrate_to(double t_stop) {
        // Set for every interval: the step limits and the stop time.
        check(CVodeSetMaxNumSteps(mem_, 1'000'000), "CVodeSetMaxNumSteps");
        check(CVodeSetMaxStep(mem_, std::isfinite(settings_.max_step) ? settings_.max_step : 0.0), "CVodeSetMaxStep");
        check(CVodeSetStopTime(mem_, t_stop), "CVodeSetStopTime");
        ++stats_.restarts;
        int tiny_steps_in_a_row = 0;
        while (t_ < t_stop) {
            if (++steps_taken_ > settings_.max_steps) throw NumericalError(step_cap_message(settings_.max_steps), t_);
            const double t_before = t_;
            const int flag = CVode(mem_, t_stop, w_.y.get(), &t_, CV_ONE_STEP);
            if (flag < 0) {
                // CVODE leaves t at its start on failure: report how far it got.
                double reached = t_before;
                if (CVodeGetCurrentTime(mem_, &reached) == CV_SUCCESS) t_ = std::max(t_before, reached);
            }
            check(flag, "CVode");
            int order = 0;
            check(CVodeGetLastOrder(mem_, &order), "CVodeGetLastOrder");
            stats_.highest_order = std::max(stats_.highest_order, order);
            // One-step mode has no step budget per call: stop a solver that only
            // creeps towards a point it cannot pass (a singularity, say).
            if (t_ - t_before < 1e-12 * std::max(1.0, std::fabs(t_))) {
                if (++tiny_steps_in_a_row > 1000) {
                    throw NumericalError("CVODE cannot get past this time (step size below 1e-12 s)", t_);
                }
            } else {
                tiny_steps_in_a_row = 0;
            }
            w_.step.t_begin = t_before;
            w_.step.t_end = t_;
            w_.step.regime = w_.data.regime;
            sink_.on_step(w_.step);
            if (flag == CV_ROOT_RETURN && !handle_event(t_stop)) return false;
        }
        return true;
    }

    // At a root CVODE has found: ask the system, restart when it says so.
    bool handle_event(double t_stop) {
        check(CVodeGetRootInfo(mem_, w_.roots.data()), "CVodeGetRootInfo");
        const auto found = std::find_if(w_.roots.begin(), w_.roots.end(), [](int r) { return r != 0; });
        if (found == w_.roots.end()) return true;
        EventRecord record;
        record.time = t_;
        record.index = static_cast<std::size_t>(found - w_.roots.begin());
        record.direction = *found > 0 ? 1 : -1;
        record.before = w_.data.regime;
        Regime after = w_.data.regime;
        const double* x = N_VGetArrayPointer(w_.y.get());
        record.action = w_.data.system->on_event(t_, {x, w_.data.size}, record.index, record.direction, after);
        record.after = after;
        ++stats_.events;
        w_.data.regime = after;
        sink_.on_event(record);
        if (record.action == EventAction::stop) return false;
        if (record.action == EventAction::restart) {
            reinit();
            check(CVodeSetStopTime(mem_, t_stop), "CVodeSetStopTime");
            ++stats_.restarts;
        }
        return true;
    }

    void add_counters() {
        long steps = 0, evaluations = 0, test_failures = 0;
        check(CVodeGetNumSteps(mem_, &steps), "CVodeGetNumSteps");
        check(CVodeGetNumRhsEvals(mem_, &evaluations), "CVodeGetNumRhsEvals");
        check(CVodeGetNumErrTestFails(mem_, &test_failures), "CVodeGetNumErrTestFails");
        stats_.steps += steps;
        stats_.rhs_evaluations += evaluations;
        stats_.rejected_steps += test_failures;
    }

    CvodeWorkspace& w_;
    void* mem_;
    const IntegratorSettings& settings_;
    StepSink& sink_;
    std::size_t events_;
    IntegrationStats stats_;
    double t_ = 0;
    long steps_taken_ = 0;
};

}  // namespace

IntegrationStats integrate_cvode(CvodeWorkspace& workspace, const DynamicSystem& system, std::span<const double> x0,
                                 std::span<const double> breaks, const IntegratorSettings& settings,
                                 const std::vector<double>& absolute_tolerance, StepSink& sink) {
    CvodeRun run(workspace, system, settings, sink);
    try {
        return run.run(x0, breaks, absolute_tolerance);
    } catch (...) {
        // An exception from the system (kept by a callback, or thrown by
        // on_event) wins over the CVODE failure it caused.
        if (workspace.data.error) rethrow_from_system(workspace.data.error, run.time_reached());
        rethrow_from_system(std::current_exception(), run.time_reached());
    }
}

}  // namespace detail

Integrator::Integrator() = default;
Integrator::~Integrator() = default;

}  // namespace plumb
