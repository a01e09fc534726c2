// SUNDIALS CVODE behind RAII owners, set up in the order of SUNDIALS' own C++
// examples: context, vector, solver memory, init, tolerances, user data,
// matrix, linear solver. Every return code is checked; a failure becomes a
// NumericalError with the time reached.
#include <cvode/cvode.h>
#include <nvector/nvector_serial.h>
#include <sunlinsol/sunlinsol_dense.h>
#include <sunmatrix/sunmatrix_dense.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <string>

#include "integrators_impl.hpp"
#include "plumb/errors.hpp"

namespace plumb::detail {
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

SUNContext new_context() {
    SUNContext ctx = nullptr;
    if (SUNContext_Create(nullptr, &ctx) != 0) return nullptr;
    return ctx;
}

// What the C callbacks need: the system, the interval being integrated, the
// last message CVODE reported (instead of letting it print to stderr).
struct CallbackData {
    const SecondOrderSystem* system;
    std::size_t interval = 0;
    std::size_t size = 0;
    std::string last_message;
};

int right_hand_side(double t, N_Vector y, N_Vector ydot, void* user_data) {
    auto* data = static_cast<CallbackData*>(user_data);
    const double* x = N_VGetArrayPointer(y);
    for (std::size_t i = 0; i < data->size; ++i) {
        if (!std::isfinite(x[i])) return 1;  // recoverable: CVODE retries with a smaller step
    }
    double* dxdt = N_VGetArrayPointer(ydot);
    data->system->derivatives(t, data->interval, {x, data->size}, {dxdt, data->size});
    for (std::size_t i = 0; i < data->size; ++i) {
        if (!std::isfinite(dxdt[i])) return 1;
    }
    return 0;
}

void keep_error_message(int, const char*, const char*, char* message, void* user_data) {
    static_cast<CallbackData*>(user_data)->last_message = message;
}

std::string flag_name(int flag) {
    char* name = CVodeGetReturnFlagName(flag);
    std::string text = name ? name : "unknown flag";
    std::free(name);
    return text;
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

IntegrationStats integrate_cvode(const SecondOrderSystem& system, std::span<const double> x0,
                                 std::span<const double> breaks, const IntegratorSettings& settings,
                                 StepSink& sink) {
    const auto n = static_cast<sunindextype>(x0.size());
    CallbackData data{&system, 0, x0.size(), {}};
    double t = breaks.front();
    auto check = [&](int flag, const char* call) {
        if (flag < 0) {
            std::string message = std::string(call) + " returned " + flag_name(flag);
            if (!data.last_message.empty()) message += ": " + data.last_message;
            throw NumericalError(message, t);
        }
    };

    const SundialsContext context(new_context(), "SUNContext_Create");
    const SerialVector y(N_VNew_Serial(n, context.get()), "N_VNew_Serial");
    const SerialVector interpolated(N_VNew_Serial(n, context.get()), "N_VNew_Serial");
    std::copy(x0.begin(), x0.end(), N_VGetArrayPointer(y.get()));
    const int method = settings.method == IntegratorMethod::cvode_bdf ? CV_BDF : CV_ADAMS;
    const CvodeMemory cvode(CVodeCreate(method, context.get()), "CVodeCreate");
    check(CVodeSetErrHandlerFn(cvode.get(), keep_error_message, &data), "CVodeSetErrHandlerFn");
    check(CVodeInit(cvode.get(), right_hand_side, t, y.get()), "CVodeInit");
    check(CVodeSStolerances(cvode.get(), settings.relative_tolerance, settings.absolute_tolerance),
          "CVodeSStolerances");
    check(CVodeSetUserData(cvode.get(), &data), "CVodeSetUserData");
    const DenseMatrix jacobian(SUNDenseMatrix(n, n, context.get()), "SUNDenseMatrix");
    // Adams with CVODE's default Newton iteration needs a linear solver too.
    const DenseLinearSolver solver(SUNLinSol_Dense(y.get(), jacobian.get(), context.get()), "SUNLinSol_Dense");
    check(CVodeSetLinearSolver(cvode.get(), solver.get(), jacobian.get()), "CVodeSetLinearSolver");

    IntegrationStats stats;
    CvodeDenseStep step(cvode.get(), interpolated.get(), x0.size());
    auto configure = [&](double t_stop) {
        // CVodeReInit clears these, so they are set again for every interval.
        check(CVodeSetMaxNumSteps(cvode.get(), 1'000'000), "CVodeSetMaxNumSteps");
        if (std::isfinite(settings.max_step)) check(CVodeSetMaxStep(cvode.get(), settings.max_step), "CVodeSetMaxStep");
        check(CVodeSetStopTime(cvode.get(), t_stop), "CVodeSetStopTime");
    };
    auto add_counters = [&] {
        long steps = 0, evaluations = 0, test_failures = 0;
        check(CVodeGetNumSteps(cvode.get(), &steps), "CVodeGetNumSteps");
        check(CVodeGetNumRhsEvals(cvode.get(), &evaluations), "CVodeGetNumRhsEvals");
        check(CVodeGetNumErrTestFails(cvode.get(), &test_failures), "CVodeGetNumErrTestFails");
        stats.steps += steps;
        stats.rhs_evaluations += evaluations;
        stats.rejected_steps += test_failures;
    };

    for (std::size_t k = 0; k + 1 < breaks.size(); ++k) {
        data.interval = k;
        const double t_stop = breaks[k + 1];
        if (k > 0) {
            add_counters();
            check(CVodeReInit(cvode.get(), t, y.get()), "CVodeReInit");  // restart at the break
        }
        configure(t_stop);
        ++stats.restarts;
        int tiny_steps_in_a_row = 0;
        while (t < t_stop) {
            const double t_before = t;
            check(CVode(cvode.get(), t_stop, y.get(), &t, CV_ONE_STEP), "CVode");
            // One-step mode has no step budget per call: stop a solver that only
            // creeps towards a point it cannot pass (a singularity, say).
            if (t - t_before < 1e-12 * std::max(1.0, std::fabs(t))) {
                if (++tiny_steps_in_a_row > 1000) {
                    throw NumericalError("CVODE cannot get past this time (step size below 1e-12 s)", t);
                }
            } else {
                tiny_steps_in_a_row = 0;
            }
            step.t_begin = t_before;
            step.t_end = t;
            step.interval = k;
            sink.on_step(step);
        }
        t = t_stop;
    }
    add_counters();
    return stats;
}

}  // namespace plumb::detail
