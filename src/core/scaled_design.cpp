#include "scaled_design.hpp"

#include <cmath>

#include "data.hpp"
#include "refusal.hpp"
#include "summary.hpp"

namespace quadrat {

ScaledDesign scaled_design(const std::vector<std::vector<double>>& xs, const std::vector<std::string>& names) {
    const std::size_t k = xs.size(), n = k ? xs.front().size() : 0;
    ScaledDesign d;
    d.Z.resize(Eigen::Index(n), Eigen::Index(k + 1));
    d.Z.col(0).setOnes();
    d.centre.resize(k);
    d.scale.resize(k);
    for (std::size_t j = 0; j < k; ++j) {
        refuse_beyond_model_scale(xs[j], names[j]);
        d.centre[j] = mean(xs[j]);
        d.scale[j] = std::sqrt(sum_of_squares(xs[j], d.centre[j]) / double(n));
        if (!std::isfinite(d.centre[j]) || !std::isfinite(d.scale[j]))
            throw Refusal("predictor " + names[j] + " has values too large to fit (their squares overflow); rescale it");
        if (!(d.scale[j] > 0)) throw Refusal("predictor " + names[j] + " is constant; remove it");
        for (std::size_t i = 0; i < n; ++i) d.Z(Eigen::Index(i), Eigen::Index(j + 1)) = (xs[j][i] - d.centre[j]) / d.scale[j];
    }
    return d;
}

Eigen::MatrixXd ScaledDesign::to_original_units() const {
    const Eigen::Index p = Eigen::Index(centre.size() + 1);
    Eigen::MatrixXd T = Eigen::MatrixXd::Identity(p, p);
    for (std::size_t j = 0; j < centre.size(); ++j) {
        T(Eigen::Index(j + 1), Eigen::Index(j + 1)) = 1 / scale[j];
        T(0, Eigen::Index(j + 1)) = -centre[j] / scale[j];
    }
    return T;
}

}  // namespace quadrat
