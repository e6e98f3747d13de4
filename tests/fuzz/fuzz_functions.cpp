// libFuzzer target for every cell function: decodes the input into a function of the registry
// and arguments of mixed cells (numbers, blanks, texts, keywords, errors, NaN, ±Inf, ±1e308,
// denormals, duplicate and missing labels), and calls it through the same fence as the office.
// A crash, a sanitizer report, a hang (-timeout) or an "internal error" answer (an exception
// other than a refusal escaped the core) is a finding; each becomes a file in regressions/.
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <limits>
#include <string>
#include <vector>

#include "addin/registry.hpp"

namespace {

using quadrat::Cell;
using quadrat::Range;

class Bytes {
public:
    Bytes(const std::uint8_t* data, std::size_t size) : data_(data), size_(size) {}
    std::uint8_t byte() { return pos_ < size_ ? data_[pos_++] : 0; }
    double raw_double() {
        std::uint64_t bits = 0;
        for (int i = 0; i < 8; ++i) bits = (bits << 8) | byte();
        double x;
        std::memcpy(&x, &bits, sizeof x);
        return x;
    }
    bool done() const { return pos_ >= size_; }

private:
    const std::uint8_t* data_;
    std::size_t size_;
    std::size_t pos_ = 0;
};

// The texts a field sheet holds (missing markers, labels, values below a detection limit, non-
// detects), and every keyword of every table a declared argument takes (read from the registry,
// so a new method or function is fuzzed without editing this file).
const std::vector<std::string>& texts() {
    static const std::vector<std::string> t = [] {
        std::vector<std::string> all = {"", "n/a", "NA", "-", "\xE2\x80\x94", "?", "missing", "high", "low", "mid", "a",
                                        "b", "c", "2", "header", "present", "absent", "yes", "no", "<0.5", "< 0,5",
                                        "<DL", "ND", "n.d.", "BDL", "<"};
        for (const quadrat::KeywordTable* table : quadrat::addin::declared_keyword_tables())
            for (const auto& k : table->words()) all.push_back(k.word);
        return all;
    }();
    return t;
}

double number(Bytes& in) {
    static const double pool[] = {0.0, 1.0, -1.0, 2.5, 0.5, 1e-300, 4.9e-324, 1e308, -1e308, 1e15, 1e-15, 100.0,
                                  std::numeric_limits<double>::quiet_NaN(), std::numeric_limits<double>::infinity(),
                                  -std::numeric_limits<double>::infinity(), 3.0, 7.0, 0.05, 0.999, 1e6};
    const std::uint8_t k = in.byte();
    if (k < 96) return static_cast<double>(k % 12);          // small integers: ties and counts
    if (k < 160) return static_cast<double>(k) / 7.0 - 15.0;  // ordinary measurements
    if (k < 240) return pool[k % (sizeof pool / sizeof pool[0])];
    return in.raw_double();
}

Cell cell(Bytes& in) {
    const std::uint8_t k = in.byte() % 16;
    if (k < 9) return Cell::make_number(number(in));
    if (k < 11) return Cell{};
    if (k < 15) return Cell::make_text(texts()[in.byte() % texts().size()]);
    return Cell::make_error("#DIV/0!");
}

Range argument(Bytes& in) {
    const std::uint8_t shape = in.byte() % 8;
    if (shape == 0) return Range::omitted_argument();
    if (shape == 1) return Range::scalar(Cell::make_text(texts()[in.byte() % texts().size()]));
    if (shape == 2) return Range::scalar(cell(in));
    Range r;
    r.rows = 1 + in.byte() % 48;
    r.columns = shape == 7 ? 1 + in.byte() % 4 : 1;
    r.is_reference = true;
    r.first_row = in.byte();
    r.first_column = in.byte() % 30;
    r.cells.reserve(r.rows * r.columns);
    for (std::size_t i = 0; i < r.rows * r.columns; ++i) r.cells.push_back(cell(in));
    return r;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    Bytes in(data, size);
    const auto& functions = quadrat::addin::registry();
    const auto& f = *functions[in.byte() % functions.size()];
    quadrat::addin::Arguments args;
    for (std::size_t i = 0; i < f.arguments.size(); ++i) args.push_back(argument(in));
    // Shapes that line up are where the statistics run: sometimes copy the first argument's shape.
    if (args.size() > 1 && !args[0].omitted && (in.byte() & 1)) {
        for (std::size_t i = 1; i < args.size() && f.arguments[i].reference(); ++i) {
            Range& r = args.change(i);
            r.rows = args[0].rows;
            r.columns = 1;
            r.omitted = false;
            r.cells.resize(r.rows);
            for (auto& c : r.cells) c = cell(in);
        }
    }
    const quadrat::Table answer = quadrat::addin::call_fenced(f, args);
    if (answer.empty()) __builtin_trap();  // the cell would show nothing honest
    if (answer.size() == 1 && answer[0].size() == 1)
        if (const auto* text = std::get_if<std::string>(&answer[0][0]); text && text->rfind("internal error", 0) == 0)
            __builtin_trap();  // an exception other than a refusal escaped the core
    return 0;
}
