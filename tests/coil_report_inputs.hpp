// What the report tests of the coil demo share: the text of a report's
// tables, and the check that the report echoes cases/coil-transfer.yaml's
// inputs and limits as its file gives them.
#pragma once

#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "plumb_cli.hpp"
#include "xml_parse.hpp"

namespace plumb_test {

// Texts as one string, a line each.
inline std::string joined(const std::vector<std::string>& texts) {
    std::string all;
    for (const std::string& t : texts) all += t + "\n";
    return all;
}

// The coil demo's inputs and limits in a report's tables, in the report's SI
// units (36 m/min = 0.6 m/s; 25 t rated load; 6.5 t rope WLL).
inline void check_coil_inputs_echoed(const XmlDocument& doc) {
    const std::string inputs = joined(doc.values("//table[caption='Inputs as plumb read them']//td"));
    for (const char* given : {"total travel 18 m", "peak speed 0.6 m/s", "rope length 7.5 m", "4 parts of line",
                              "25 t at standard gravity", "mass 0.65 t", "length hook to load CG 1.6 m",
                              "mass 14 t", "radius of gyration 0.55 m", "9.80665 m/s^2"}) {
        INFO(given);
        CHECK(contains(inputs, given));
    }
    const std::string limits = joined(doc.values("//table[caption='Limits']//td"));
    for (const char* given : {"3 deg", "0.3 m", "0.05 m", "1.1"}) {
        INFO(given);
        CHECK(contains(limits, given));
    }
}

}  // namespace plumb_test
