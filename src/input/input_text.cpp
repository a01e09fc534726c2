#include "input/input_text.hpp"

#include "plumb/utf8.hpp"

#include <charconv>
#include <cmath>
#include <cstdio>
#include <numbers>
#include <system_error>

namespace plumb::input {

namespace {

constexpr double pi = std::numbers::pi;

// C0 controls but the tab, DEL, and the C1 controls U+0080..U+009F.
bool is_control(std::string_view text, std::size_t i, std::size_t length) {
    const auto b0 = static_cast<unsigned char>(text[i]);
    if (length == 1) return (b0 < 0x20 && b0 != '\t') || b0 == 0x7F;
    return length == 2 && b0 == 0xC2 && static_cast<unsigned char>(text[i + 1]) < 0xA0;
}

}  // namespace

std::string_view trim(std::string_view s) {
    while (!s.empty() && (s.front() == ' ' || s.front() == '\t' || s.front() == '\r')) s.remove_prefix(1);
    while (!s.empty() && (s.back() == ' ' || s.back() == '\t' || s.back() == '\r')) s.remove_suffix(1);
    return s;
}

// A plain decimal number and nothing else ("1.15", "-2", "1e-8"); none otherwise.
std::optional<double> plain_number(std::string_view text) {
    text = trim(text);
    if (!text.empty() && text.front() == '+') text.remove_prefix(1);
    if (text.empty()) return std::nullopt;
    double value = 0;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
    if (ec != std::errc() || end != text.data() + text.size() || !std::isfinite(value))
        return std::nullopt;
    return value;
}

// A plain whole number ("4", "+4", "-1"); none otherwise.
std::optional<long long> whole_number(std::string_view text) {
    text = trim(text);
    if (!text.empty() && text.front() == '+') text.remove_prefix(1);
    if (text.empty()) return std::nullopt;
    long long value = 0;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), value);
    if (ec != std::errc() || end != text.data() + text.size()) return std::nullopt;
    return value;
}

std::string number_text(double v) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.6g", v);
    return buf;
}

// A value in the unit a planner reads most easily, for messages.
std::string show(double si, Dimension d) {
    switch (d) {
        case Dimension::angle: return number_text(si * 180 / pi) + " deg";
        case Dimension::angular_rate: return number_text(si * 180 / pi) + " deg/s";
        case Dimension::angular_acceleration: return number_text(si * 180 / pi) + " deg/s^2";
        case Dimension::angular_jerk: return number_text(si * 180 / pi) + " deg/s^3";
        case Dimension::ratio: return number_text(si * 100) + " %";
        case Dimension::force:
        case Dimension::load:
            return std::fabs(si) >= 1000 ? number_text(si / 1000) + " kN" : number_text(si) + " N";
        case Dimension::mass:
            return std::fabs(si) >= 1000 ? number_text(si / 1000) + " t" : number_text(si) + " kg";
        default: return number_text(si) + " " + std::string(si_unit(d));
    }
}

std::string expected_phrase(Dimension d) {
    std::string s = "expected " + std::string(dimension_name(d)) + " (" + accepted_units(d);
    if (d == Dimension::ratio) s += ", or a bare number as a fraction";
    return s + ")";
}

// True when the text of a quantity carries no unit (it ends in a digit or '.').
bool is_bare(const std::string& text) {
    const std::string_view t = trim(text);
    return !t.empty() && ((t.back() >= '0' && t.back() <= '9') || t.back() == '.');
}

std::string printable(std::string_view text) {
    std::string out;
    out.reserve(text.size());
    for (std::size_t i = 0; i < text.size();) {
        const std::size_t n = utf8_sequence_length(text, i);
        if (n == 0 || is_control(text, i, n) || text[i] == '\t') {
            out += '?';
            i += n == 0 ? 1 : n;
        } else {
            out.append(text.substr(i, n));
            i += n;
        }
    }
    return out;
}

std::string text_problem(std::string_view text) {
    for (std::size_t i = 0; i < text.size();) {
        const std::size_t n = utf8_sequence_length(text, i);
        if (n == 0)
            return "the text is not valid UTF-8 (byte " + std::to_string(i + 1) +
                   "); save the file as UTF-8";
        if (is_control(text, i, n))
            return "the text holds a control character (byte " + std::to_string(i + 1) +
                   "); remove it";
        i += n;
    }
    return "";
}

std::string_view without_bom(std::string_view text) {
    if (text.starts_with("\xEF\xBB\xBF")) text.remove_prefix(3);
    return text;
}

std::optional<int> first_lone_carriage_return(std::string_view text) {
    int line = 1;
    for (std::size_t i = 0; i < text.size(); ++i) {
        if (text[i] == '\n') ++line;
        if (text[i] == '\r' && (i + 1 == text.size() || text[i + 1] != '\n')) return line;
    }
    return std::nullopt;
}

}  // namespace plumb::input
