#include "describe.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <boost/math/distributions/students_t.hpp>

#include "refusal.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

CellValue number_or_blank(double x) {
    if (std::isfinite(x)) return x;
    return std::monostate{};
}

std::string mean_header(Transform t) {
    if (is_ratio_scale(t)) return "geometric mean";
    if (t == Transform::none) return "mean";
    return "back-transformed mean";
}

}  // namespace

Table describe_groups(const Groups& groups, Transform transform, double level) {
    if (groups.n_used == 0) throw Refusal(no_usable_rows(groups));
    Table table;
    table.push_back({std::string("group"), std::string("n"), mean_header(transform), std::string("ci-low"),
                     std::string("ci-high"), std::string("SD"), std::string("SE"), std::string("CV %"),
                     std::string("minimum"), std::string("q1"), std::string("median"), std::string("q3"),
                     std::string("maximum")});
    const std::size_t columns = table.front().size();

    // The transform's domain is checked over all groups at once, so the refusal counts every cell.
    std::vector<std::vector<double>> transformed;
    if (transform != Transform::none) {
        transformed = groups.values;
        apply_transform(transform, transformed);
    }

    for (std::size_t g = 0; g < groups.group_count(); ++g) {
        const std::vector<double>& raw = groups.values[g];
        const std::vector<double>& scaled = transform != Transform::none ? transformed[g] : raw;
        const std::size_t n = raw.size();
        std::vector<CellValue> row{groups.names[g], static_cast<double>(n)};
        if (n == 0) {
            // A wide-format column with no numbers: a row of its own, so the table keeps one row per column.
            row.resize(columns, std::monostate{});
            table.push_back(std::move(row));
            continue;
        }
        // The quartiles by selection (linear time), the extremes by one scan each.
        std::vector<double> work = raw;
        static constexpr double quartile_probabilities[] = {0.25, 0.5, 0.75};
        const std::vector<double> quartiles = quantiles_by_selection(work, quartile_probabilities);

        // The mean and SD once each (standard_deviation's own arithmetic); without a transform the
        // scaled values are the raw ones, so their mean and SD are these too.
        const double raw_mean = mean(raw);
        const double sd = n < 2 ? std::numeric_limits<double>::quiet_NaN()  // n = 1 → blank
                                : std::sqrt(sum_of_squares(raw, raw_mean) / static_cast<double>(n - 1));
        const double se = sd / std::sqrt(static_cast<double>(n));
        // CV % = 100 · SD / |arithmetic mean| on the data's scale, whatever the transform; blank at a zero mean.
        const double cv = raw_mean != 0 ? 100.0 * sd / std::fabs(raw_mean) : std::numeric_limits<double>::quiet_NaN();
        const bool same_scale = transform == Transform::none;
        const double centre = same_scale ? raw_mean : mean(scaled);
        double low = std::numeric_limits<double>::quiet_NaN();
        double high = low;
        if (n >= 2) {
            const double scaled_se = (same_scale ? sd : standard_deviation(scaled)) / std::sqrt(static_cast<double>(n));
            const boost::math::students_t t_dist(static_cast<double>(n - 1));
            const double t = boost::math::quantile(t_dist, 0.5 + level / 2.0);
            low = back_transform(transform, centre - t * scaled_se);
            high = back_transform(transform, centre + t * scaled_se);
        }
        row.push_back(back_transform(transform, centre));
        row.push_back(number_or_blank(low));
        row.push_back(number_or_blank(high));
        row.push_back(number_or_blank(sd));
        row.push_back(number_or_blank(se));
        row.push_back(number_or_blank(cv));
        row.push_back(*std::min_element(raw.begin(), raw.end()));
        // Quartiles as Calc's QUARTILE.INC (position (n − 1)p, linear interpolation), so a user can
        // check them in the sheet.
        row.push_back(quartiles[0]);
        row.push_back(quartiles[1]);
        row.push_back(quartiles[2]);
        row.push_back(*std::max_element(raw.begin(), raw.end()));
        table.push_back(std::move(row));
    }
    return table;
}

}  // namespace quadrat
