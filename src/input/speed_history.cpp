#include "input/speed_history.hpp"

#include <cmath>
#include <optional>

#include "input/input_bounds.hpp"
#include "input/input_text.hpp"
#include "plumb/errors.hpp"
#include "plumb/units.hpp"

namespace plumb::input {

namespace {

struct CsvField {
    std::string_view text;
    int column = 0;  // 1-based
};

std::vector<CsvField> split_fields(std::string_view line) {
    std::vector<CsvField> fields;
    std::size_t start = 0;
    while (true) {
        const std::size_t comma = line.find(',', start);
        const std::string_view raw = line.substr(start, comma == std::string_view::npos ? line.npos : comma - start);
        std::size_t lead = 0;
        while (lead < raw.size() && (raw[lead] == ' ' || raw[lead] == '\t')) ++lead;
        fields.push_back({trim(raw), static_cast<int>(start + lead + 1)});
        if (comma == std::string_view::npos) break;
        start = comma + 1;
    }
    return fields;
}

class CsvReader {
public:
    explicit CsvReader(std::string file) : file_(std::move(file)) {}

    [[noreturn]] void fail(int line, int column, const std::string& problem) const {
        // A damaged file must not reach the terminal as control characters.
        throw InputError(SourceLocation{printable(file_), line, column, ""}, printable(problem));
    }

    // Factor to SI of a header column "name [unit]"; the unit defaults to SI.
    double header_unit(const CsvField& f, int line, Dimension d, std::string_view column_name) const {
        const std::size_t open = f.text.find('[');
        const std::string_view name = trim(f.text.substr(0, open));
        if (name.empty() && open == std::string_view::npos)
            fail(line, f.column, "empty header for the " + std::string(column_name) + " column");
        if (plain_number(name))
            fail(line, f.column,
                 "the first line must be a header such as 'time [s], speed [m/s]', got the number '" +
                     std::string(name) + "'");
        if (open == std::string_view::npos) return 1.0;
        const std::size_t close = f.text.find(']', open);
        if (close == std::string_view::npos || !trim(f.text.substr(close + 1)).empty())
            fail(line, f.column,
                 "the unit of the " + std::string(column_name) + " column must be in square brackets at the end, like '" +
                     std::string(column_name) + " [" + std::string(si_unit(d)) + "]'");
        const std::string_view unit = trim(f.text.substr(open + 1, close - open - 1));
        if (unit.empty())
            fail(line, f.column, "empty unit in brackets for the " + std::string(column_name) + " column");
        if (plain_number(unit) || unit.front() == '-' || unit.front() == '+' ||
            (unit.front() >= '0' && unit.front() <= '9') || unit.front() == '.')
            fail(line, f.column, "the unit of the " + std::string(column_name) + " column must be a unit name, got '" +
                                     std::string(unit) + "'");
        try {
            return parse_quantity("1 " + std::string(unit), d);
        } catch (const UnitError& e) {
            fail(line, f.column, std::string(column_name) + " column unit: " + e.what());
        }
    }

    double value(const CsvField& f, int line, std::string_view column_name) const {
        const std::optional<double> v = plain_number(f.text);
        if (!v)
            fail(line, f.column,
                 "expected a finite number for the " + std::string(column_name) + ", got '" +
                     std::string(f.text) + "' (units belong in the header)");
        return *v;
    }

