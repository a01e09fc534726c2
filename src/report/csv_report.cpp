// The CSV time series of a lift check: time, then one column per quantity of
// the quantity table with a series record, in table order.
#include <string>

#include "plumb/report.hpp"
#include "plumb/text_layout.hpp"

namespace plumb {

std::string format_csv(const LiftAssessment& a, UnitSystem u) {
    std::string out = "time [" + json_unit(Dimension::time, u) + "]";
    for (const QuantitySpec& q : quantity_table()) {
        if (!has_record(q, Record::series) || !reported_for(q, a.job.motion)) continue;
        out += ',';
        out += q.key;
        out += " [";
        out += json_unit(q.dimension, u);
        out += ']';
    }
    out += '\n';
    const LiftScales scales = a.prediction.scales();
    for (const Observation& o : a.prediction.simulation.trace) {
        out += text::printf_string("%.9g", shown_value(o.time, Dimension::time, u));
        for (const QuantitySpec& q : quantity_table()) {
            if (!has_record(q, Record::series) || !reported_for(q, a.job.motion)) continue;
            out += ',';
            out += text::printf_string("%.9g", shown_value(series_value(o, q.id, scales), q.dimension, u));
        }
        out += '\n';
    }
    return out;
}

}  // namespace plumb
