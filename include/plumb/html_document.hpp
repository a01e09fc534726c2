// A self-contained HTML document for a lift-plan attachment: inline CSS,
// inline SVG, no scripts, no fonts or links from anywhere else; print styles
// so that a browser's print to PDF on A4 or US Letter makes the attachment.
// The output is also well-formed XML (void elements closed with "/>"), so a
// test can parse it with an XML parser. Pure formatting: the builder collects
// text and finish() returns it.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "plumb/assessment.hpp"

namespace plumb {

struct ReportTitleBlock {
    std::string job_title;
    std::string reference;
    std::string date;            // as the caller wants it shown, e.g. "2026-12-02 06:10 UTC"
    std::string plumb_version;
    std::string job_file;        // the file's name as given
    std::string job_file_sha256;
    std::string made_by{};       // the command that made the document, e.g. "plumb advise"; empty: no row
};

struct VerdictBanner {
    Verdict verdict = Verdict::fail;  // the words come from verdict_word() (assessment.hpp)
    int not_checked = 0;                   // checks that could not be made
    std::vector<std::string> driven_by;    // the checks that set the verdict
    std::string summary;                   // one sentence, optional
};

enum class ColumnAlign { left, right };

struct TableColumn {
    std::string heading;
    ColumnAlign align = ColumnAlign::left;
};

// A table of text cells. A row's `mark` (empty, "pass", "caution", "fail",
// "not-checked") adds a class to the row for its shading; the words in the
// cells must carry the meaning on their own.
struct ReportTable {
    std::string caption;
    std::vector<TableColumn> columns;
    struct Row {
        std::vector<std::string> cells;
        std::string mark;
    };
    std::vector<Row> rows;
    // Throws std::invalid_argument if the row's cell count differs from the columns'.
    void add_row(std::vector<std::string> cells, std::string mark = {});
};

enum class PaperSize {
    either,  // no @page size: the printer's paper; margins suit both A4 and US Letter
    a4,
    us_letter,
};

enum class SectionStart { new_page, flow };

class HtmlDocument {
public:
    HtmlDocument(std::string_view document_title, PaperSize paper = PaperSize::either);

    void title_block(const ReportTitleBlock& t);
    void verdict_banner(const VerdictBanner& v);
    // Sections do not nest; begin_section closes an open one.
    void begin_section(std::string_view heading, SectionStart start = SectionStart::flow);
    void end_section();
    void paragraph(std::string_view text);
    void table(const ReportTable& t);
    // svg: an <svg> element made by SvgWriter (inserted as it is).
    void figure(const std::string& svg, std::string_view caption);
    void cautions_and_assumptions(const std::vector<std::string>& cautions, const std::vector<std::string>& assumptions);
    void reviewer_sign_off();

    std::string finish();

private:
    std::string body_;
    std::string title_;
    PaperSize paper_;
    bool in_section_ = false;
};

}  // namespace plumb