    std::vector<SpeedSample> parse(std::string_view content) const {
        content = without_bom(content);
        if (const std::optional<int> line = first_lone_carriage_return(content))
            fail(*line, 0,
                 "this file ends its lines with a carriage return alone (old Mac line ends); "
                 "save it with LF or CRLF line ends");
        struct Row {
            SpeedSample sample;
            int line;
            int time_column, speed_column;
        };
        std::vector<Row> rows;
        bool header_seen = false;
        double time_factor = 1, speed_factor = 1;

        std::size_t pos = 0;
        int line_number = 0;
        int last_line = 0;
        while (pos <= content.size()) {
            const std::size_t nl = content.find('\n', pos);
            const std::string_view line =
                content.substr(pos, nl == std::string_view::npos ? std::string_view::npos : nl - pos);
            pos = nl == std::string_view::npos ? content.size() + 1 : nl + 1;
            ++line_number;
            const std::string_view t = trim(line);
            if (t.empty() || t.front() == '#') continue;
            last_line = line_number;
            const std::vector<CsvField> fields = split_fields(line);
            if (fields.size() != 2)
                fail(line_number, 0,
                     "expected 2 columns (time, speed) separated by a comma, found " +
                         std::to_string(fields.size()));
            if (!header_seen) {
                time_factor = header_unit(fields[0], line_number, Dimension::time, "time");
                speed_factor = header_unit(fields[1], line_number, Dimension::speed, "speed");
                header_seen = true;
                continue;
            }
            Row r;
            r.line = line_number;
            r.time_column = fields[0].column;
            r.speed_column = fields[1].column;
            r.sample.time = value(fields[0], line_number, "time") * time_factor;
            r.sample.speed = value(fields[1], line_number, "speed") * speed_factor;
            if (!std::isfinite(r.sample.time) || !std::isfinite(r.sample.speed))
                fail(line_number, 0, "number out of range");
            if (rows.size() == max_speed_history_rows)
                fail(line_number, 0,
                     "more than " + std::to_string(max_speed_history_rows) +
                         " rows: thin the log, or cut it to the lift (see docs/job-file.md, \"Bounds and caps\")");
            rows.push_back(r);
        }

        if (!header_seen)
            fail(0, 0,
                 "the speed history is empty: expected a header such as 'time [s], speed [m/s]' "
                 "and at least 2 rows");
        if (rows.size() < 2)
            fail(last_line, 0,
                 "the speed history needs at least 2 rows, found " + std::to_string(rows.size()));

        const Row& first = rows.front();
        if (first.sample.time < 0)
            fail(first.line, first.time_column,
                 "the first time must be 0 s or later, got " + show(first.sample.time, Dimension::time));
        for (std::size_t i = 0; i < rows.size(); ++i) {
            const Row& r = rows[i];
            if (std::fabs(r.sample.speed) > max_top_speed)
                fail(r.line, r.speed_column,
                     "implausible speed " + show(r.sample.speed, Dimension::speed) + " (more than " +
                         show(max_top_speed, Dimension::speed) +
                         "): check the unit in the header (a speed column without a unit is in m/s)");
            if (i == 0) continue;
            const Row& p = rows[i - 1];
            if (!(r.sample.time > p.sample.time))
                fail(r.line, r.time_column,
                     "time " + show(r.sample.time, Dimension::time) + " is not after " +
                         show(p.sample.time, Dimension::time) + " on line " + std::to_string(p.line) +
                         ": times must increase strictly");
            if (r.sample.time - p.sample.time < min_sample_interval)
                fail(r.line, r.time_column,
                     "time " + show(r.sample.time, Dimension::time) + " is less than " +
                         show(min_sample_interval, Dimension::time) + " after " +
                         show(p.sample.time, Dimension::time) + " on line " + std::to_string(p.line) +
                         ": rows closer than that are not a drive log (check the time unit)");
            const double a = (r.sample.speed - p.sample.speed) / (r.sample.time - p.sample.time);
            if (std::fabs(a) > max_acceleration)
                fail(r.line, r.speed_column,
                     "implausible acceleration " + show(std::fabs(a), Dimension::acceleration) +
                         " between lines " + std::to_string(p.line) + " and " + std::to_string(r.line) +
                         " (more than " + show(max_acceleration, Dimension::acceleration) +
                         "): check the units and the times");
        }
        if (first.sample.speed != 0)
            fail(first.line, first.speed_column,
                 "the speed in the first row must be 0 (the support starts at rest), got " +
                     show(first.sample.speed, Dimension::speed));
        const Row& last = rows.back();
        if (last.sample.time > max_motion_duration)
            fail(last.line, last.time_column,
                 "implausible speed history of " + show(last.sample.time, Dimension::time) + " (more than " +
                     show(max_motion_duration, Dimension::time) +
                     "): check the time unit in the header, or cut the log to the lift");
        if (last.sample.speed != 0)
            fail(last.line, last.speed_column,
                 "the speed in the last row must be 0 (the support ends at rest), got " +
                     show(last.sample.speed, Dimension::speed));

        std::vector<SpeedSample> samples;
        samples.reserve(rows.size());
        for (const Row& r : rows) samples.push_back(r.sample);
        return samples;
    }

private:
    std::string file_;
};

}  // namespace

std::vector<SpeedSample> parse_speed_history(std::string_view content, const std::string& file_name) {
    return CsvReader(file_name).parse(content);
}

}  // namespace plumb::input
