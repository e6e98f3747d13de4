// The design matrix of a likelihood model (FIT.LOGISTIC, FIT.COUNTS) in centred and scaled
// coordinates: an intercept column of ones, then each predictor as (x − mean)/SD, so that a column
// in the thousands (an elevation) and one in thousandths keep their digits through the iterations.
// The coefficients γ found there go back to the predictors' own units as β = T γ, and their
// covariance as T Σ Tᵀ.
#pragma once

#include <string>
#include <vector>

#include <Eigen/Dense>

namespace quadrat {

struct ScaledDesign {
    Eigen::MatrixXd Z;                   // n × (1 + predictors)
    std::vector<double> centre, scale;   // per predictor

    // T: slopes divided by their scale, the intercept moved back to the original origin.
    Eigen::MatrixXd to_original_units() const;
};

// Refuses a predictor whose squares overflow (naming it, to be rescaled) or that is constant.
ScaledDesign scaled_design(const std::vector<std::vector<double>>& xs, const std::vector<std::string>& names);

}  // namespace quadrat
