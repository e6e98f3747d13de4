// Arguments several families declare the same way, so the wizard says the same thing everywhere.
#pragma once

#include "addin/declare.hpp"

namespace quadrat::addin {

inline Argument values_argument() {
    return data("values", "Measurements: one column beside groups, or a block with one column per group.");
}
// A required reference that may be left empty: Calc marks only `any` arguments optional, and an
// `any` costs 5–6 times a reference on long columns (DEVELOPERS.md, the seam), so the wizard
// text says how to leave it out.
inline Argument groups_argument() {
    return labels("groups", "Group label of each row; for one column per group leave it empty, keeping the ;.");
}
inline Argument optional_groups_argument(const char* then) {
    return optional(labels("groups", std::string("Optional group label of each row: ") + then));
}
inline Argument transform_argument() {
    return keyword("transform", transforms(), "none", "Applied before testing; log results come back as ratios");
}
inline Argument test_output(const KeywordTable& outputs = test_outputs()) {
    return output(outputs, outputs.words().front().word, "What the cell shows (p from 0 to 1)");
}

}  // namespace quadrat::addin
