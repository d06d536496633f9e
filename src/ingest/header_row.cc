#include "src/ingest/header_row.h"

#include <optional>

#include "src/ingest/csv_cells.h"
#include "src/ingest/error_text.h"
#include "src/ingest/input_error.h"
#include "src/ingest/text_encoding.h"

namespace coilspin::ingest {
namespace {

using units::Quantity;

std::string_view Trim(std::string_view text) {
  while (!text.empty() && (text.front() == ' ' || text.front() == '\t')) text.remove_prefix(1);
  while (!text.empty() && (text.back() == ' ' || text.back() == '\t')) text.remove_suffix(1);
  return text;
}

HeaderCell ParseHeaderCell(const Cell& cell, long column) {
  HeaderCell header;
  header.column = column;
  header.text = cell.quoted ? UnescapeQuotes(cell.text()) : std::string(cell.text());
  header.text = std::string(Trim(header.text));
  const std::string_view text = header.text;
  header.name = header.text;
  if (text.empty()) return header;
  const char close = text.back();
  const char open = close == ']' ? '[' : close == ')' ? '(' : '\0';
  if (open == '\0') return header;
  const std::size_t open_at = text.rfind(open);
  if (open_at == std::string_view::npos) return header;
  header.name = std::string(Trim(text.substr(0, open_at)));
  header.unit = std::string(Trim(text.substr(open_at + 1, text.size() - open_at - 2)));
  header.has_unit = true;
  return header;
}

bool IsPositional(Quantity quantity) {
  return quantity == Quantity::kSpeed || quantity == Quantity::kPosition;
}

std::vector<std::string> CellTexts(const std::vector<HeaderCell>& cells) {
  std::vector<std::string> texts;
  for (const HeaderCell& cell : cells) texts.push_back(cell.text);
  return texts;
}

std::string ColumnOption(Quantity quantity, const std::string& header) {
  return "--column " + std::string(units::QuantityName(quantity)) + "=\"" + header + "\"";
}

// Quantity of each cell: from the column map first, then from the cell's own name.
class ColumnAssigner {
 public:
  ColumnAssigner(const std::vector<HeaderCell>& cells, const ReadOptions& options, const std::string& path,
                 long header_line)
      : cells_(cells), options_(options), path_(path), header_line_(header_line), assigned_(cells.size()) {}

  std::vector<std::optional<Quantity>> Assign() {
    AssignFromColumnMap();
    AssignFromNames();
    if (!unmatched_map_.empty()) ThrowUnmatchedMap();
    if (!any_quantity_cell_) ThrowNoHeader();
    RequireTime();
    return assigned_;
  }

 private:
  void AssignFromColumnMap() {
    for (const auto& [quantity, wanted] : options_.column_for) {
      std::optional<std::size_t> match;
      for (std::size_t i = 0; i < cells_.size(); ++i) {
        const HeaderCell& cell = cells_[i];
        if (cell.text != wanted && !(cell.has_unit && cell.name == wanted)) continue;
        if (match) {
          throw InputError(InputErrorKind::kDuplicateColumn, path_, header_line_, cell.column,
                           ColumnOption(quantity, wanted) + " matches both " +
                               DescribeColumn(cells_[*match].column, cells_[*match].text) + " and " +
                               DescribeColumn(cell.column, cell.text) + "; name one by its full text");
        }
        match = i;
      }
      if (!match) {
        unmatched_map_.push_back(quantity);
        continue;
      }
      if (assigned_[*match]) {
        const HeaderCell& cell = cells_[*match];
        throw InputError(InputErrorKind::kBadOption, path_, header_line_, cell.column,
                         DescribeColumn(cell.column, cell.text) + " is mapped to both " +
                             std::string(units::QuantityName(*assigned_[*match])) + " and " +
                             std::string(units::QuantityName(quantity)));
      }
      assigned_[*match] = quantity;
      any_quantity_cell_ = true;
    }
  }

  void AssignFromNames() {
    std::vector<std::optional<std::size_t>> first_cell_of(units::AllQuantities().size());
    for (std::size_t i = 0; i < cells_.size(); ++i) {
      if (assigned_[i]) continue;
      const std::optional<Quantity> quantity = units::QuantityFromName(cells_[i].name);
      if (!quantity) continue;
      any_quantity_cell_ = true;
      if (options_.column_for.count(*quantity) > 0) continue;  // the map chose another cell
      std::optional<std::size_t>& first = first_cell_of[static_cast<std::size_t>(*quantity)];
      if (first) {
        const HeaderCell& earlier = cells_[*first];
        const HeaderCell& later = cells_[i];
        throw InputError(InputErrorKind::kDuplicateColumn, path_, header_line_, later.column,
                         DescribeColumn(earlier.column, earlier.text) + " and " +
                             DescribeColumn(later.column, later.text) + " both give " +
                             std::string(units::QuantityName(*quantity)) + "; choose one with " +
                             ColumnOption(*quantity, later.text));
      }
      first = i;
      assigned_[i] = quantity;
    }
  }

