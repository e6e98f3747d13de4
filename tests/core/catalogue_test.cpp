// The registry against the catalogue: every declared function's name, method, arguments (names,
// order, optional or not), keywords with their defaults, and outputs, compared with
// tests/core/data/catalogue.json (copied from FUNCTIONS.md revision 2, provenance inside). Then the
// texts generated from the declarations: the keyword appendix of docs/functions.md must be up to
// date, the wizard's lines short, and every keyword list generated from the tables.
#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <fstream>
#include <set>
#include <sstream>
#include <string>

#include "addin/registry.hpp"
#include "addin/texts.hpp"

namespace quadrat::addin {
namespace {

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

}  // namespace
}  // namespace quadrat::addin
