#include "input/key_suggestions.hpp"

#include <algorithm>
#include <limits>
#include <vector>

namespace plumb::input {

namespace {

std::string lower(std::string_view s) {
    std::string out(s);
    for (char& c : out) {
        if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
        if (c == '-' || c == ' ') c = '_';
    }
    return out;
}

// Edit distance with adjacent transpositions (optimal string alignment), so
// "lenght" is one edit from "length".
std::size_t edit_distance(std::string_view a, std::string_view b) {
    const std::size_t n = a.size(), m = b.size();
    std::vector<std::vector<std::size_t>> d(n + 1, std::vector<std::size_t>(m + 1, 0));
    for (std::size_t i = 0; i <= n; ++i) d[i][0] = i;
    for (std::size_t j = 0; j <= m; ++j) d[0][j] = j;
    for (std::size_t i = 1; i <= n; ++i) {
        for (std::size_t j = 1; j <= m; ++j) {
            const std::size_t cost = a[i - 1] == b[j - 1] ? 0 : 1;
            d[i][j] = std::min({d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost});
            if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1])
                d[i][j] = std::min(d[i][j], d[i - 2][j - 2] + 1);
        }
    }
    return d[n][m];
}

}  // namespace

std::string join(const KeyList& keys) {
    std::string out;
    for (std::string_view k : keys) {
        if (!out.empty()) out += ", ";
        out += k;
    }
    return out;
}

std::optional<std::string_view> nearest(std::string_view word, const KeyList& candidates) {
    if (word.size() > 64) return std::nullopt;  // no key is that long; spare the quadratic distance
    const std::string w = lower(word);
    std::optional<std::string_view> best;
    std::size_t best_distance = std::numeric_limits<std::size_t>::max();
    for (std::string_view c : candidates) {
        const std::size_t dist = edit_distance(w, lower(c));
        if (dist < best_distance) best_distance = dist, best = c;
    }
    const std::size_t allowed = std::clamp<std::size_t>(w.size() / 3, 1, 3);
    if (best && best_distance <= allowed) return best;
    return std::nullopt;
}

}  // namespace plumb::input
