// FIT.PREDICT: the least-squares line or plane evaluated at new predictor values, with the
// interval of the mean there and the interval one new reading will fall in (Draper & Smith 1998,
// Applied Regression Analysis, 3rd ed., §3.1: ŷ ± t σ √h and ŷ ± t σ √(1 + h), h = x₀ᵀ(XᵀX)⁻¹x₀).
#pragma once

#include <optional>
#include <span>
#include <vector>

#include "linear_model.hpp"

namespace quadrat {

struct Prediction {
    double predicted = 0;
    double mean_low = 0, mean_high = 0;        // confidence interval of the mean at x₀
    double reading_low = 0, reading_high = 0;  // prediction interval of one new reading at x₀
};

// At predictor values x (one per predictor, in column order), confidence `level`.
Prediction predict_at(const LinearModel& model, std::span<const double> x, double level);

// The FIT.PREDICT array for the rows of `at` (nullopt where a row has a missing cell: that row
// stays blank). `column` < 5 gives that column alone with exactly at's rows; otherwise all five
// under the header `predicted | mean ci-low | mean ci-high | reading low | reading high`, which
// takes the place of at's own header row when it has one (`at_has_header`), else sits on top.
Table prediction_table(const LinearModel& model, const std::vector<std::optional<std::vector<double>>>& at,
                       bool at_has_header, double level, std::size_t column);

}  // namespace quadrat
