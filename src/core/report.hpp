// Numbers in report sentences, by common practice in field and ecology reports (no single
// published source): p with three decimals and "p < 0.001" below that; statistics and estimates
// with two decimals, three significant digits when smaller than 0.1; Welch df with one decimal.
#pragma once

#include <string>

namespace quadrat {

// "p = 0.034", "p = 0.002", "p < 0.001".
std::string format_p(double p);
// 3.41, -0.12, 0.0123, 1.23e-05, 1250.00.
std::string format_number(double x);
// Degrees of freedom: whole numbers as integers (38), fractional ones with one decimal (37.4).
std::string format_df(double df);
// "95%" from 0.95; "99.9%" from 0.999.
std::string format_level(double level);

}  // namespace quadrat
