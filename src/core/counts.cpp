#include "counts.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>

#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/hypergeometric.hpp>
#include <boost/math/special_functions/gamma.hpp>

#include "data.hpp"
#include "keywords.hpp"
#include "refusal.hpp"
#include "summary.hpp"

namespace quadrat {

namespace {

// Counts above 2^53 are not whole numbers a double can tell apart, so they are refused rather
// than rounded silently.
constexpr double largest_exact_count = 9007199254740992.0;

// Boost's hypergeometric distribution takes unsigned margins and forms n + r as an int inside its
// cdf, so the exact 2×2 test stays below 2^30 observations; the χ² approximation is excellent
// long before that.
constexpr double largest_fisher_total = 1073741824.0;

// Fisher's two-sided p sums the tables no more probable than the observed one; probabilities
// equal on paper differ in the last bits, so "no larger" allows a relative 1e-7 (the tolerance
// scipy.stats.fisher_exact 1.10 uses, so the two agree on ties).
constexpr double fisher_relative_tolerance = 1e-7;

std::string where(const Range& r, std::size_t row, std::size_t column, const std::string& argument) {
    if (r.is_reference) return cell_address(r, row, column);
    return argument + " row " + std::to_string(row + 1) + " column " + std::to_string(column + 1);
}

std::string count_text(double x) { return number_label(x); }

// A count cell: a non-negative whole number (and not beyond what a double counts exactly).
double checked_count(const Range& r, std::size_t row, std::size_t column, const std::string& argument) {
    const Cell& c = r.at(row, column);
    const std::string at = where(r, row, column, argument);
    if (c.kind == CellKind::error) throw Refusal(error_cell_message(r, row, column, argument));
    if (c.kind == CellKind::empty) throw Refusal(at + " is empty; a count of none is entered as 0");
    if (c.kind == CellKind::text)
        throw Refusal(at + " holds text ('" + c.text + "'); counts must be whole numbers" +
                      (argument == "categories" ? " (to cross-tabulate labels, give the second label column as labels2)" : ""));
    const double x = c.number;
    if (!std::isfinite(x)) throw Refusal(at + " is not a number");
    if (x < 0) throw Refusal(at + " holds a negative count (" + count_text(x) + "); counts must be 0 or more");
    if (x != std::floor(x))
        throw Refusal(at + " holds " + count_text(x) + "; counts must be whole numbers (use the raw counts, not percentages)");
    if (x > largest_exact_count) throw Refusal(at + " holds a count too large to count exactly (over 2^53); counts must be raw tallies of observations");
    return x;
}

// Expected counts under independence, E_ij = R_i C_j / N.
struct Margins {
    std::vector<double> rows, columns;
    double total = 0;
};

Margins margins_of(const std::vector<std::vector<double>>& counts) {
    Margins m;
    m.rows.assign(counts.size(), 0.0);
    m.columns.assign(counts.front().size(), 0.0);
    for (std::size_t i = 0; i < counts.size(); ++i)
        for (std::size_t j = 0; j < counts[i].size(); ++j) {
            m.rows[i] += counts[i][j];
            m.columns[j] += counts[i][j];
            m.total += counts[i][j];
        }
    return m;
}

double expected_count(const Margins& m, std::size_t i, std::size_t j) { return m.rows[i] * (m.columns[j] / m.total); }

// Pearson's X² = Σ (O − E)²/E, written d·(d/E) so that huge counts do not overflow the square.
// With `yates`, each |O − E| is reduced by 0.5 but not past zero (Yates 1934, JRSS Suppl. 1, 217–235).
double pearson_statistic(const std::vector<std::vector<double>>& counts, const Margins& m, bool yates) {
    Accumulator x2;
    for (std::size_t i = 0; i < counts.size(); ++i)
        for (std::size_t j = 0; j < counts[i].size(); ++j) {
            const double e = expected_count(m, i, j);
            double d = std::fabs(counts[i][j] - e);
            if (yates) d -= std::min(0.5, d);
            x2.add(d * (d / e));
        }
    return x2.sum();
}

// The likelihood-ratio statistic G = 2 Σ O ln(O/E), empty cells contributing nothing
// (Sokal & Rohlf, Biometry, the G-test of independence).
double g_statistic(const std::vector<std::vector<double>>& counts, const Margins& m) {
    Accumulator g;
    for (std::size_t i = 0; i < counts.size(); ++i)
        for (std::size_t j = 0; j < counts[i].size(); ++j)
            if (counts[i][j] > 0) g.add(counts[i][j] * std::log(counts[i][j] / expected_count(m, i, j)));
    return std::max(0.0, 2.0 * g.sum());
}

double chi_square_upper_tail(double statistic, double df) {
    boost::math::chi_squared_distribution<double> dist(df);
    return boost::math::cdf(boost::math::complement(dist, statistic));
}

struct SmallExpected {
    double smallest = std::numeric_limits<double>::infinity();
    double below_five = 0;
};

void note_expected(SmallExpected& s, double e) {
    s.smallest = std::min(s.smallest, e);
    if (e < 5) s.below_five += 1;
}

}  // namespace

// ---------------------------------------------------------------------------------------------
// Reading

ContingencyTable read_count_block(const Range& block) {
    const std::string argument = "categories";
    if (block.empty()) throw Refusal(argument + " is empty");
    for (std::size_t i = 0; i < block.rows; ++i)
        for (std::size_t j = 0; j < block.columns; ++j)
            if (block.at(i, j).kind == CellKind::error) throw Refusal(error_cell_message(block, i, j, argument));

    // A text first row names the columns; a text first column names the rows. Each is decided on
    // its own cells beyond the corner, so a block with only row names still reads its first row.
    bool header_row = false, header_column = false;
    if (block.rows >= 2)
        for (std::size_t j = (block.columns >= 2 ? 1 : 0); j < block.columns; ++j)
            header_row = header_row || is_header_text(block.at(0, j));
    if (block.columns >= 2)
        for (std::size_t i = 1; i < block.rows; ++i) header_column = header_column || is_header_text(block.at(i, 0));
    const std::size_t row0 = header_row ? 1 : 0, col0 = header_column ? 1 : 0;

    // Rows and columns with nothing in their count cells are not categories (a whole-column
    // reference reaches far below the table).
    auto row_is_blank = [&](std::size_t i) {
        for (std::size_t j = col0; j < block.columns; ++j)
            if (block.at(i, j).kind != CellKind::empty) return false;
        return true;
    };
    auto column_is_blank = [&](std::size_t j) {
        for (std::size_t i = row0; i < block.rows; ++i)
            if (block.at(i, j).kind != CellKind::empty) return false;
        return true;
    };
    std::vector<std::size_t> rows, columns;
    for (std::size_t i = row0; i < block.rows; ++i)
        if (!row_is_blank(i)) rows.push_back(i);
    for (std::size_t j = col0; j < block.columns; ++j)
        if (!column_is_blank(j)) columns.push_back(j);

    ContingencyTable t;
    for (std::size_t i : rows) {
        const Cell& name = block.at(i, 0);
        t.row_names.push_back(header_column && is_header_text(name) ? name.text : "row " + std::to_string(i - row0 + 1));
    }
    for (std::size_t j : columns) {
        const Cell& name = block.at(0, j);
        t.column_names.push_back(header_row && is_header_text(name) ? name.text : "column " + std::to_string(j - col0 + 1));
    }
    for (std::size_t i : rows) {
        std::vector<double> line;
        line.reserve(columns.size());
        for (std::size_t j : columns) line.push_back(checked_count(block, i, j, argument));
        t.counts.push_back(std::move(line));
    }
    return t;
}

ContingencyTable cross_tabulate(const Range& labels1, const Range& labels2) {
    if (labels1.empty()) throw Refusal("categories is empty");
    if (labels2.empty()) throw Refusal("labels2 is empty");
    if (labels1.columns != 1 || labels2.columns != 1)
        throw Refusal("with labels2, categories and labels2 must each be one column of labels (found " +
                      std::to_string(labels1.columns) + " and " + std::to_string(labels2.columns) + ")");
    // Labels as codes in order of first appearance (no text per row): the table's rows and columns.
    Frame f = read_frame({{&labels1, ColumnKind::label, "categories"}, {&labels2, ColumnKind::label, "labels2"}},
                         LabelForm::codes);
    ContingencyTable t;
    t.n_dropped = f.n_dropped;
    t.row_names = std::move(f.levels[0]);
    t.column_names = std::move(f.levels[1]);
    t.counts.assign(t.row_names.size(), std::vector<double>(t.column_names.size(), 0.0));
    for (std::size_t k = 0; k < f.n_used; ++k) t.counts[f.codes[0][k]][f.codes[1][k]] += 1;
    return t;
}

// ---------------------------------------------------------------------------------------------
// Exact tests

double fisher_exact_2x2(double a, double b, double c, double d) {
    const double total = a + b + c + d;
    if (total > largest_fisher_total)
        throw Refusal("too many observations for Fisher's exact test (" + count_text(total) +
                      ", the limit is 2^30); at these counts use method chi-square");
    // X = a is hypergeometric: a population of N = total holding r = a + c "successes" (the
    // first column), of which a sample of n = a + b (the first row) is drawn.
    const auto N = static_cast<unsigned>(total);
    const auto r = static_cast<unsigned>(a + c);
    const auto n = static_cast<unsigned>(a + b);
    const auto x = static_cast<unsigned>(a);
    boost::math::hypergeometric_distribution<double> dist(r, n, N);
    const unsigned lowest = (n + r > N) ? n + r - N : 0u;
    const unsigned highest = std::min(n, r);
    const unsigned mode = static_cast<unsigned>(std::floor((double(r) + 1) * (double(n) + 1) / (double(N) + 2)));

    const double p_observed = boost::math::pdf(dist, x);
    const double p_mode = boost::math::pdf(dist, mode);
    const double bound = p_observed * (1 + fisher_relative_tolerance);
    if (p_mode <= bound) return 1.0;

    // The probabilities fall monotonically away from the mode, so the tables no more probable
    // than the observed one are the observed tail and a tail on the other side, found by bisection.
    double p;
    if (x < mode) {
        p = boost::math::cdf(dist, x);
        if (boost::math::pdf(dist, highest) <= bound) {
            unsigned lo = mode, hi = highest;  // pdf(lo) > bound, pdf(hi) <= bound
            while (hi - lo > 1) {
                const unsigned mid = lo + (hi - lo) / 2;
                (boost::math::pdf(dist, mid) <= bound ? hi : lo) = mid;
            }
            p += boost::math::cdf(boost::math::complement(dist, hi - 1));
        }
    } else {
        p = x > lowest ? boost::math::cdf(boost::math::complement(dist, x - 1)) : 1.0;
        if (boost::math::pdf(dist, lowest) <= bound) {
            unsigned lo = lowest, hi = mode;  // pdf(lo) <= bound, pdf(hi) > bound
            while (hi - lo > 1) {
                const unsigned mid = lo + (hi - lo) / 2;
                (boost::math::pdf(dist, mid) <= bound ? lo : hi) = mid;
            }
            p += boost::math::cdf(dist, lo);
        }
    }
    return std::min(1.0, p);
}

// Freeman, G. H. & Halton, J. H. (1951) Biometrika 38, 141–149: the probability of an r×c table
// with fixed margins is Π R_i! Π C_j! / (N! Π n_ij!), and the p-value sums it over every table
// with the observed margins that is no more probable than the observed one. The tables are
// enumerated cell by cell, column by column, each cell between the bounds its margins allow; the
// number of steps is capped so that a large table is refused instead of hanging the sheet.
double fisher_exact_rxc(const std::vector<std::vector<double>>& counts, double max_steps) {
    if (counts.empty() || counts.front().empty()) throw Refusal("the table is empty");
    const std::size_t R = counts.size(), C = counts.front().size();
    const Margins m = margins_of(counts);
    auto refuse_size = [&] {
        throw Refusal("this " + std::to_string(R) + "x" + std::to_string(C) + " table with " + count_text(m.total) +
                      " observations is too large for Fisher's exact test; use method chi-square or g");
    };
    // The log-factorial table holds one entry per observation; beyond 100,000 observations the
    // enumeration would be refused anyway on any table with more than a handful of tables.
    if (R * C > 400 || m.total > 100000) refuse_size();

    std::vector<double> log_factorial(static_cast<std::size_t>(m.total) + 1, 0.0);
    for (std::size_t k = 2; k < log_factorial.size(); ++k) log_factorial[k] = log_factorial[k - 1] + std::log(double(k));
    auto lf = [&](double k) { return log_factorial[static_cast<std::size_t>(k)]; };

    double log_constant = -lf(m.total);
    for (double r : m.rows) log_constant += lf(r);
    for (double c : m.columns) log_constant += lf(c);
    double log_observed = log_constant;
    for (const auto& row : counts)
        for (double x : row) log_observed -= lf(x);
    const double log_bound = log_observed + std::log1p(fisher_relative_tolerance);

    std::vector<double> remaining_row = m.rows;
    std::vector<double> total_after(C, m.total);  // observations left for columns j+1, …
    for (std::size_t j = 0; j < C; ++j) total_after[j] = (j ? total_after[j - 1] : m.total) - m.columns[j];
    double steps = 0;
    Accumulator p;

    // Fills cell (i, j): `left` still to place in column j, `rows_left` = Σ_{k >= i} remaining_row[k],
    // `log_p` the log-probability of the cells filled so far.
    std::function<void(std::size_t, std::size_t, double, double, double)> fill =
        [&](std::size_t i, std::size_t j, double left, double rows_left, double log_p) {
            if (++steps > max_steps) refuse_size();
            if (j == C - 1) {
                // The last column takes what every row has left.
                double lp = log_p;
                for (double r : remaining_row) lp -= lf(r);
                if (lp <= log_bound) p.add(std::exp(lp));
                return;
            }
            if (i == R - 1) {
                // The last row of a column takes what the column has left (the bounds above make it fit).
                remaining_row[i] -= left;
                fill(0, j + 1, m.columns[j + 1], total_after[j], log_p - lf(left));
                remaining_row[i] += left;
                return;
            }
            const double below = rows_left - remaining_row[i];  // what the rows under this one can hold
            const double lo = std::max(0.0, left - below), hi = std::min(left, remaining_row[i]);
            for (double v = lo; v <= hi; v += 1) {
                remaining_row[i] -= v;
                fill(i + 1, j, left - v, below, log_p - lf(v));
                remaining_row[i] += v;
            }
        };
    fill(0, 0, m.columns[0], m.total, log_constant);
    return std::min(1.0, p.sum());
}

// ---------------------------------------------------------------------------------------------
// The tests

TestResult compare_counts(const ContingencyTable& table, const std::string& method_keyword) {
    const std::string method = count_methods().match(method_keyword, "method", "chi-square");
    const std::size_t R = table.counts.size(), C = R ? table.counts.front().size() : 0;
    if (R < 2 || C < 2)
        throw Refusal("needs at least 2 rows and 2 columns of categories, found " + std::to_string(R) + "x" +
                      std::to_string(C) + "; for one set of counts against expected shares use COMPARE.EXPECTED");
    const Margins m = margins_of(table.counts);
    for (std::size_t i = 0; i < R; ++i)
        if (m.rows[i] == 0)
            throw Refusal("row '" + table.row_names[i] + "' has no observations (total 0); remove that category");
    for (std::size_t j = 0; j < C; ++j)
        if (m.columns[j] == 0)
            throw Refusal("column '" + table.column_names[j] + "' has no observations (total 0); remove that category");
    const bool two_by_two = R == 2 && C == 2;
    if (method == "yates" && !two_by_two)
        throw Refusal("method 'yates' is for 2x2 tables; this table is " + std::to_string(R) + "x" + std::to_string(C) +
                      " (use chi-square, g or fisher)");

    const double df = double(R - 1) * double(C - 1);
    SmallExpected small;
    for (std::size_t i = 0; i < R; ++i)
        for (std::size_t j = 0; j < C; ++j) note_expected(small, expected_count(m, i, j));

    // Cramér's V from the uncorrected Pearson X², whatever the method, so that the effect does not
    // change with the test chosen (Cramér 1946, Mathematical Methods of Statistics, §21.9);
    // for 2×2 it is |φ|.
    const double pearson = pearson_statistic(table.counts, m, false);
    const double effect = std::sqrt(pearson / (m.total * double(std::min(R, C) - 1)));

    TestResult r;
    double statistic = std::numeric_limits<double>::quiet_NaN(), p;
    if (method == "chi-square") {
        r.test = "Pearson's chi-square test";
        statistic = pearson;
        p = chi_square_upper_tail(statistic, df);
    } else if (method == "yates") {
        r.test = "Chi-square test with Yates' continuity correction";
        statistic = pearson_statistic(table.counts, m, true);
        p = chi_square_upper_tail(statistic, df);
    } else if (method == "g") {
        r.test = "G-test (likelihood ratio)";
        statistic = g_statistic(table.counts, m);
        p = chi_square_upper_tail(statistic, df);
    } else if (two_by_two) {
        r.test = "Fisher's exact test";
        p = fisher_exact_2x2(table.counts[0][0], table.counts[0][1], table.counts[1][0], table.counts[1][1]);
    } else {
        r.test = "Fisher–Freeman–Halton exact test";
        p = fisher_exact_rxc(table.counts);
    }

    // An exact test has no test statistic: `statistic` and `df` are then not available.
    if (method != "fisher") r.add("statistic", statistic).add("df", df);
    r.add("p", p).add("n", m.total).add("n dropped", double(table.n_dropped)).add("effect", effect);
    r.add("smallest expected count", small.smallest).add("cells expected below 5", small.below_five);

    r.words.shown = true;
    r.words.statistic_form = method == "fisher" ? ReportWords::Statistic::none : ReportWords::Statistic::number;
    r.words.statistic_symbol = method == "g" ? "G" : "χ²";
    r.words.statistic_df = true;
    r.words.n_after_p = true;
    r.words.effect = two_by_two ? "φ" : "Cramér's V";
    return r;
}

TestResult compare_expected(const std::vector<double>& observed, const std::vector<double>& expected,
                            std::size_t n_dropped) {
    const std::size_t k = observed.size();
    if (k < 2) throw Refusal("needs at least 2 categories of counts, found " + std::to_string(k));
    if (!expected.empty() && expected.size() != k)
        throw Refusal("expected has " + std::to_string(expected.size()) + " values for " + std::to_string(k) +
                      " observed counts; give one per category");
    double n = 0;
    for (double o : observed) n += o;
    if (n == 0) throw Refusal("the observed counts are all 0; nothing to test");
    double expected_total = 0;
    for (double e : expected) expected_total += e;

    // Expected proportions or counts are rescaled to the observed total (equal shares when omitted).
    Accumulator x2;
    SmallExpected small;
    for (std::size_t i = 0; i < k; ++i) {
        const double e = expected.empty() ? n / double(k) : n * (expected[i] / expected_total);
        note_expected(small, e);
        const double d = observed[i] - e;
        x2.add(d * (d / e));
    }
    const double statistic = x2.sum();
    // Counts near the largest doubles make a total, a share or a square overflow: refuse rather than
    // hand an infinite or undefined χ² on.
    if (!std::isfinite(statistic))
        throw Refusal("the counts are too large to test (a total or a square is beyond the range of numbers); "
                      "give counts in their own units");
    const double df = double(k - 1);
    const double p = chi_square_upper_tail(statistic, df);

    TestResult r;
    r.test = "Chi-square goodness-of-fit test";
    r.add("statistic", statistic).add("df", df).add("p", p).add("n", n).add("n dropped", double(n_dropped));
    r.add("smallest expected count", small.smallest).add("cells expected below 5", small.below_five);
    r.words.shown = true;
    r.words.statistic_symbol = "χ²";
    r.words.statistic_df = true;
    r.words.n_after_p = true;
    return r;
}

// ---------------------------------------------------------------------------------------------
// COMPARE.EXPECTED's arguments

namespace {

// The cells of a one-row or one-column argument in order, without a header cell (text over
// numbers) and without trailing empty cells.
struct LineCells {
    std::vector<std::pair<std::size_t, std::size_t>> positions;  // (row, column) in the range
};

LineCells line_cells(const Range& r, const std::string& argument) {
    if (r.rows != 1 && r.columns != 1)
        throw Refusal(argument + " must be one row or one column (found " + std::to_string(r.rows) + "x" +
                      std::to_string(r.columns) + " cells)");
    LineCells line;
    const std::size_t length = r.cells.size();
    for (std::size_t k = 0; k < length; ++k) line.positions.emplace_back(r.rows == 1 ? 0 : k, r.rows == 1 ? k : 0);
    while (!line.positions.empty() && r.at(line.positions.back().first, line.positions.back().second).kind == CellKind::empty)
        line.positions.pop_back();
    if (line.positions.size() >= 2) {
        const auto [i, j] = line.positions.front();
        bool numbers_below = false;
        for (std::size_t k = 1; k < line.positions.size(); ++k)
            numbers_below = numbers_below || r.at(line.positions[k].first, line.positions[k].second).kind == CellKind::number;
        if (is_header_text(r.at(i, j)) && numbers_below) line.positions.erase(line.positions.begin());
    }
    return line;
}

bool is_missing_cell(const Cell& c) { return c.kind == CellKind::empty || (c.kind == CellKind::text && is_missing_marker(c.text)); }

}  // namespace

ExpectedInput read_expected_input(const Range& observed, const Range& expected) {
    if (observed.empty()) throw Refusal("observed is empty");
    const LineCells obs = line_cells(observed, "observed");
    const bool has_expected = !expected.empty() &&
                              !(expected.cells.size() == 1 && expected.cells.front().kind == CellKind::empty);
    LineCells exp;
    if (has_expected) {
        exp = line_cells(expected, "expected");
        if (exp.positions.size() != obs.positions.size())
            throw Refusal("expected has " + std::to_string(exp.positions.size()) + " values for " +
                          std::to_string(obs.positions.size()) + " observed counts; give one per category");
    }
    ExpectedInput in;
    for (std::size_t k = 0; k < obs.positions.size(); ++k) {
        const auto [oi, oj] = obs.positions[k];
        const Cell& o = observed.at(oi, oj);
        if (o.kind == CellKind::error) throw Refusal(error_cell_message(observed, oi, oj, "observed"));
        bool missing = is_missing_cell(o);
        if (has_expected) {
            const auto [ei, ej] = exp.positions[k];
            const Cell& e = expected.at(ei, ej);
            if (e.kind == CellKind::error) throw Refusal(error_cell_message(expected, ei, ej, "expected"));
            missing = missing || is_missing_cell(e);
            if (!missing) {
                if (e.kind != CellKind::number || !std::isfinite(e.number))
                    throw Refusal(where(expected, ei, ej, "expected") + " must be a number");
                if (e.number <= 0)
                    throw Refusal(where(expected, ei, ej, "expected") + " must be positive (found " +
                                  count_text(e.number) + "); every category needs a share above 0");
            }
        }
        if (missing) {
            ++in.n_dropped;
            continue;
        }
        in.observed.push_back(checked_count(observed, oi, oj, "observed"));
        if (has_expected) {
            const auto [ei, ej] = exp.positions[k];
            in.expected.push_back(expected.at(ei, ej).number);
        }
    }
    return in;
}

}  // namespace quadrat
