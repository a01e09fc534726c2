// Parses SVG and the report's HTML back with libxml2, a real XML parser, so
// the tests see the document as a reader would: well-formed or not, and
// which elements it holds.
#pragma once

#include <memory>
#include <stdexcept>
#include <string>
#include <vector>

#include <libxml/parser.h>
#include <libxml/xpath.h>
#include <libxml/xpathInternals.h>

namespace plumb_test {

class XmlDocument {
public:
    // Throws std::runtime_error with libxml2's message if text is not well-formed.
    explicit XmlDocument(const std::string& text)
        : doc_(xmlReadMemory(text.data(), static_cast<int>(text.size()), "memory.xml", "UTF-8",
                             XML_PARSE_NONET | XML_PARSE_NOERROR | XML_PARSE_NOWARNING),
               xmlFreeDoc) {
        if (!doc_) {
            const xmlError* error = xmlGetLastError();
            throw std::runtime_error(std::string("not well-formed XML: ") + (error && error->message ? error->message : "?"));
        }
    }

    // The string values of the nodes an XPath expression selects. The SVG
    // namespace is bound to the prefix "svg".
    std::vector<std::string> values(const std::string& xpath) const {
        std::unique_ptr<xmlXPathContext, decltype(&xmlXPathFreeContext)> context(xmlXPathNewContext(doc_.get()),
                                                                                 xmlXPathFreeContext);
        xmlXPathRegisterNs(context.get(), reinterpret_cast<const xmlChar*>("svg"),
                           reinterpret_cast<const xmlChar*>("http://www.w3.org/2000/svg"));
        std::unique_ptr<xmlXPathObject, decltype(&xmlXPathFreeObject)> result(
            xmlXPathEvalExpression(reinterpret_cast<const xmlChar*>(xpath.c_str()), context.get()),
            xmlXPathFreeObject);
        if (!result) throw std::runtime_error("bad XPath: " + xpath);
        std::vector<std::string> out;
        if (result->nodesetval == nullptr) return out;
        for (int i = 0; i < result->nodesetval->nodeNr; ++i) {
            std::unique_ptr<xmlChar, decltype(xmlFree)> text(xmlNodeGetContent(result->nodesetval->nodeTab[i]), xmlFree);
            out.emplace_back(text ? reinterpret_cast<const char*>(text.get()) : "");
        }
        return out;
    }

    std::size_t count(const std::string& xpath) const { return values(xpath).size(); }

private:
    std::unique_ptr<xmlDoc, decltype(&xmlFreeDoc)> doc_;
};

}  // namespace plumb_test
