#include "input/document_count.hpp"

#include <yaml-cpp/eventhandler.h>
#include <yaml-cpp/yaml.h>

#include <algorithm>
#include <sstream>

#include "input/input_bounds.hpp"
#include "input/yaml_marks.hpp"
#include "plumb/errors.hpp"

namespace plumb::input {

namespace {

// Thrown out of the parse when a collection opens past max_nesting levels, so
// that the parser never recurses deeper than that.
struct TooDeep {
    YAML::Mark mark;
};

// Counts the documents of a YAML text, stopping at the second. yaml-cpp 0.7's
// LoadAll never ends on a ',' outside any flow collection (it yields an empty
// document there without moving on, until memory runs out), so the documents
// are counted here, one bounded step at a time, before anything is loaded.
class DocumentCounter final : public YAML::EventHandler {
public:
    int documents = 0;
    YAML::Mark second_start;
    void OnDocumentStart(const YAML::Mark& mark) override {
        if (++documents == 2) second_start = mark;
    }
    void OnDocumentEnd() override {}
    void OnNull(const YAML::Mark&, YAML::anchor_t) override {}
    void OnAlias(const YAML::Mark&, YAML::anchor_t) override {}
    void OnScalar(const YAML::Mark&, const std::string&, YAML::anchor_t, const std::string&) override {}
    void OnSequenceStart(const YAML::Mark& mark, const std::string&, YAML::anchor_t,
                         YAML::EmitterStyle::value) override {
        open(mark);
    }
    void OnSequenceEnd() override { --depth_; }
    void OnMapStart(const YAML::Mark& mark, const std::string&, YAML::anchor_t, YAML::EmitterStyle::value) override {
        open(mark);
    }
    void OnMapEnd() override { --depth_; }

private:
    void open(const YAML::Mark& mark) {
        if (++depth_ > max_nesting) throw TooDeep{mark};
    }
    int depth_ = 0;
};

}  // namespace

void require_one_shallow_document(const std::string& file, const std::string& yaml_text) {
    const auto fail = [&](const YAML::Mark& mark, const std::string& problem) {
        throw InputError(SourceLocation{file, line_of(mark), column_of(mark), ""}, problem);
    };
    std::istringstream in(yaml_text);
    YAML::Parser parser(in);
    DocumentCounter counter;
    try {
        while (counter.documents < 2 && parser.HandleNextDocument(counter)) {
        }
    } catch (const TooDeep& deep) {
        fail(deep.mark, "malformed YAML: lists and maps nested more than " + std::to_string(max_nesting) +
                            " levels deep; a job file needs four");
    }
    if (counter.documents < 2) return;
    const auto at = static_cast<std::size_t>(std::max(0, counter.second_start.pos));
    if (at < yaml_text.size() && yaml_text[at] == ',') {
        fail(counter.second_start, "malformed YAML: a ',' outside any [list] or {map}");
    }
    fail(counter.second_start, "the file holds more than one YAML document; a job file holds exactly one job");
}

}  // namespace plumb::input
