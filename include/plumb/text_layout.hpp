// Plain-text layout for the terminal outputs: numbers as text, wrapped
// paragraphs, headings, aligned tables and "label: value" fields.
#pragma once

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include "plumb/output_units.hpp"

namespace plumb::text {

// printf of one double; -0 prints as 0.
std::string printf_string(const char* format, double v);
// Six significant digits: enough for any input a planner types, short enough to read.
std::string num(double v);
// A value with its unit symbol, converted to the unit system.
std::string qty(double si, Dimension d, UnitSystem u);
std::string seconds(double t);         // "12.5 s"
std::string percent(double fraction);  // "12.5 %"
// Four significant digits, for the verdict table a planner reads at a glance
// (the JSON and CSV keep full precision).
std::string num4(double v);
std::string qty4(double si, Dimension d, UnitSystem u);
std::string percent4(double fraction);  // "87.34 %"

// Wrap text to width columns; the first line starts with first, the rest with rest.
std::string wrap(std::string_view text, std::string_view first, std::string_view rest,
                 std::size_t width = 78);
// A title underlined with dashes, after a blank line.
std::string heading(std::string_view title);
// A "label: value" line with the values lined up.
std::string field(std::string_view label, std::string_view value);
std::string join(const std::vector<std::string>& parts, std::string_view separator);

// A fixed-width table: first column left-aligned, the others as given ('l' or 'r').
class TextTable {
public:
    TextTable(std::vector<std::string> header, std::string align);
    void add(std::vector<std::string> row) { rows_.push_back(std::move(row)); }
    std::string render(std::string_view indent = "  ") const;

private:
    std::string align_;
    std::vector<std::vector<std::string>> rows_;
};

}  // namespace plumb::text
