// Keyword tables: every set of keywords a cell can type (methods, outputs, transforms,
// adjustments, designs, …), each defined once: here for the functions of the first catalogue, in
// the family's own core file for a family that adds its own set. The core matches against them,
// the registry declares arguments with them, the function wizard's texts, the refusal that lists
// valid keywords and the keyword appendix of docs/functions.md are all read from them.
// Keywords are case-insensitive; an unknown one is a refusal that lists the valid ones.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

namespace quadrat {

struct Keyword {
    std::string word;     // as typed in a cell: "games-howell"
    std::string meaning;  // a few words for the docs' appendix: "unequal variances"
};

class KeywordTable {
public:
    KeywordTable(std::string name, std::vector<Keyword> words);

    const std::string& name() const { return name_; }  // "location methods": the appendix heading
    const std::vector<Keyword>& words() const { return words_; }
    std::vector<std::string> list() const;  // the words, in table order
    bool contains(const std::string& word) const;

    // The word as spelled in the table (case and outer spaces ignored). A blank `given` returns
    // `fallback` (which may be "": no default). Otherwise a refusal that names the argument and
    // lists the table: "unknown method 'x'; valid: a, b, c".
    std::string match(const std::string& given, const std::string& argument, const std::string& fallback) const;
    // The position in the table of `given` (blank: the first word); unknown: the same refusal.
    std::size_t index(const std::string& given, const std::string& argument) const;
    // The word for `given`, the first word (the default) when blank; unknown: the same refusal.
    const std::string& pick(const std::string& given, const std::string& argument) const {
        return words_[index(given, argument)].word;
    }

private:
    std::string name_;
    std::vector<Keyword> words_;
};

// "a, b, c"
std::string join(const std::vector<std::string>& items, const std::string& separator = ", ");

// ---- Methods and options (FUNCTIONS.md revision 2) -------------------------------------------
const KeywordTable& normality_methods();    // CHECK.NORMAL
const KeywordTable& variance_methods();     // CHECK.VARIANCE
const KeywordTable& location_methods();     // COMPARE.GROUPS
const KeywordTable& paired_methods();       // COMPARE.PAIRED
const KeywordTable& posthoc_methods();      // COMPARE.POSTHOC, COMPARE.LETTERS (order of PosthocMethod)
const KeywordTable& adjustment_methods();   // ADJUST.P, `adjust` (order of Adjustment)
const KeywordTable& transforms();           // `transform` (order of Transform)
const KeywordTable& count_methods();        // COMPARE.COUNTS
const KeywordTable& correlation_methods();  // RELATE.CORRELATION
const KeywordTable& sums_of_squares();      // FIT.FACTORIAL `sums`
const KeywordTable& designs();              // ADVISE.TEST `design` (order of Design)

// ---- Outputs ------------------------------------------------------------------------------------
const KeywordTable& test_outputs();         // the shared outputs of a test (FUNCTIONS.md, "Outputs")
const KeywordTable& normality_outputs();
const KeywordTable& variance_outputs();
const KeywordTable& correlation_outputs();
const KeywordTable& count_outputs();
const KeywordTable& expected_outputs();
const KeywordTable& linear_outputs();       // FIT.LINEAR
const KeywordTable& logistic_outputs();     // FIT.LOGISTIC
const KeywordTable& point_outputs();        // FIT.POINTS: one column each
const KeywordTable& count_model_methods();  // FIT.COUNTS
const KeywordTable& count_model_outputs();  // FIT.COUNTS
const KeywordTable& prediction_outputs();   // FIT.PREDICT: one column each
const KeywordTable& regression_checks();    // CHECK.REGRESSION
const KeywordTable& factorial_outputs();    // FIT.FACTORIAL
const KeywordTable& advice_outputs();       // ADVISE.TEST

}  // namespace quadrat
