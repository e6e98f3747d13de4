// The UNO seam: with range_store.cpp, the only files that see office types. Thin and boring on purpose.
// Each cell function (generated into functions.inc from the registry) does the same three steps:
// convert the arguments into quadrat::Range (a range argument from the document's store of read
// ranges, range_store.hpp) → quadrat::addin::call_fenced → convert the Table back into what the
// cell shows. A second fence here catches whatever the conversions throw, so
// no exception ever crosses the UNO boundary (a crash would take the user's office down).
//
// Registered through configuration only (extension/quadrat.components + CalcAddIns.xcu): the
// implementation offers the service org.quadrat.Functions and not the generic add-in service,
// so Calc takes names and wizard texts from the .xcu and loads this library on first use.

#include <array>
#include <cmath>
#include <cstdint>
#include <functional>
#include <memory>
#include <string>

#include <com/sun/star/beans/XPropertySet.hpp>
#include <com/sun/star/lang/XServiceInfo.hpp>
#include <com/sun/star/lang/XServiceName.hpp>
#include <com/sun/star/sheet/CellFlags.hpp>
#include <com/sun/star/sheet/FormulaResult.hpp>
#include <com/sun/star/sheet/XCellRangeAddressable.hpp>
#include <com/sun/star/sheet/XCellRangeData.hpp>
#include <com/sun/star/sheet/XCellRangesQuery.hpp>
#include <com/sun/star/sheet/XSheetCellCursor.hpp>
#include <com/sun/star/sheet/XSheetCellRanges.hpp>
#include <com/sun/star/sheet/XSheetCellRange.hpp>
#include <com/sun/star/sheet/XSpreadsheet.hpp>
#include <com/sun/star/sheet/XUsedAreaCursor.hpp>
#include <com/sun/star/table/CellRangeAddress.hpp>
#include <com/sun/star/table/XCell.hpp>
#include <com/sun/star/table/XCellRange.hpp>
#include <com/sun/star/uno/XComponentContext.hpp>
#include <cppuhelper/factory.hxx>
#include <cppuhelper/implbase3.hxx>
#include <cppuhelper/implementationentry.hxx>
#include <cppuhelper/supportsservice.hxx>
#include <org/quadrat/XFunctions.hpp>
#include <rtl/string.hxx>
#include <rtl/ustring.hxx>

#include "addin/clip.hpp"
#include "addin/registry.hpp"
#include "addin/uno/range_store.hpp"
#include "core/cells.hpp"

namespace css = com::sun::star;
using rtl::OString;
using rtl::OUString;

