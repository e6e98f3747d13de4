// ADVISE.TEST: reads two columns as a person would and says which test fits, and why.
//
// The decision path is the usual one of applied statistics texts for field data: the types of
// the variables, the sample sizes, the normality of the residuals, equality of spread, whether a
// log transform mends both, then the parametric test, its robust variant or the rank test, with
// the post-hoc method for three or more groups. Every threshold is stated in advisor.cpp with its
// source. It never recommends a test whose assumption it has just seen fail.
#pragma once

#include <string>
#include <vector>

#include "cells.hpp"

namespace quadrat {

enum class Design { automatic, groups, paired, relationship, trend, blocks, nested };
Design parse_design(const std::string& keyword);

struct AdviceStep {
    std::string step;      // what was looked at
    std::string found;     // what the data showed
    std::string decision;  // what that decided
};

struct Advice {
    std::string function;   // the cell function to use, e.g. COMPARE.GROUPS
    std::string method;     // its method keyword ("" where the function has none)
    std::string transform;  // none, log, log(x+1)
    std::string posthoc;    // the COMPARE.POSTHOC method that goes with the advice (tukey after
                            // pooled, games-howell after welch, dunn after ranks), else ""
    std::vector<AdviceStep> steps;
    std::string report;     // one paragraph with the reasons (report.hpp's render_advice)

    // header `step | found | decision`, then one row per step.
    Table table() const;
};

// `predictor` may be omitted (one column: a one-sample test against a target value). `structure`
// (optional, a label column beside the response) gives the block or sampling unit of each row for
// design `blocks` (the default when structure is given) and `nested`.
Advice advise_test(const Range& response, const Range& predictor, Design design,
                   const Range& structure = Range::omitted_argument());

}  // namespace quadrat
