// The `transform` argument of location comparisons and its back-transformation.
#pragma once

#include <string>
#include <vector>

namespace quadrat {

enum class Transform { none, log, log10, log_plus_one, sqrt };  // order of transforms()

// Parses the keyword (none, log, log10, log(x+1), sqrt; case-insensitive; blank is none).
Transform parse_transform(const std::string& keyword);
std::string transform_keyword(Transform t);

// Applies the transform in place to every group. A value the transform cannot take is a
// refusal naming how many cells: "transform 'log' needs values > 0; 3 values are <= 0".
void apply_transform(Transform t, std::vector<std::vector<double>>& groups);
void apply_transform(Transform t, std::vector<double>& values);

// Back to the data's scale: exp / 10^ for the logs (a mean becomes a geometric mean; a difference
// of means becomes a ratio), x² for sqrt, e^x − 1 for log(x+1). Only meaningful for location values.
double back_transform(Transform t, double x);

// True for log and log10, whose differences back-transform to ratios.
inline bool is_ratio_scale(Transform t) { return t == Transform::log || t == Transform::log10; }

// Confidence level: a fraction in (0, 1) or a percentage from 50 to 99.9. Blank is 0.95.
// Anything else is a refusal.
double parse_level(double given, bool omitted);

}  // namespace quadrat
