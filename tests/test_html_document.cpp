// The HTML lift-plan attachment builder: the document is parsed back as XML
// (it is written to be both HTML and well-formed XML) and searched for its
// parts. Texts are invented for the test.
#include <catch2/catch.hpp>

#include <algorithm>
#include <stdexcept>
#include <string>
#include <vector>

#include "plumb/html_document.hpp"
#include "plumb/svg_plot.hpp"
#include "xml_parse.hpp"

namespace {

using plumb_test::XmlDocument;

plumb::ReportTitleBlock sample_title() {
    return {"Pump skid onto plinth 3", "LP-0042 rev B", "2026-12-02 06:30 UTC", "0.1.0", "pump-skid.yaml",
            "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"};
}

std::string sample_document(plumb::Verdict verdict, int not_checked) {
    plumb::HtmlDocument doc("Lift plan attachment", plumb::PaperSize::a4);
    doc.title_block(sample_title());
    doc.verdict_banner({verdict, not_checked, {"load offset", "hoist rope tension"}, "Checked over 40 s."});
    doc.begin_section("Checks", plumb::SectionStart::flow);
    plumb::ReportTable table;
    table.caption = "Checks";
    table.columns = {{"check", plumb::ColumnAlign::left}, {"value", plumb::ColumnAlign::right},
                     {"result", plumb::ColumnAlign::left}};
    table.add_row({"load offset", "0.82 m", "PASS"}, "pass");
    table.add_row({"hoist rope tension", "41.0 kN", "FAIL"}, "fail");
    doc.table(table);
    doc.begin_section("Plots", plumb::SectionStart::new_page);
    plumb::TimePlot plot;
    plot.title = "Swing";
    plot.panels.push_back({"swing angle", "deg", {{"hook rope angle", {0, 1, 2}, {0, 1, 0}}}, {}});
    doc.figure(plumb::render_time_plot(plot), "Swing angle against time.");
    doc.end_section();
    doc.cautions_and_assumptions({"A planning aid."}, {"Rigid links."});
    doc.reviewer_sign_off();
    return doc.finish();
}

std::string verdict_text(const XmlDocument& doc) {
    std::string all;
    for (const std::string& s : doc.values("//div[@id='verdict']//p")) all += s + "\n";
    return all;
}

}  // namespace

TEST_CASE("the report document parses as XML and holds title block, verdict, table, figure, cautions and sign-off") {
    const XmlDocument doc(sample_document(plumb::Verdict::fail, 0));
    CHECK(doc.values("/html/head/title") == std::vector<std::string>{"Lift plan attachment"});
    CHECK(doc.values("//h1") == std::vector<std::string>{"Pump skid onto plinth 3"});
    const auto title_rows = doc.values("//table[@class='title-block']//td");
    CHECK(title_rows == std::vector<std::string>{"LP-0042 rev B", "2026-12-02 06:30 UTC", "0.1.0", "pump-skid.yaml",
                                                 "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"});
    CHECK(doc.count("//div[@id='verdict']") == 1);
    CHECK(doc.count("//table[@class='data']/tbody/tr") == 2);
    CHECK(doc.values("//table[@class='data']/tbody/tr[@class='fail']/td[3]") == std::vector<std::string>{"FAIL"});
    CHECK(doc.count("//figure/svg:svg") == 1);
    CHECK(doc.values("//figcaption") == std::vector<std::string>{"Swing angle against time."});
    CHECK(doc.values("//div[@id='cautions']//li") == std::vector<std::string>{"A planning aid.", "Rigid links."});
    CHECK(doc.values("//table[@id='sign-off']//th") ==
          std::vector<std::string>{"Reviewer's name", "Signature", "Date"});
    CHECK(doc.values("//h2") == std::vector<std::string>{"Checks", "Plots"});
    CHECK(doc.count("//section[@class='new-page']") == 1);
}

