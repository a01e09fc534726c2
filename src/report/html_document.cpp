#include "plumb/html_document.hpp"

#include <algorithm>
#include <cctype>
#include <stdexcept>

#include "plumb/svg_plot.hpp"

namespace plumb {
namespace {

// The look: a plain engineering document. Black text on white, thin rules,
// one accent per verdict that is never the only carrier of meaning.
constexpr std::string_view style_sheet = R"css(
:root { --rule: #9a9a9a; --faint: #f2f2f2; --ink: #141414; }
* { box-sizing: border-box; }
html { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
body { margin: 0 auto; max-width: 190mm; padding: 8mm 6mm; color: var(--ink); background: #fff;
       font: 10.5pt/1.4 "DejaVu Sans", "Liberation Sans", Arial, Helvetica, sans-serif; }
h1 { font-size: 17pt; margin: 0 0 2mm; letter-spacing: 0.01em; }
h2 { font-size: 12.5pt; margin: 7mm 0 2.5mm; padding-bottom: 1mm; border-bottom: 1.5px solid var(--ink);
     break-after: avoid; page-break-after: avoid; }
p { margin: 0 0 2.5mm; }
.title-block { width: 100%; border-collapse: collapse; border: 1.5px solid var(--ink); margin-bottom: 5mm; }
.title-block th, .title-block td { border: 1px solid var(--rule); padding: 1.2mm 2mm; text-align: left;
     vertical-align: top; }
.title-block th { width: 32%; background: var(--faint); font-weight: normal; font-size: 9pt; }
.title-block td { font-weight: bold; }
.title-block .hash { font-family: "DejaVu Sans Mono", "Liberation Mono", monospace; font-weight: normal;
     font-size: 8.5pt; word-break: break-all; }
.verdict { border: 2px solid var(--ink); border-left-width: 9mm; padding: 3mm 4mm; margin: 4mm 0 5mm; }
.verdict .word { font-size: 20pt; font-weight: bold; letter-spacing: 0.06em; margin: 0; }
.verdict .word .qualifier { display: block; font-size: 12pt; letter-spacing: 0; }
.verdict p { margin: 1.5mm 0 0; }
.verdict.pass { border-color: #2d6a2d; }
.verdict.caution { border-color: #a86b00; border-style: dashed solid solid solid; }
.verdict.fail { border-color: #a01818; border-style: double; border-width: 4px 4px 4px 9mm; }
.verdict .not-checked { font-weight: bold; }
table.data { width: 100%; border-collapse: collapse; margin: 2mm 0 4mm; font-size: 9.5pt; }
table.data caption { caption-side: top; text-align: left; font-weight: bold; padding-bottom: 1.5mm; }
table.data th { text-align: left; border-bottom: 1.5px solid var(--ink); padding: 1mm 1.5mm; vertical-align: bottom; }
table.data td { border-bottom: 1px solid #d0d0d0; padding: 1mm 1.5mm; vertical-align: top; }
table.data .num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
table.data th.num { white-space: normal; }
table.data tr.fail td { background: #f7dede; font-weight: bold; }
table.data tr.caution td { background: #fbefd5; }
table.data tr.not-checked td { background: #e9e9e9; font-style: italic; }
thead { display: table-header-group; }
tr { break-inside: avoid; page-break-inside: avoid; }
figure { margin: 3mm 0 5mm; }
figure svg { display: block; width: 100%; height: auto; }
figcaption { font-size: 9pt; margin-top: 1.5mm; }
.notes { border: 1px solid var(--rule); padding: 2.5mm 4mm; margin: 3mm 0; background: #fafafa; }
.notes h3 { font-size: 10.5pt; margin: 1mm 0; }
.notes ul { margin: 0 0 2mm; padding-left: 5mm; }
.sign-off { width: 100%; border-collapse: collapse; margin-top: 4mm; }
.sign-off th { width: 25%; text-align: left; font-weight: normal; font-size: 9pt; padding: 2mm; border: 1px solid var(--ink);
     background: var(--faint); }
.sign-off td { height: 14mm; border: 1px solid var(--ink); }
footer { margin-top: 8mm; padding-top: 2mm; border-top: 1px solid var(--rule); font-size: 8.5pt; color: #444; }
figure, table, .verdict, .notes, .sign-off, .title-block { break-inside: avoid; page-break-inside: avoid; }
section.new-page { break-before: page; page-break-before: always; }
@media print {
  body { max-width: none; padding: 0; font-size: 10pt; }
}
)css";

std::string page_rule(PaperSize paper) {
    // 15 mm sides leave 180 mm of width on A4 and 186 mm on US Letter; the
    // content is sized to fit the narrower, and the height of the shorter.
    std::string size;
    if (paper == PaperSize::a4) size = "size: A4 portrait; ";
    if (paper == PaperSize::us_letter) size = "size: letter portrait; ";
    return "@page { " + size + "margin: 15mm 15mm 16mm 15mm; }\n";
}

std::string element(std::string_view tag, std::string_view text, std::string_view css_class = {}) {
    // Appended piece by piece: GCC 12 warns falsely (-Wrestrict) on "<" + string.
    std::string out(1, '<');
    out += tag;
    if (!css_class.empty()) out += " class=\"" + escape_xml(css_class) + "\"";
    out += '>';
    out += escape_xml(text);
    out += "</";
    out += tag;
    out += '>';
    return out;
}

std::string list_items(const std::vector<std::string>& items) {
    std::string out = "<ul>\n";
    for (const std::string& item : items) out += element("li", item) + "\n";
    return out + "</ul>\n";
}

std::string title_row(std::string_view heading, std::string_view value, std::string_view css_class = {}) {
    return "<tr>" + element("th", heading) + element("td", value.empty() ? "(not given)" : value, css_class) +
           "</tr>\n";
}

std::string checks_word(int n) { return std::to_string(n) + (n == 1 ? " check" : " checks"); }

}  // namespace

namespace {

// The banner's class: the verdict word in lower case ("pass", "caution", "fail").
std::string verdict_class(Verdict v) {
    std::string css(verdict_word(v));
    std::transform(css.begin(), css.end(), css.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
    return css;
}

}  // namespace

void ReportTable::add_row(std::vector<std::string> cells, std::string mark) {
    if (cells.size() != columns.size()) {
        throw std::invalid_argument("a row of table \"" + caption + "\" has " + std::to_string(cells.size()) +
                                    " cells for " + std::to_string(columns.size()) + " columns");
    }
    rows.push_back({std::move(cells), std::move(mark)});
}

HtmlDocument::HtmlDocument(std::string_view document_title, PaperSize paper)
    : title_(document_title), paper_(paper) {}

void HtmlDocument::title_block(const ReportTitleBlock& t) {
    body_ += element("h1", t.job_title.empty() ? title_ : t.job_title) + "\n";
    body_ += "<table class=\"title-block\">\n";
    if (!t.made_by.empty()) body_ += title_row("Report", t.made_by);
    body_ += title_row("Job reference", t.reference);
    body_ += title_row("Date of this report", t.date);
    body_ += title_row("plumb version", t.plumb_version);
    body_ += title_row("Job file", t.job_file);
    body_ += title_row("SHA-256 of the job file", t.job_file_sha256, "hash");
    body_ += "</table>\n";
}

void HtmlDocument::verdict_banner(const VerdictBanner& v) {
    const bool incomplete = v.not_checked > 0;
    std::string css = "verdict " + verdict_class(v.verdict);
    if (incomplete) css += " incomplete";
    body_ += "<div class=\"" + css + "\" id=\"verdict\" role=\"status\">\n";
    // Words carry the verdict; the border's colour and style only repeat it.
    body_ += "<p class=\"word\">Result: " + std::string(verdict_word(v.verdict));
    if (incomplete) {
        body_ += " <span class=\"qualifier\">(incomplete: " + escape_xml(checks_word(v.not_checked)) +
                 " NOT CHECKED)</span>";
    }
    body_ += "</p>\n";
    if (!v.summary.empty()) body_ += element("p", v.summary) + "\n";
    if (!v.driven_by.empty()) {
        std::string list;
        for (const std::string& check : v.driven_by) list += (list.empty() ? "" : "; ") + check;
        body_ += element("p", "Set by: " + list) + "\n";
    }
    if (incomplete) {
        body_ += element("p",
                         "NOT CHECKED: " + checks_word(v.not_checked) +
                             " could not be made. This result says nothing about them; a competent person "
                             "must settle them before the lift.",
                         "not-checked") +
                 "\n";
    }
    body_ += "</div>\n";
}

void HtmlDocument::begin_section(std::string_view heading, SectionStart start) {
    if (in_section_) end_section();
    body_ += start == SectionStart::new_page ? "<section class=\"new-page\">\n" : "<section>\n";
    body_ += element("h2", heading) + "\n";
    in_section_ = true;
}

void HtmlDocument::end_section() {
    if (!in_section_) return;
    body_ += "</section>\n";
    in_section_ = false;
}

void HtmlDocument::paragraph(std::string_view text) { body_ += element("p", text) + "\n"; }

void HtmlDocument::table(const ReportTable& t) {
    body_ += "<table class=\"data\">\n";
    if (!t.caption.empty()) body_ += element("caption", t.caption) + "\n";
    body_ += "<thead><tr>";
    for (const TableColumn& c : t.columns) body_ += element("th", c.heading, c.align == ColumnAlign::right ? "num" : "");
    body_ += "</tr></thead>\n<tbody>\n";
    for (const ReportTable::Row& row : t.rows) {
        body_ += row.mark.empty() ? "<tr>" : "<tr class=\"" + escape_xml(row.mark) + "\">";
        for (std::size_t i = 0; i < row.cells.size(); ++i) {
            const bool right = i < t.columns.size() && t.columns[i].align == ColumnAlign::right;
            body_ += element("td", row.cells[i], right ? "num" : "");
        }
        body_ += "</tr>\n";
    }
    body_ += "</tbody>\n</table>\n";
}

void HtmlDocument::figure(const std::string& svg, std::string_view caption) {
    body_ += "<figure>\n" + svg;
    if (!caption.empty()) body_ += element("figcaption", caption) + "\n";
    body_ += "</figure>\n";
}

void HtmlDocument::cautions_and_assumptions(const std::vector<std::string>& cautions,
                                            const std::vector<std::string>& assumptions) {
    body_ += "<div class=\"notes\" id=\"cautions\">\n";
    body_ += element("h3", "Cautions") + "\n" + list_items(cautions);
    body_ += element("h3", "Assumptions of the model") + "\n" + list_items(assumptions);
    body_ += "</div>\n";
}

void HtmlDocument::reviewer_sign_off() {
    body_ += "<table class=\"sign-off\" id=\"sign-off\">\n";
    for (const std::string_view field : {"Reviewer's name", "Signature", "Date"}) {
        body_ += "<tr>" + element("th", field) + "<td></td></tr>\n";
    }
    body_ += "</table>\n";
}

std::string HtmlDocument::finish() {
    end_section();
    std::string out = "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n";
    out += "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"/>\n";
    out += element("title", title_) + "\n";
    out += "<style>\n" + page_rule(paper_) + std::string(style_sheet) + "</style>\n</head>\n<body>\n";
    out += body_;
    out += "<footer>Made by plumb, a planning aid. Not valid without the review and signature above.</footer>\n";
    out += "</body>\n</html>\n";
    return out;
}

}  // namespace plumb