namespace {

using quadrat::Cell;
using quadrat::CellValue;
using quadrat::Range;
using quadrat::Table;
using quadrat::addin::Arguments;
using quadrat::addin::Clip;

constexpr const char* implementation_name = "org.quadrat.calc.Functions";
constexpr const char* service_name = "org.quadrat.Functions";

std::string to_utf8(const OUString& text) {
    const OString bytes = rtl::OUStringToOString(text, RTL_TEXTENCODING_UTF8);
    return std::string(bytes.getStr(), bytes.getLength());
}

OUString from_utf8(const std::string& text) {
    return OUString(text.data(), static_cast<sal_Int32>(text.size()), RTL_TEXTENCODING_UTF8);
}

// The name Calc shows for an error code (ScGlobal's FormulaError values; the rest as Err:nnn).
std::string error_name(sal_Int32 code) {
    switch (code) {
        case 532: return "#DIV/0!";
        case 519: return "#VALUE!";
        case 524: return "#REF!";
        case 525: return "#NAME?";
        case 503: return "#NUM!";
        case 521: return "#NULL!";
        case 32767: return "#N/A";
        default: return "Err:" + std::to_string(code);
    }
}

// One value as handed over by Calc (from getDataArray or an `any` argument). Logicals arrive as
// 1/0; an empty string is an empty cell. A void value inside an `any` block is an empty cell.
Cell cell_from(const css::uno::Any& value) {
    switch (value.getValueTypeClass()) {
        case css::uno::TypeClass_DOUBLE:
        case css::uno::TypeClass_FLOAT:
        case css::uno::TypeClass_LONG:
        case css::uno::TypeClass_SHORT:
        case css::uno::TypeClass_HYPER:
        case css::uno::TypeClass_BYTE: {
            double x = 0.0;
            value >>= x;
            return Cell::make_number(x);
        }
        case css::uno::TypeClass_BOOLEAN: {
            bool b = false;
            value >>= b;
            return Cell::make_number(b ? 1.0 : 0.0);
        }
        case css::uno::TypeClass_STRING: {
            OUString s;
            value >>= s;
            if (s.isEmpty()) return Cell{};
            return Cell::make_text(to_utf8(s));
        }
        default: return Cell{};
    }
}

// Ranges up to this many rows are read whole (at most about 1.5 ms), so their shape is exactly
// the sheet's: row-aligned results (CHECK.QQ, FIT.POINTS) then have the input's rows. Longer
// ranges (whole columns A:A, open-ended B2:B100000) are read down to the end of the used area.
constexpr sal_Int32 rows_read_whole = 10000;

// The last row of `reference` worth reading: its own last row, or for a long range the last row of
// the sheet's used area when that comes first. The start is never moved, so row positions and
// cell names stay true.
sal_Int32 last_row_to_read(const css::uno::Reference<css::table::XCellRange>& reference, const css::table::CellRangeAddress& address) {
    sal_Int32 last_row = address.EndRow;
    css::uno::Reference<css::sheet::XSheetCellRange> sheet_range(reference, css::uno::UNO_QUERY);
    if (sheet_range.is() && address.EndRow - address.StartRow + 1 > rows_read_whole) {
        css::uno::Reference<css::sheet::XSpreadsheet> sheet = sheet_range->getSpreadsheet();
        css::uno::Reference<css::sheet::XSheetCellCursor> cursor = sheet->createCursor();
        css::uno::Reference<css::sheet::XUsedAreaCursor> used(cursor, css::uno::UNO_QUERY);
        css::uno::Reference<css::sheet::XCellRangeAddressable> used_address(cursor, css::uno::UNO_QUERY);
        if (used.is() && used_address.is()) {
            used->gotoStartOfUsedArea(false);
            used->gotoEndOfUsedArea(true);
            // Rows only: a block keeps its columns, so a wide-format column with nothing in it
            // yet is still a group.
            last_row = std::min(last_row, used_address->getRangeAddress().EndRow);
        }
    }
    return last_row;
}

// Texts as UTF-8, each distinct office string converted once per read: Calc hands identical
// texts of a column over as one shared string, so a label column of a few sites costs a few
// conversions, not one per row.
class TextCells {
public:
    Cell cell(const OUString& text) {
        if (text.isEmpty()) return Cell{};
        const rtl_uString* key = text.pData;
        Slot& slot = slots_[(reinterpret_cast<std::uintptr_t>(key) >> 4) % slots_.size()];
        if (slot.key != key) {
            slot.key = key;
            slot.utf8 = to_utf8(text);
        }
        return Cell::make_text(slot.utf8);
    }

private:
    struct Slot {
        const rtl_uString* key = nullptr;  // alive as long as the block being read holds it
        std::string utf8;
    };
    std::array<Slot, 64> slots_{};
};

// One reference argument, read: cells in one getDataArray() call over rows first..last_row; an
// error cell arrives as a void value and is looked up to name its error (#DIV/0!, Err:504, …).
// `dates`: also say whether the used cells hold date or time content (Range::dates).
quadrat::seam::RangeRead read_reference(const css::uno::Reference<css::table::XCellRange>& reference,
                                        const css::table::CellRangeAddress& address, sal_Int32 last_row, bool dates) {
    quadrat::seam::RangeRead read;
    Range& range = read.range;
    range.is_reference = true;
    range.first_row = static_cast<std::size_t>(address.StartRow);
    range.first_column = static_cast<std::size_t>(address.StartColumn);
    read.sheet_rows = static_cast<std::size_t>(address.EndRow - address.StartRow + 1);
    range.columns = static_cast<std::size_t>(address.EndColumn - address.StartColumn + 1);
    if (last_row < address.StartRow) return read;  // wholly below the used area: nothing in it

    css::uno::Reference<css::table::XCellRange> used_part =
        reference->getCellRangeByPosition(0, 0, address.EndColumn - address.StartColumn, last_row - address.StartRow);
    css::uno::Reference<css::sheet::XCellRangeData> data(used_part, css::uno::UNO_QUERY_THROW);
    const css::uno::Sequence<css::uno::Sequence<css::uno::Any>> rows = data->getDataArray();
    range.rows = static_cast<std::size_t>(rows.getLength());
    range.cells.reserve(range.rows * range.columns);
    TextCells texts;
    for (sal_Int32 r = 0; r < rows.getLength(); ++r) {
        const css::uno::Sequence<css::uno::Any>& row = rows[r];
        for (sal_Int32 c = 0; c < static_cast<sal_Int32>(range.columns); ++c) {
            if (c >= row.getLength()) {
                range.cells.emplace_back();
                continue;
            }
            const css::uno::Any& value = row[c];
            if (value.getValueTypeClass() == css::uno::TypeClass_STRING) {
                range.cells.push_back(texts.cell(*static_cast<const OUString*>(value.getValue())));
                continue;
            }
            if (value.hasValue()) {
                range.cells.push_back(cell_from(value));
                continue;
            }
            // A void value is an error cell: ask the cell which error.
            css::uno::Reference<css::table::XCell> cell = used_part->getCellByPosition(c, r);
            const sal_Int32 code = cell.is() ? cell->getError() : 0;
            range.cells.push_back(code != 0 ? Cell::make_error(error_name(code)) : Cell{});
        }
    }
    css::uno::Reference<css::sheet::XCellRangesQuery> query(used_part, css::uno::UNO_QUERY);
    // Formula cells can change at a recalculation without an edit: such a read is not stored.
    // (queryFormulaCells visits formula cells only; queryContentCells(FORMULA) would look up the
    // number format of every value cell on its way.)
    if (query.is()) {
        using css::sheet::FormulaResult::VALUE;
        using css::sheet::FormulaResult::STRING;
        using css::sheet::FormulaResult::ERROR;
        const css::uno::Reference<css::sheet::XSheetCellRanges> found = query->queryFormulaCells(VALUE | STRING | ERROR);
        read.has_formulas = !found.is() || found->getRangeAddresses().getLength() > 0;
    } else {
        read.has_formulas = true;  // cannot tell: treated as holding them (never stored)
    }
    // Date formatting, only where the declaration asks (one query over the used part): numbers
    // formatted as dates or times are day numbers (TRACK.TREND's slope per year).
    if (dates && query.is()) {
        const css::uno::Reference<css::sheet::XSheetCellRanges> found = query->queryContentCells(css::sheet::CellFlags::DATETIME);
        range.dates = found.is() && found->getRangeAddresses().getLength() > 0;
    }
    return read;
}

// A reference argument: from the document's store of read ranges (range_store.hpp), or read.
std::shared_ptr<const quadrat::seam::RangeRead> from_reference(const void* document,
                                                               const css::uno::Reference<css::table::XCellRange>& reference,
                                                               bool dates) {
    if (!reference.is()) {
        auto omitted = std::make_shared<quadrat::seam::RangeRead>();
        omitted->range = Range::omitted_argument();
        return omitted;
    }
    css::uno::Reference<css::sheet::XCellRangeAddressable> addressable(reference, css::uno::UNO_QUERY_THROW);
    quadrat::seam::RangeKey key;
    key.document = document;
    key.address = addressable->getRangeAddress();
    key.last_row = last_row_to_read(reference, key.address);
    key.dates = dates;
    return quadrat::seam::stored_read(key, reference, [&] { return read_reference(reference, key.address, key.last_row, dates); });
}

bool is_empty_value(const css::uno::Any& value) {
    if (!value.hasValue()) return true;
    if (value.getValueTypeClass() != css::uno::TypeClass_STRING) return false;
    OUString s;
    value >>= s;
    return s.isEmpty();
}

// An `any` argument: omitted (void), a typed number or text, or a block (a range or an inline
// array such as {1;2;3}); a block beside a clipped reference is cut to its rows (clip.hpp).
Range from_any(const css::uno::Any& value, const std::vector<Clip>& clips) {
    if (!value.hasValue()) return Range::omitted_argument();
    css::uno::Sequence<css::uno::Sequence<css::uno::Any>> block;
    if (value.getValueTypeClass() == css::uno::TypeClass_SEQUENCE && (value >>= block)) {
        Range range;
        range.rows = static_cast<std::size_t>(block.getLength());
        for (const auto& row : block) range.columns = std::max(range.columns, static_cast<std::size_t>(row.getLength()));
        range.rows = quadrat::addin::rows_to_read(range.rows, clips, [&](std::size_t r) {
            for (const css::uno::Any& cell : block[static_cast<sal_Int32>(r)])
                if (!is_empty_value(cell)) return false;
            return true;
        });
        range.cells.reserve(range.rows * range.columns);
        for (sal_Int32 r = 0; r < static_cast<sal_Int32>(range.rows); ++r) {
            const css::uno::Sequence<css::uno::Any>& row = block[r];
            for (sal_Int32 c = 0; c < static_cast<sal_Int32>(range.columns); ++c)
                range.cells.push_back(c < row.getLength() ? cell_from(row[c]) : Cell{});
        }
        return range;
    }
    return Range::scalar(cell_from(value));
}

// What one output cell shows. Never a void any (Calc shows #N/A) and never a boolean.
css::uno::Any any_from(const CellValue& value) {
    if (const double* x = std::get_if<double>(&value)) {
        // Calc encodes its errors in NaN payloads: a non-finite number must not reach it.
        if (!std::isfinite(*x)) return css::uno::Any(OUString("not a finite number"));
        return css::uno::Any(*x);
    }
    if (const std::string* s = std::get_if<std::string>(&value)) return css::uno::Any(from_utf8(*s));
    return css::uno::Any(OUString());
}

css::uno::Any any_from(const Table& table) {
    if (table.empty() || table.front().empty()) return css::uno::Any(OUString("no result for these cells"));
    if (table.size() == 1 && table.front().size() == 1) return any_from(table.front().front());
    std::size_t columns = 0;
    for (const auto& row : table) columns = std::max(columns, row.size());
    css::uno::Sequence<css::uno::Sequence<css::uno::Any>> block(static_cast<sal_Int32>(table.size()));
    css::uno::Sequence<css::uno::Any>* rows = block.getArray();
    for (std::size_t r = 0; r < table.size(); ++r) {
        css::uno::Sequence<css::uno::Any> row(static_cast<sal_Int32>(columns));
        css::uno::Any* cells = row.getArray();
        for (std::size_t c = 0; c < columns; ++c)
            cells[c] = c < table[r].size() ? any_from(table[r][c]) : css::uno::Any(OUString());
        rows[r] = row;
    }
    return css::uno::Any(block);
}

// The arguments of one call. References are converted as they come; `any` arguments once the
// references are read, so that a whole column can be cut to the rows a clipped reference kept.
class Call {
public:
    // `document`: the calling document (its store of read ranges), nullptr when there is none.
    Call(std::size_t count, const void* document) : document_(document) { arguments_.reserve(count); }