TEST_CASE("the report document is self-contained: no scripts, links, fonts or remote resources") {
    const std::string html = sample_document(plumb::Verdict::pass, 0);
    const XmlDocument doc(html);
    CHECK(doc.count("//script") == 0);
    CHECK(doc.count("//link") == 0);
    CHECK(doc.count("//img") == 0);
    CHECK(doc.count("//@src") == 0);
    CHECK(doc.count("//@href") == 0);
    CHECK(html.find("@import") == std::string::npos);
    CHECK(html.find("@font-face") == std::string::npos);
    CHECK(html.find("url(") == std::string::npos);
    // The only address is the SVG namespace name, which is never fetched.
    std::size_t at = 0, addresses = 0;
    while ((at = html.find("http", at)) != std::string::npos) {
        CHECK(html.compare(at, 26, "http://www.w3.org/2000/svg") == 0);
        ++addresses, ++at;
    }
    CHECK(addresses == 1);
}

TEST_CASE("the report's print styles set the page, break between sections and keep plots and tables whole") {
    const std::string a4 = sample_document(plumb::Verdict::pass, 0);
    CHECK(a4.find("@page { size: A4 portrait;") != std::string::npos);
    CHECK(a4.find("section.new-page { break-before: page;") != std::string::npos);
    CHECK(a4.find("figure, table, .verdict, .notes, .sign-off, .title-block { break-inside: avoid;") !=
          std::string::npos);
    plumb::HtmlDocument letter("x", plumb::PaperSize::us_letter);
    CHECK(letter.finish().find("@page { size: letter portrait;") != std::string::npos);
    plumb::HtmlDocument either("x", plumb::PaperSize::either);
    const std::string any = either.finish();
    CHECK(any.find("@page { margin:") != std::string::npos);
    CHECK(any.find("size: A4") == std::string::npos);
    CHECK(any.find("size: letter") == std::string::npos);
}

TEST_CASE("the verdict banner says its verdict in words") {
    CHECK(verdict_text(XmlDocument(sample_document(plumb::Verdict::pass, 0))).find("Result: PASS") !=
          std::string::npos);
    CHECK(verdict_text(XmlDocument(sample_document(plumb::Verdict::caution, 0))).find("Result: CAUTION") !=
          std::string::npos);
    const std::string fail = verdict_text(XmlDocument(sample_document(plumb::Verdict::fail, 0)));
    CHECK(fail.find("Result: FAIL") != std::string::npos);
    CHECK(fail.find("Set by: load offset; hoist rope tension") != std::string::npos);
    CHECK(fail.find("NOT CHECKED") == std::string::npos);
}

TEST_CASE("a pass with checks not made reads as incomplete with the NOT CHECKED count in the headline") {
    const XmlDocument doc(sample_document(plumb::Verdict::pass, 2));
    const auto headline = doc.values("//div[@id='verdict']/p[@class='word']");
    REQUIRE(headline.size() == 1);
    CHECK(headline[0] == "Result: PASS (incomplete: 2 checks NOT CHECKED)");
    CHECK(verdict_text(doc).find("NOT CHECKED: 2 checks could not be made") != std::string::npos);
    CHECK(doc.count("//div[@id='verdict' and contains(@class, 'incomplete')]") == 1);
}

TEST_CASE("a table row with the wrong number of cells is refused") {
    plumb::ReportTable table;
    table.caption = "Inputs";
    table.columns = {{"input", plumb::ColumnAlign::left}, {"value", plumb::ColumnAlign::right}};
    CHECK_THROWS_AS(table.add_row({"only one"}), std::invalid_argument);
    CHECK_NOTHROW(table.add_row({"rope length", "12 m"}));
}

TEST_CASE("text in the report is escaped so markup in a job title cannot inject elements") {
    plumb::HtmlDocument html("t");
    plumb::ReportTitleBlock title = sample_title();
    title.job_title = "<script>alert('x')</script> & \x01";
    html.title_block(title);
    html.paragraph("<b>not bold</b>");
    const XmlDocument doc(html.finish());
    CHECK(doc.count("//script") == 0);
    CHECK(doc.count("//b") == 0);
    CHECK(doc.values("//h1").at(0) == "<script>alert('x')</script> & \xEF\xBF\xBD");
}

TEST_CASE("an empty title block field says it was not given") {
    plumb::HtmlDocument html("t");
    plumb::ReportTitleBlock title = sample_title();
    title.reference.clear();
    html.title_block(title);
    const XmlDocument doc(html.finish());
    CHECK(doc.values("//table[@class='title-block']//td").at(0) == "(not given)");
}
