#include "predict.hpp"

#include <cmath>
#include <string>

#include <boost/math/distributions/students_t.hpp>

#include "refusal.hpp"

namespace quadrat {

Prediction predict_at(const LinearModel& m, std::span<const double> x, double level) {
    for (double v : x)
        if (!std::isfinite(v)) throw Refusal("at holds a value that is not a finite number");
    const boost::math::students_t t_dist(m.df_residual);
    const double t = boost::math::quantile(boost::math::complement(t_dist, (1 - level) / 2));
    Prediction p;
    p.predicted = m.predicted_at(x);
    const double h = m.leverage_at(x);
    const double mean_half = t * m.residual_sd * std::sqrt(h);
    const double reading_half = t * m.residual_sd * std::sqrt(1 + h);
    p.mean_low = p.predicted - mean_half;
    p.mean_high = p.predicted + mean_half;
    p.reading_low = p.predicted - reading_half;
    p.reading_high = p.predicted + reading_half;
    return p;
}

Table prediction_table(const LinearModel& m, const std::vector<std::optional<std::vector<double>>>& at, bool at_has_header,
                       double level, std::size_t column) {
    static const char* const header[] = {"predicted", "mean ci-low", "mean ci-high", "reading low", "reading high"};
    const auto values = [&](const Prediction& p) {
        return std::vector<CellValue>{p.predicted, p.mean_low, p.mean_high, p.reading_low, p.reading_high};
    };
    if (column < 5) {
        Table t(at.size(), std::vector<CellValue>(1));
        for (std::size_t i = 0; i < at.size(); ++i)
            if (at[i]) t[i][0] = values(predict_at(m, *at[i], level))[column];
        return t;
    }
    const std::size_t offset = at_has_header ? 0 : 1;
    Table t(at.size() + offset, std::vector<CellValue>(5));
    for (std::size_t c = 0; c < 5; ++c) t[0][c] = std::string(header[c]);
    for (std::size_t i = at_has_header ? 1 : 0; i < at.size(); ++i)
        if (at[i]) t[i + offset] = values(predict_at(m, *at[i], level));
    return t;
}

}  // namespace quadrat