    void reference(const css::uno::Reference<css::table::XCellRange>& argument, bool dates = false) {
        const auto read = from_reference(document_, argument, dates);
        if (read->sheet_rows > read->range.rows) clips_.push_back({read->sheet_rows, read->range.rows});
        arguments_.push_back(std::shared_ptr<const Range>(read, &read->range));
    }
    // The Any lives in the caller's frame for the whole call.
    void value(const css::uno::Any& argument) {
        pending_.push_back({arguments_.size(), &argument});
        arguments_.push_back(Range{});
    }

    const Arguments& arguments() {
        for (const Pending& p : pending_) arguments_.set(p.index, from_any(*p.value, clips_));
        pending_.clear();
        return arguments_;
    }

private:
    struct Pending {
        std::size_t index;
        const css::uno::Any* value;
    };
    const void* document_;
    Arguments arguments_;
    std::vector<Clip> clips_;
    std::vector<Pending> pending_;
};

class Functions : public cppu::WeakImplHelper3<org::quadrat::XFunctions, css::lang::XServiceInfo, css::lang::XServiceName> {
public:
    // The cell functions, one per shipped registry row (generated).
#include "functions.inc"

    // XServiceInfo
    OUString SAL_CALL getImplementationName() override { return OUString::createFromAscii(implementation_name); }
    sal_Bool SAL_CALL supportsService(const OUString& name) override { return cppu::supportsService(this, name); }
    css::uno::Sequence<OUString> SAL_CALL getSupportedServiceNames() override { return supported_services(); }

