// The registry against the catalogue: every declared function's name, method, arguments (names,
// order, optional or not), keywords with their defaults, outputs and table headers, compared with
// tests/core/data/catalogue.json (copied from FUNCTIONS.md revision 2, provenance inside). Then the
// texts generated from the declarations: the keyword appendix of docs/functions.md must be up to
// date, the wizard's lines short, and every keyword list generated from the tables.
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <fstream>
#include <functional>
#include <map>
#include <set>
#include <sstream>
#include <string>
#include <utility>
#include <variant>
#include <vector>

#include "addin/registry.hpp"
#include "addin/texts.hpp"
#include "cell_calls.hpp"
#include "core/cells.hpp"

namespace quadrat::addin {
namespace {

// The cell helpers, not the declaration helpers of the same names (declare.hpp).
using quadrat::test_support::keyword;
using quadrat::test_support::omitted;

std::string file_text(const std::string& path) {
    std::ifstream in(path, std::ios::binary);
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
}

const nlohmann::json& catalogue() {
    static const nlohmann::json c = nlohmann::json::parse(file_text(QUADRAT_SOURCE_DIR "/tests/core/data/catalogue.json"));
    return c;
}

const nlohmann::json* entry_of(const std::string& name) {
    for (const auto& f : catalogue()["functions"])
        if (f["name"] == name) return &f;
    return nullptr;
}

// "values; [groups]; [method]" as the catalogue writes a signature.
std::string signature_of(const Function& f) {
    std::string s;
    for (const Argument& a : f.arguments) {
        if (!s.empty()) s += "; ";
        s += a.optional ? "[" + a.name + "]" : a.name;
    }
    return s;
}

TEST(Catalogue, EveryDeclaredFunctionIsInTheCatalogueAsWritten) {
    for (const Function* f : registry()) {
        const nlohmann::json* c = entry_of(f->display_name);
        ASSERT_NE(c, nullptr) << f->display_name << " is not in the catalogue";
        EXPECT_EQ(f->method, (*c)["method"]) << f->display_name;
        EXPECT_EQ(signature_of(*f), (*c)["signature"]) << f->display_name;
        const auto& keywords = (*c)["keywords"];
        std::set<std::string> no_default;
        if (c->contains("no_default")) no_default = (*c)["no_default"].get<std::set<std::string>>();
        std::size_t keyword_arguments = 0;
        for (const Argument& a : f->arguments) {
            if (!a.keywords) {
                EXPECT_FALSE(keywords.contains(a.name)) << f->display_name << " " << a.name << " takes no keyword table";
                continue;
            }
            ++keyword_arguments;
            ASSERT_TRUE(keywords.contains(a.name)) << f->display_name << " " << a.name;
            const auto words = keywords[a.name].get<std::vector<std::string>>();
            EXPECT_EQ(a.keywords->list(), words) << f->display_name << " " << a.name;
            EXPECT_EQ(a.fallback, no_default.count(a.name) ? std::string() : words.front())
                << f->display_name << " " << a.name << "'s default";
        }
        EXPECT_EQ(keyword_arguments, keywords.size()) << f->display_name;
    }
}

// The catalogue's identity rule: each display name maps to the lowerCamel of its words.
TEST(Catalogue, MethodIsTheLowerCamelOfTheDisplayName) {
    for (const Function* f : registry()) {
        std::string camel;
        bool upper = false;
        for (char c : f->display_name) {
            if (c == '.') {
                upper = true;
                continue;
            }
            camel += upper ? c : static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
            upper = false;
        }
        EXPECT_EQ(f->method, camel) << f->display_name;
    }
}

TEST(Catalogue, CellReferencesAreDeclaredAsData) {
    // FUNCTIONS.md, "Data arguments are cell references": these take references; `second`,
    // `expected`, `level`, `sums` and keywords also take typed values.
    const std::set<std::string> references = {"values", "groups", "first", "x", "y", "xs", "response", "predictor",
                                              "factor1", "factor2", "categories", "labels2", "observed", "pvalues",
                                              "times", "seasons", "blocks", "units", "structure", "order", "counts",
                                              "effort", "trials", "at"};
    for (const Function* f : registry())
        for (const Argument& a : f->arguments) {
            const bool cells = a.kind == ArgumentKind::data || a.kind == ArgumentKind::labels;
            EXPECT_EQ(cells, references.count(a.name) == 1) << f->display_name << " " << a.name;
        }
}

TEST(GeneratedTexts, DocsKeywordAppendixIsUpToDate) {
    const std::string docs = file_text(QUADRAT_SOURCE_DIR "/docs/functions.md");
    ASSERT_NE(docs.find(appendix_begin), std::string::npos) << "docs/functions.md has no keyword appendix markers";
    EXPECT_EQ(docs, with_keyword_appendix(docs))
        << "docs/functions.md's keyword appendix is out of date: run build/src/addin/uno/quadrat_interface --docs "
           "docs/functions.md";
}

// Issue 13: an argument in one line, about 120 characters at most; symbols as the cells show
// them, never spelled out in ASCII.
TEST(GeneratedTexts, WizardLinesAreShortAndUseTheCellsSymbols) {
    for (const Function* f : registry()) {
        EXPECT_LE(f->description.size(), 160u) << f->display_name;
        for (const Argument& a : f->arguments) {
            const std::string line = wizard_text(a);
            // UTF-8 bytes; the longest lists (adjustments, test outputs) run a little over 120.
            EXPECT_LE(line.size(), 170u) << f->display_name << " " << a.name << ": " << line;
            for (const char* ascii : {"A2", "K2", "T+", "chi-square test", "omega squared", "eta squared"})
                EXPECT_EQ(line.find(ascii), std::string::npos) << f->display_name << " " << a.name << ": " << line;
        }
    }
}

TEST(GeneratedTexts, KeywordListsComeFromTheTables) {
    const Function* groups = find_function("compareGroups");
    ASSERT_NE(groups, nullptr);
    EXPECT_EQ(wizard_text(groups->arguments[2]), "Test: welch (default), pooled, ranks.");
    const Function* posthoc = find_function("comparePosthoc");
    ASSERT_NE(posthoc, nullptr);
    EXPECT_NE(wizard_text(posthoc->arguments[2]).find("pairwise-t, pairwise-ranks."), std::string::npos);
}


// ---------------------------------------------------------------------------------------------
// Table headers (issue 13): each table a function returns, called as a cell would on small
// invented data, has the header row and row labels that catalogue.json copies from FUNCTIONS.md.

Range with_header(Range r, const std::string& header) {
    r.cells.insert(r.cells.begin(), Cell::make_text(header));
    ++r.rows;
    return r;
}

// Columns side by side, as one multi-column reference.
Range side_by_side(const std::vector<Range>& columns) {
    Range r;
    r.rows = columns.front().rows;
    r.columns = columns.size();
    r.is_reference = true;
    for (std::size_t i = 0; i < r.rows; ++i)
        for (const Range& c : columns) r.cells.push_back(c.cells.at(i));
    return r;
}

// Invented: shell length (mm) of snails at three shore sites, five each, with header rows.
Range lengths() {
    return with_header(Range::column({12.1, 13.4, 11.8, 12.9, 13.0, 14.2, 15.1, 14.8, 15.6, 14.4, 11.2, 10.9, 12.0, 11.5, 10.4}),
                       "length");
}
Range sites() {
    return Range::text_column({"site", "north", "north", "north", "north", "north", "south", "south", "south", "south",
                               "south", "east", "east", "east", "east", "east"});
}
// Invented: twelve reaches, invertebrate density against flow (m/s) and canopy (%), and its sampling day.
Range density() { return with_header(Range::column({31, 42, 38, 55, 47, 60, 52, 71, 66, 59, 80, 74}), "density"); }
Range flow() { return with_header(Range::column({0.10, 0.22, 0.18, 0.35, 0.30, 0.41, 0.33, 0.52, 0.47, 0.40, 0.63, 0.58}), "flow"); }
Range canopy() { return with_header(Range::column({80, 65, 72, 50, 61, 44, 58, 30, 41, 52, 22, 35}), "canopy"); }
Range flow_and_canopy() { return side_by_side({flow(), canopy()}); }
// Invented: presence (1) or absence (0) of a caddisfly at the same reaches.
Range presence() { return with_header(Range::column({0, 0, 1, 0, 1, 0, 1, 1, 0, 1, 1, 1}), "caddis"); }
// Invented: fish counted per pass at the same reaches.
Range fish() { return with_header(Range::column({2, 4, 3, 6, 4, 8, 5, 9, 7, 6, 12, 10}), "fish"); }
// Invented: seedling height (cm) in sun or shade on clay or sand, three plots each.
Range heights() { return with_header(Range::column({14, 16, 15, 19, 21, 20, 10, 12, 11, 13, 12, 14}), "height"); }
Range shade() {
    return Range::text_column({"shade", "sun", "sun", "sun", "sun", "sun", "sun", "shade", "shade", "shade", "shade", "shade",
                               "shade"});
}
Range soil() {
    return Range::text_column({"soil", "clay", "clay", "clay", "sand", "sand", "sand", "clay", "clay", "clay", "sand", "sand",
                               "sand"});
}
// Invented: a survey's two label columns and a count of three colour morphs.
Range morph() {
    return Range::text_column({"morph", "red", "red", "red", "blue", "blue", "red", "blue", "blue", "red", "blue", "red",
                               "blue", "red", "blue", "red", "red"});
}
Range habitat() {
    return Range::text_column({"habitat", "wet", "wet", "dry", "dry", "wet", "wet", "dry", "dry", "dry", "wet", "wet",
                               "dry", "dry", "wet", "wet", "dry"});
}

// The call that gives each case of catalogue.json's `headers`, by display name and case.
std::map<std::pair<std::string, std::string>, std::function<Table()>> header_calls() {
    using test_support::call;
    const Range o = omitted;
    return {
        {{"CHECK.NORMAL", "table"}, [=] { return call("checkNormal", {lengths(), o, o, keyword("table")}); }},
        {{"CHECK.VARIANCE", "table"}, [=] { return call("checkVariance", {lengths(), sites(), o, keyword("table")}); }},
        {{"CHECK.QQ", "default"}, [=] { return call("checkQq", {lengths(), o}); }},
        {{"CHECK.REGRESSION", "table"}, [=] { return call("checkRegression", {density(), flow_and_canopy(), o, o}); }},
        {{"COMPARE.GROUPS", "table"}, [=] { return call("compareGroups", {lengths(), sites(), o, keyword("table"), o}); }},
        {{"COMPARE.PAIRED", "table"}, [=] { return call("comparePaired", {density(), fish(), o, keyword("table"), o}); }},
        {{"COMPARE.POSTHOC", "default"}, [=] { return call("comparePosthoc", {lengths(), sites(), o, o, o, o}); }},
        {{"COMPARE.LETTERS", "default"}, [=] { return call("compareLetters", {lengths(), sites(), o, o, o, o}); }},
        {{"COMPARE.LETTERS", "dunn"}, [=] { return call("compareLetters", {lengths(), sites(), keyword("dunn"), o, o, o}); }},
        {{"COMPARE.COUNTS", "table"}, [=] { return call("compareCounts", {morph(), habitat(), o, keyword("table")}); }},
        {{"COMPARE.EXPECTED", "table"}, [=] { return call("compareExpected", {Range::column({18, 22, 20}), o, keyword("table")}); }},
        {{"RELATE.CORRELATION", "table"}, [=] { return call("relateCorrelation", {flow(), density(), o, keyword("table")}); }},
        {{"FIT.LINEAR", "coefficients"}, [=] { return call("fitLinear", {density(), flow_and_canopy(), o, o}); }},
        {{"FIT.LINEAR", "model"}, [=] { return call("fitLinear", {density(), flow_and_canopy(), keyword("model"), o}); }},
        {{"FIT.LOGISTIC", "coefficients"}, [=] { return call("fitLogistic", {presence(), flow(), o, o, o}); }},
        {{"FIT.LOGISTIC", "model"}, [=] { return call("fitLogistic", {presence(), flow(), keyword("model"), o, o}); }},
        {{"FIT.POINTS", "default"}, [=] { return call("fitPoints", {density(), flow_and_canopy(), o}); }},
        {{"FIT.FACTORIAL", "table"}, [=] { return call("fitFactorial", {heights(), shade(), soil(), o, o}); }},
        {{"FIT.COUNTS", "coefficients"}, [=] { return call("fitCounts", {fish(), flow(), o, keyword("poisson"), o, o}); }},
        {{"FIT.COUNTS", "model"}, [=] { return call("fitCounts", {fish(), flow(), o, keyword("poisson"), keyword("model"), o}); }},
        {{"FIT.PREDICT", "default"}, [=] { return call("fitPredict", {density(), flow_and_canopy(),
                                                                      side_by_side({Range::column({0.2, 0.5}), Range::column({60, 40})}), o, o}); }},
        {{"DESCRIBE.GROUPS", "default"}, [=] { return call("describeGroups", {lengths(), sites(), o, o}); }},
        {{"DESCRIBE.GROUPS", "log"}, [=] { return call("describeGroups", {lengths(), sites(), keyword("log"), o}); }},
        {{"DESCRIBE.CENSORED", "default"}, [=] { return call("describeCensored", {lengths(), sites(), o, o}); }},
        {{"COMPARE.CENSORED", "table"}, [=] { return call("compareCensored", {lengths(), sites(), o, keyword("table")}); }},
    };
}

std::string shown(const CellValue& v) {
    if (const auto* s = std::get_if<std::string>(&v)) return *s;
    if (const auto* x = std::get_if<double>(&v)) return "(number " + std::to_string(*x) + ")";
    return "(blank)";
}

TEST(Catalogue, TableHeadersAndRowLabelsAsWritten) {
    const auto calls = header_calls();
    std::size_t cases = 0;
    for (const auto& f : catalogue()["functions"]) {
        if (!f.contains("headers")) continue;
        const std::string name = f["name"];
        for (const auto& [key, expected] : f["headers"].items()) {
            const auto call = calls.find({name, key});
            ASSERT_NE(call, calls.end()) << name << " " << key << ": no call in header_calls()";
            ++cases;
            const Table t = call->second();
            const std::string where = name + " " + key;
            ASSERT_GE(t.size(), 2u) << where << " gave " << (t.empty() || t[0].empty() ? "nothing" : shown(t[0][0]));
            if (expected["row"].is_null()) {
                // No header row: the first row holds numbers.
                for (const CellValue& v : t[0]) EXPECT_TRUE(std::holds_alternative<double>(v)) << where << ": " << shown(v);
            } else {
                std::vector<std::string> row;
                for (const CellValue& v : t[0]) row.push_back(shown(v));
                EXPECT_EQ(row, expected["row"].get<std::vector<std::string>>()) << where;
            }
            std::vector<std::string> labels;
            for (std::size_t i = 1; i < t.size(); ++i) labels.push_back(t[i].empty() ? "(no cell)" : shown(t[i][0]));
            if (expected.contains("labels")) {
                const auto& want = expected["labels"];
                ASSERT_EQ(labels.size(), want.size()) << where << " rows";
                for (std::size_t i = 0; i < want.size(); ++i)
                    if (!want[i].is_null()) EXPECT_EQ(labels[i], want[i].get<std::string>()) << where << " row " << i + 1;
            }
            if (expected.contains("first_labels")) {
                const auto want = expected["first_labels"].get<std::vector<std::string>>();
                ASSERT_GE(labels.size(), want.size()) << where << " rows";
                EXPECT_EQ(std::vector<std::string>(labels.begin(), labels.begin() + static_cast<std::ptrdiff_t>(want.size())), want)
                    << where;
            }
        }
    }
    // Every call above is checked, and every function of the first catalogue that returns a table
    // keeps its headers in catalogue.json.
    EXPECT_EQ(cases, calls.size());
    for (const char* name : {"CHECK.NORMAL", "CHECK.VARIANCE", "CHECK.QQ", "CHECK.REGRESSION", "COMPARE.GROUPS",
                             "COMPARE.PAIRED", "COMPARE.POSTHOC", "COMPARE.LETTERS", "COMPARE.COUNTS", "COMPARE.EXPECTED",
                             "RELATE.CORRELATION", "FIT.LINEAR", "FIT.LOGISTIC", "FIT.POINTS", "FIT.FACTORIAL",
                             "DESCRIBE.GROUPS"}) {
        const nlohmann::json* c = entry_of(name);
        ASSERT_NE(c, nullptr) << name;
        EXPECT_TRUE(c->contains("headers")) << name;
    }
}

}  // namespace
}  // namespace quadrat::addin
