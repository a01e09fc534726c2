// Plain-text layout (text_layout.hpp).
#include "plumb/text_layout.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>

namespace plumb::text {

// Numbers as text.

std::string printf_string(const char* format, double v) {
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, format, v == 0.0 ? 0.0 : v);
    return buffer;
}

std::string num(double v) { return printf_string("%.6g", v); }

namespace {
std::string with_unit(std::string text, Dimension d, UnitSystem u) {
    const std::string_view symbol = unit_symbol(d, u);
    if (!symbol.empty()) {
        text += ' ';
        text += symbol;
    }
    return text;
}
}  // namespace

std::string qty(double si, Dimension d, UnitSystem u) { return with_unit(num(shown_value(si, d, u)), d, u); }

std::string seconds(double t) { return num(t) + " s"; }

// Large values keep their whole digits rather than turn to exponent form
// (17060 lbf, not 1.706e+04 lbf).
std::string num4(double v) {
    if (std::fabs(v) >= 1e4 && std::fabs(v) < 1e15) return printf_string("%.0f", v);
    return printf_string("%.4g", v);
}

std::string qty4(double si, Dimension d, UnitSystem u) { return with_unit(num4(shown_value(si, d, u)), d, u); }

std::string percent4(double fraction) { return num4(fraction * 100.0) + " %"; }

std::string percent(double fraction) { return printf_string("%.1f", fraction * 100.0) + " %"; }

// Plain-text layout helpers.

std::string wrap(std::string_view text, std::string_view first, std::string_view rest, std::size_t width) {
    std::string out;
    std::string line(first);
    bool line_has_word = false;
    std::size_t i = 0;
    while (i < text.size()) {
        while (i < text.size() && text[i] == ' ') ++i;
        std::size_t j = i;
        while (j < text.size() && text[j] != ' ') ++j;
        if (j == i) break;
        const std::string_view word = text.substr(i, j - i);
        if (line_has_word && line.size() + 1 + word.size() > width) {
            out += line;
            out += '\n';
            line = std::string(rest);
            line_has_word = false;
        }
        if (line_has_word) line += ' ';
        line += word;
        line_has_word = true;
        i = j;
    }
    out += line;
    out += '\n';
    return out;
}

std::string heading(std::string_view title) {
    std::string out = "\n";
    out.append(title);
    out += '\n';
    out.append(title.size(), '-');
    out += '\n';
    return out;
}

TextTable::TextTable(std::vector<std::string> header, std::string align) : align_(std::move(align)) {
    rows_.push_back(std::move(header));
}

std::string TextTable::render(std::string_view indent) const {
    std::vector<std::size_t> widths;
    for (const auto& row : rows_) {
        if (widths.size() < row.size()) widths.resize(row.size(), 0);
        for (std::size_t c = 0; c < row.size(); ++c) widths[c] = std::max(widths[c], row[c].size());
    }
    std::string out;
    for (std::size_t r = 0; r < rows_.size(); ++r) {
        std::string line(indent);
        for (std::size_t c = 0; c < rows_[r].size(); ++c) {
            const std::string& cell = rows_[r][c];
            const std::string pad(widths[c] - cell.size(), ' ');
            const bool right = c < align_.size() && align_[c] == 'r';
            if (c > 0) line += "  ";
            line += right ? pad + cell : cell + pad;
        }
        while (!line.empty() && line.back() == ' ') line.pop_back();
        out += line + "\n";
        if (r == 0) {
            std::size_t total = 0;
            for (std::size_t c = 0; c < widths.size(); ++c) total += widths[c] + (c > 0 ? 2 : 0);
            out += std::string(indent) + std::string(total, '-') + "\n";
        }
    }
    return out;
}

std::string field(std::string_view label, std::string_view value) {
    std::string line = "  " + std::string(label) + ":";
    if (line.size() < 26) line.resize(26, ' ');
    else line += ' ';
    return wrap(value, line, std::string(26, ' '));
}

std::string join(const std::vector<std::string>& parts, std::string_view separator) {
    std::string out;
    for (std::size_t i = 0; i < parts.size(); ++i) {
        if (i > 0) out += separator;
        out += parts[i];
    }
    return out;
}

}  // namespace plumb::text