    // XServiceName
    OUString SAL_CALL getServiceName() override { return OUString::createFromAscii(service_name); }

    static css::uno::Sequence<OUString> supported_services() {
        css::uno::Sequence<OUString> names(1);
        names.getArray()[0] = OUString::createFromAscii(service_name);
        return names;
    }

private:
    // The fence around one call: conversions in, the fenced handler, conversion out.
    static css::uno::Any answer(const char* method, const css::uno::Reference<css::beans::XPropertySet>& document,
                                const std::function<void(Call&)>& convert) noexcept {
        try {
            const quadrat::addin::Function* function = quadrat::addin::find_function(method);
            if (!function) return css::uno::Any(OUString("this function is not available in this version"));
            // The document's identity: its XInterface (the one object UNO promises per component).
            const css::uno::Reference<css::uno::XInterface> identity(document, css::uno::UNO_QUERY);
            Call call(function->arguments.size(), identity.get());
            convert(call);
            return any_from(quadrat::addin::call_fenced(*function, call.arguments()));
        } catch (const std::bad_alloc&) {
            return css::uno::Any(OUString("not enough memory for this range"));
        } catch (const css::uno::Exception& e) {
            return css::uno::Any(OUString("cannot read the cells: ") + e.Message);
        } catch (...) {
            return css::uno::Any(OUString("internal error while reading the cells"));
        }
    }
};

css::uno::Reference<css::uno::XInterface> SAL_CALL create_functions(const css::uno::Reference<css::uno::XComponentContext>&) {
    return static_cast<cppu::OWeakObject*>(new Functions);
}

OUString SAL_CALL functions_implementation_name() { return OUString::createFromAscii(implementation_name); }

css::uno::Sequence<OUString> SAL_CALL functions_services() { return Functions::supported_services(); }

const cppu::ImplementationEntry entries[] = {
    {create_functions, functions_implementation_name, functions_services, cppu::createSingleComponentFactory, nullptr, 0},
    {nullptr, nullptr, nullptr, nullptr, nullptr, 0},
};

}  // namespace

extern "C" SAL_DLLPUBLIC_EXPORT void* SAL_CALL component_getFactory(const char* implementation, void* service_manager,
                                                                    void* registry_key) {
    return cppu::component_getFactoryHelper(implementation, service_manager, registry_key, entries);
}
