#include "predictors.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <unordered_map>

#include <boost/math/distributions/chi_squared.hpp>

#include "keywords.hpp"
#include "refusal.hpp"

namespace quadrat {

namespace {

// A reading rather than a label: a number, a censored value (`<0.5`) or a non-detect without its
// limit (`ND`). Such cells keep a column numeric, so that the data layer refuses them there.
bool reads_as_value(const Cell& c) {
    if (c.kind == CellKind::number) return true;
    return c.kind == CellKind::text && censored_text(c.text) != CensoredText::no;
}

// One column of a range, keeping its place on the sheet so that refusals name the right cell.
Range column_of(const Range& r, std::size_t column) {
    Range c;
    c.rows = r.rows;
    c.columns = 1;
    c.is_reference = r.is_reference;
    c.first_row = r.first_row;
    c.first_column = r.first_column + column;
    c.cells.reserve(r.rows);
    for (std::size_t row = 0; row < r.rows; ++row) c.cells.push_back(r.at(row, column));
    return c;
}

std::string column_name(const Frame& f, std::size_t k, std::size_t place) {
    return f.names[k].empty() ? "x" + std::to_string(place + 1) : f.names[k];
}

}  // namespace

std::vector<std::size_t> columns_without(const Factor& factor, std::size_t columns) {
    std::vector<std::size_t> kept;
    for (std::size_t j = 0; j < columns; ++j)
        if (j < factor.first_term || j >= factor.first_term + factor.terms()) kept.push_back(j);
    return kept;
}

std::vector<FactorTest> likelihood_ratio_tests(const std::vector<Factor>& factors, std::size_t columns, double log_likelihood,
                                               const std::function<double(const std::vector<std::size_t>&)>& log_likelihood_without) {
    std::vector<FactorTest> tests;
    for (const Factor& factor : factors) {
        FactorTest test{factor.name, std::numeric_limits<double>::quiet_NaN(), static_cast<double>(factor.terms()),
                        std::numeric_limits<double>::quiet_NaN()};
        try {
            test.statistic = std::max(0.0, 2 * (log_likelihood - log_likelihood_without(columns_without(factor, columns))));
            test.p = boost::math::cdf(boost::math::complement(boost::math::chi_squared(test.df), test.statistic));
        } catch (const Refusal&) {
            // The smaller model has no estimate (separation, a constant left over): no test to show.
        }
        tests.push_back(std::move(test));
    }
    return tests;
}

void append_factor_rows(Table& t, const std::vector<FactorTest>& tests, const std::string& symbol) {
    const auto cell = [](double x) -> CellValue {
        if (std::isfinite(x)) return x;
        return std::monostate{};
    };
    for (const FactorTest& f : tests) {
        t.push_back({f.name + ": " + symbol, cell(f.statistic)});
        t.push_back({f.name + ": df", cell(f.df)});
        t.push_back({f.name + ": p", cell(f.p)});
    }
}

bool is_factor_column(const Range& xs, std::size_t column) {
    std::size_t texts = 0, numbers = 0;
    for (std::size_t row = xs.rows > 1 ? 1 : 0; row < xs.rows; ++row) {
        const Cell& c = xs.at(row, column);
        if (reads_as_value(c))
            ++numbers;
        else if (is_label(c))
            ++texts;
    }
    return texts > 0 && numbers <= texts;
}

ModelFrame read_model_frame(const std::vector<FrameBlock>& before, const Range& xs, const std::vector<FrameBlock>& after) {
    if (xs.empty()) throw Refusal("xs is empty");
    std::vector<bool> factor(xs.columns);
    for (std::size_t j = 0; j < xs.columns; ++j) factor[j] = is_factor_column(xs, j);
    const bool any_factor = std::find(factor.begin(), factor.end(), true) != factor.end();

    // Numbers only: xs is one block, read without copying its cells.
    std::vector<Range> columns;
    std::vector<FrameBlock> blocks = before;
    if (!any_factor) {
        blocks.push_back({&xs, ColumnKind::numeric, "xs"});
    } else {
        columns.reserve(xs.columns);
        for (std::size_t j = 0; j < xs.columns; ++j) columns.push_back(column_of(xs, j));
        for (std::size_t j = 0; j < xs.columns; ++j)
            blocks.push_back({&columns[j], factor[j] ? ColumnKind::label : ColumnKind::numeric, "xs"});
    }
    blocks.insert(blocks.end(), after.begin(), after.end());

    ModelFrame m;
    m.frame = read_frame(blocks);
    for (const auto& b : before) m.xs_first += b.range->columns;
    const Frame& f = m.frame;
    Predictors& p = m.predictors;
    p.factor_of_column.assign(xs.columns, -1);
    for (std::size_t j = 0; j < xs.columns; ++j) {
        const std::size_t k = m.xs_first + j;
        const std::string name = column_name(f, k, j);
        if (!factor[j]) {
            p.columns.push_back(f.numbers[k]);
            p.names.push_back(name);
            continue;
        }
        Factor fac;
        fac.name = name;
        std::unordered_map<std::string, std::size_t> index;
        std::vector<std::size_t> level_of;
        level_of.reserve(f.labels[k].size());
        for (const auto& label : f.labels[k]) {
            const auto [it, fresh] = index.emplace(label, fac.levels.size());
            if (fresh) fac.levels.push_back(label);
            level_of.push_back(it->second);
        }
        if (fac.levels.size() < 2 && f.n_used > 0)
            throw Refusal(name + " holds one level (" + fac.levels.front() +
                          ") in the rows used; a factor needs two or more levels");
        fac.first_term = p.columns.size();
        for (std::size_t level = 1; level < fac.levels.size(); ++level) {
            std::vector<double> indicator(level_of.size());
            for (std::size_t i = 0; i < level_of.size(); ++i) indicator[i] = level_of[i] == level ? 1.0 : 0.0;
            p.columns.push_back(std::move(indicator));
            p.names.push_back(name + ": " + fac.levels[level]);
        }
        p.factor_of_column[j] = static_cast<int>(p.factors.size());
        p.factors.push_back(std::move(fac));
    }
    return m;
}

NewRows read_new_rows(const std::vector<Factor>& factors, const std::vector<int>& factor_of_column, const Range& at) {
    const std::size_t columns = factor_of_column.size();
    if (at.empty()) throw Refusal("at is empty");
    if (at.columns != columns)
        throw Refusal("at has " + count_of(at.columns, "column") + " but xs has " + std::to_string(columns) +
                      "; lay at out like xs, one column per predictor");
    const auto level_index = [&](const Factor& f, const std::string& label) -> std::size_t {
        const auto it = std::find(f.levels.begin(), f.levels.end(), label);
        return it == f.levels.end() ? f.levels.size() : static_cast<std::size_t>(it - f.levels.begin());
    };

    NewRows out;
    bool header = at.rows > 1;
    for (std::size_t j = 0; j < columns && header; ++j) {
        const Cell& c = at.at(0, j);
        const int f = factor_of_column[j];
        header = is_header_text(c) && (f < 0 || level_index(factors[f], label_of(c)) == factors[f].levels.size());
    }
    out.has_header = header;
    out.rows.resize(at.rows);
    for (std::size_t row = header ? 1 : 0; row < at.rows; ++row) {
        std::vector<double> x;
        bool complete = true;
        for (std::size_t j = 0; j < columns; ++j) {
            const Cell& c = at.at(row, j);
            if (c.kind == CellKind::error)
                throw Refusal(error_cell_message(at, row, j, "at"));
            refuse_censored_cell(at, row, j, "at", false);
            const int f = factor_of_column[j];
            if (f < 0) {
                complete = complete && c.kind == CellKind::number && std::isfinite(c.number);
                x.push_back(complete ? c.number : 0.0);
                continue;
            }
            if (!is_label(c)) {
                complete = false;
                continue;
            }
            const Factor& factor = factors[f];
            const std::string label = label_of(c);
            const std::size_t level = level_index(factor, label);
            if (level == factor.levels.size())
                throw Refusal((at.is_reference ? cell_address(at, row, j) + " holds " : "at holds ") + factor.name + " '" +
                              label + "', a level the data never had (" + join(factor.levels) +
                              "); a model predicts only at levels it was fitted on");
            for (std::size_t l = 1; l < factor.levels.size(); ++l) x.push_back(l == level ? 1.0 : 0.0);
        }
        if (complete) out.rows[row] = std::move(x);
    }
    return out;
}

}  // namespace quadrat