  [[noreturn]] void ThrowNoHeader() const {
    throw InputError(InputErrorKind::kMissingHeader, path_, header_line_, 0,
                     "no header row: no cell of this line names a quantity; expected cells such as "
                     "'time [s]', 'voltage [V]', 'current [A]', 'speed [rpm]' (found " +
                         QuoteList(CellTexts(cells_)) + ")");
  }

  [[noreturn]] void ThrowUnmatchedMap() const {
    const Quantity quantity = unmatched_map_.front();
    throw InputError(InputErrorKind::kMissingColumn, path_, header_line_, 0,
                     ColumnOption(quantity, options_.column_for.at(quantity)) +
                         " names no header cell; the header has " + QuoteList(CellTexts(cells_)));
  }

  void RequireTime() const {
    for (const std::optional<Quantity>& quantity : assigned_) {
      if (quantity == Quantity::kTime) return;
    }
    throw InputError(InputErrorKind::kMissingColumn, path_, header_line_, 0,
                     "no time column: every test needs one, e.g. 'time [s]' (the header has " +
                         QuoteList(CellTexts(cells_)) + ")");
  }

  const std::vector<HeaderCell>& cells_;
  const ReadOptions& options_;
  const std::string& path_;
  long header_line_;
  std::vector<std::optional<Quantity>> assigned_;
  std::vector<Quantity> unmatched_map_;
  bool any_quantity_cell_ = false;
};

ColumnPlan PlanColumn(const HeaderCell& cell, Quantity quantity, const ReadOptions& options,
                      const std::string& path, long header_line) {
  const auto unit_option = options.unit_for.find(quantity);
  const bool unit_from_option = unit_option != options.unit_for.end();
  const std::string quantity_name(units::QuantityName(quantity));
  if (!unit_from_option && !cell.has_unit) {
    throw InputError(InputErrorKind::kUnknownUnit, path, header_line, cell.column,
                     DescribeColumn(cell.column, cell.text) + " gives no unit for " + quantity_name +
                         "; write it as '" + quantity_name + " [" +
                         std::string(units::InternalUnit(quantity)) + "]' or pass --unit " + quantity_name +
                         "=UNIT (accepted: " + AcceptedUnitList(quantity) + ")");
  }
  std::string spelling = unit_from_option ? unit_option->second : cell.unit;
  std::optional<units::Conversion> conversion = units::LookUpUnit(quantity, spelling);
  const std::optional<std::string> non_utf8_byte = FirstNonUtf8Byte(spelling);
  if (!conversion && non_utf8_byte) {  // a Windows-1252 / Latin-1 header: "\xB0C" is "°C" (text_encoding.h)
    const std::string latin1 = Latin1ToUtf8(spelling);
    conversion = units::LookUpUnit(quantity, latin1);
    if (conversion) spelling = latin1;
  }
  if (!conversion) {
    const std::string where = unit_from_option ? "given by --unit " + quantity_name + "=" + spelling
                                               : "in " + DescribeColumn(cell.column, cell.text);
    const std::string encoding =
        non_utf8_byte ? "; it holds byte " + *non_utf8_byte +
                            ", which is not UTF-8 (nor, read as Windows-1252/Latin-1, a known unit): save the file "
                            "as UTF-8"
                      : "";
    throw InputError(InputErrorKind::kUnknownUnit, path, header_line, cell.column,
                     "unknown unit " + Quote(spelling) + " for " + quantity_name + " " + where + encoding +
                         "; accepted: " + AcceptedUnitList(quantity));
  }
  ColumnPlan plan;
  plan.source = ColumnSource{quantity, cell.text, spelling, cell.column};
  plan.scale = conversion->factor;
  plan.offset = conversion->offset;
  if (conversion->needs_counts_per_rev) {
    if (!options.counts_per_rev) {
      throw InputError(InputErrorKind::kCountsWithoutCpr, path, header_line, cell.column,
                       DescribeColumn(cell.column, cell.text) +
                           " is in encoder counts; give the counts per revolution "
                           "(--cpr N, or encoder_cpr in the session file)");
    }
    plan.scale /= *options.counts_per_rev;
  }
  if (IsPositional(quantity)) plan.scale *= options.gear_ratio;
  return plan;
}

}  // namespace

std::vector<HeaderCell> SplitHeader(char* line, char delimiter) {
  std::vector<HeaderCell> cells;
  CellSplitter splitter(line, delimiter);
  while (!splitter.AtEnd()) {
    cells.push_back(ParseHeaderCell(splitter.Next(), static_cast<long>(cells.size()) + 1));
  }
  return cells;
}

std::vector<ColumnPlan> PlanColumns(const std::vector<HeaderCell>& cells, const ReadOptions& options,
                                    const std::string& path, long header_line) {
  const std::vector<std::optional<Quantity>> assigned =
      ColumnAssigner(cells, options, path, header_line).Assign();
  std::vector<ColumnPlan> plans;
  for (std::size_t i = 0; i < cells.size(); ++i) {
    if (assigned[i]) plans.push_back(PlanColumn(cells[i], *assigned[i], options, path, header_line));
  }
  return plans;
}

}  // namespace coilspin::ingest
