#include "src/ingest/read_bench_log.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <utility>

#include "src/ingest/csv_cells.h"
#include "src/ingest/error_text.h"
#include "src/ingest/header_row.h"
#include "src/ingest/input_error.h"
#include "src/ingest/line_reader.h"
#include "src/ingest/number_cell.h"
#include "src/ingest/read_options.h"
#include "src/ingest/small_text_and_statistics.h"
#include "src/ingest/text_file.h"
#include "src/units/constants.h"

namespace coilspin {
namespace {

using ingest::NumberStatus;

// Reserving the channels from the file size keeps a 10^7-row log from being
// copied while it grows. Reserved but untouched memory costs address space, not
// resident memory, so the estimate is rounded up generously (common practice).
constexpr double kReserveMargin = 1.05;
constexpr std::size_t kReserveSlack = 16;

std::size_t EstimateRows(const ingest::TextFile& text) {
  if (text.first_block_bytes < ingest::kFirstBlockBytes || text.file_bytes == 0) {
    return text.first_block_lines + 1;  // the whole file was in the first block
  }
  const double lines_per_byte =
      static_cast<double>(text.first_block_lines) / static_cast<double>(text.first_block_bytes);
  return static_cast<std::size_t>(static_cast<double>(text.file_bytes) * lines_per_byte * kReserveMargin) +
         kReserveSlack;
}

const char* SkipSpaces(const char* text) {
  while (*text == ' ' || *text == '\t') ++text;
  return text;
}

bool IsComment(const char* line) { return *SkipSpaces(line) == '#'; }

std::string_view TrimView(std::string_view text) {
  while (!text.empty() && (text.front() == ' ' || text.front() == '\t')) text.remove_prefix(1);
  while (!text.empty() && (text.back() == ' ' || text.back() == '\t')) text.remove_suffix(1);
  return text;
}

// "# key: value" becomes a note; other comments are dropped.
void AddNote(const char* line, std::vector<std::pair<std::string, std::string>>& notes) {
  const std::string_view comment(SkipSpaces(line) + 1);
  const std::size_t colon = comment.find(':');
  if (colon == std::string_view::npos) return;
  const std::string_view key = TrimView(comment.substr(0, colon));
  if (key.empty()) return;
  notes.emplace_back(std::string(key), std::string(TrimView(comment.substr(colon + 1))));
}

// Reads the data rows of one log into its channels, one row at a time.
class RowReader {
 public:
  RowReader(BenchLog& log, const std::vector<ingest::ColumnPlan>& plans, long header_cells, char delimiter)
      : log_(log),
        header_cells_(header_cells),
        delimiter_(delimiter),
        decimal_comma_(delimiter == ';'),
        slot_of_column_(static_cast<std::size_t>(header_cells), kNoSlot) {
    for (const ingest::ColumnPlan& plan : plans) {
      const int slot = static_cast<int>(slots_.size());
      slot_of_column_[static_cast<std::size_t>(plan.source.column - 1)] = slot;
      // Temperature must lie above copper's −k (src/model/copper_resistance.h): below it R(θ) has no meaning.
      const double lowest = plan.source.quantity == units::Quantity::kTemperature
                                ? -units::kCopperTemperatureConstant_degC
                                : -std::numeric_limits<double>::infinity();
      slots_.push_back({&log_.Channel(plan.source.quantity), plan.scale, plan.offset, lowest, plan.source});
      if (plan.source.quantity == units::Quantity::kTime) time_slot_ = slot;
    }
    values_.assign(slots_.size(), 0.0);
  }

  void Reserve(std::size_t rows) {
    for (Slot& slot : slots_) slot.channel->reserve(rows);
    log_.line_of_row.reserve(rows);
  }

  void Read(char* line, long line_number) {
    ingest::CellSplitter splitter(line, delimiter_);
    long column = 0;
    while (!splitter.AtEnd()) {
      const ingest::Cell cell = splitter.Next();
      ++column;
      if (column > header_cells_) continue;  // counted, reported below
      const int slot = slot_of_column_[static_cast<std::size_t>(column - 1)];
      if (slot == kNoSlot) continue;
      if (slot == time_slot_) time_text_.assign(cell.begin, cell.end);
      const ingest::ParsedNumber number = ingest::ParseNumber(cell, decimal_comma_);
      if (number.status != NumberStatus::kOk)
        ThrowBadCell(number.status, cell, slots_[slot].source, line_number);
      values_[static_cast<std::size_t>(slot)] = number.value;
    }
    if (column != header_cells_) ThrowCellCount(column, line_number);
    const double time = values_[static_cast<std::size_t>(time_slot_)];
    if (!log_.line_of_row.empty() && !(time > previous_time_)) ThrowTimeNotIncreasing(line_number);
    const Slot& time_slot = slots_[static_cast<std::size_t>(time_slot_)];
    const double time_step_s = (time - previous_time_) * time_slot.scale;
    if (!log_.line_of_row.empty() && !(time_step_s >= units::kShortestSampleInterval_s))
      ThrowTimeStepTooShort(time_step_s, line_number);
    for (std::size_t i = 0; i < slots_.size(); ++i) {
      const double value_si = values_[i] * slots_[i].scale + slots_[i].offset;
      if (!std::isfinite(value_si)) ThrowTooLarge(slots_[i], values_[i], line_number);
      if (!(value_si > slots_[i].lowest_si)) ThrowBelowCopperLimit(slots_[i], values_[i], value_si, line_number);
      if (!(std::abs(value_si) <= units::kLargestLoggedMagnitude)) ThrowTooLarge(slots_[i], values_[i], line_number);
      slots_[i].channel->push_back(value_si);
    }
    log_.line_of_row.push_back(line_number);
    previous_time_ = time;
    std::swap(previous_time_text_, time_text_);
  }

 private:
  static constexpr int kNoSlot = -1;

  struct Slot {
    std::vector<double>* channel;
    double scale;
    double offset;
    double lowest_si;  // a value must lie above this (−∞ but for temperature)
    ColumnSource source;
  };

  [[noreturn]] void ThrowBadCell(NumberStatus status, const ingest::Cell& cell, const ColumnSource& source,
                                 long line_number) const {
    const std::string where = " in " + ingest::DescribeColumn(source.column, source.header);
    const std::string expected = "; expected a number in " + source.unit;
    if (status == NumberStatus::kEmpty) {
      throw InputError(InputErrorKind::kNonNumericCell, log_.path, line_number, source.column,
                       "empty cell" + where + expected);
    }
    if (status == NumberStatus::kNotFinite) {
      throw InputError(InputErrorKind::kNotFinite, log_.path, line_number, source.column,
                       "cell " + ingest::Quote(cell.text()) + where +
                           " is not a finite number (NaN, infinity or beyond the range of a double)");
    }
    throw InputError(InputErrorKind::kNonNumericCell, log_.path, line_number, source.column,
                     "cell " + ingest::Quote(cell.text()) + where + " is not a number" + expected);
  }

  [[noreturn]] void ThrowCellCount(long cells, long line_number) const {
    std::string message = "row has " + std::to_string(cells) + " cell" + (cells == 1 ? "" : "s") +
                          ", the header has " + std::to_string(header_cells_);
    if (cells < header_cells_) message += " (truncated row?)";
    if (delimiter_ == ',' && cells > header_cells_) {
      message += "; a file with a decimal comma must use ';' as its delimiter";
    }
    const long column = std::min(cells, header_cells_) + 1;
    throw InputError(InputErrorKind::kTruncatedRow, log_.path, line_number, column, message);
  }

  [[noreturn]] void ThrowTimeNotIncreasing(long line_number) const {
    const std::string& unit = slots_[static_cast<std::size_t>(time_slot_)].source.unit;
    throw InputError(InputErrorKind::kTimeNotIncreasing, log_.path, line_number, 0,
                     "time is not increasing (" + time_text_ + " " + unit + " after " + previous_time_text_ +
                         " " + unit + ")");
  }

  [[noreturn]] void ThrowTimeStepTooShort(double step_s, long line_number) const {
    const std::string& unit = slots_[static_cast<std::size_t>(time_slot_)].source.unit;
    throw InputError(InputErrorKind::kOutOfRange, log_.path, line_number,
                     slots_[static_cast<std::size_t>(time_slot_)].source.column,
                     "time step of " + ingest::FormatNumber(step_s) + " s (" + time_text_ + " " + unit + " after " +
                         previous_time_text_ + " " + unit + ") is shorter than any logger samples (" +
                         ingest::FormatNumber(units::kShortestSampleInterval_s) +
                         " s); is the time column in the unit its header says?");
  }

  [[noreturn]] void ThrowTooLarge(const Slot& slot, double value, long line_number) const {
    const ColumnSource& source = slot.source;
    const std::string internal(units::InternalUnit(source.quantity));
    const double value_si = value * slot.scale + slot.offset;
    if (!std::isfinite(value_si)) {
      throw InputError(InputErrorKind::kNotFinite, log_.path, line_number, source.column,
                       "value in " + ingest::DescribeColumn(source.column, source.header) +
                           " is beyond the range of a double once converted to " + internal);
    }
    const std::string in_si =
        value_si == value ? "" : " (" + Format("%g", value_si) + " " + internal + ")";
    throw InputError(InputErrorKind::kOutOfRange, log_.path, line_number, source.column,
                     "value " + ingest::FormatNumber(value) + " " + source.unit + in_si + " in " +
                         ingest::DescribeColumn(source.column, source.header) +
                         " is larger than any reading (the limit is " +
                         ingest::FormatNumber(units::kLargestLoggedMagnitude) +
                         " in SI units); a logger's error code or a wrong unit?");
  }

  [[noreturn]] void ThrowBelowCopperLimit(const Slot& slot, double value, double value_si, long line_number) const {
    const ColumnSource& source = slot.source;
    throw InputError(InputErrorKind::kOutOfRange, log_.path, line_number, source.column,
                     "temperature " + ingest::FormatNumber(value) + " " + source.unit +
                         (value_si == value ? "" : " (" + Format("%g", value_si) + " degC)") + " in " +
                         ingest::DescribeColumn(source.column, source.header) + " is at or below " +
                         ingest::FormatNumber(slot.lowest_si) +
                         " degC where copper's resistance would reach zero: no winding is that cold (a sensor's "
                         "fault code, or degC values under a [K] header?)");
  }

  BenchLog& log_;
  long header_cells_;
  char delimiter_;
  bool decimal_comma_;
  std::vector<int> slot_of_column_;
  std::vector<Slot> slots_;
  int time_slot_ = kNoSlot;
  std::vector<double> values_;  // the current row, one per slot
  double previous_time_ = 0.0;
  std::string time_text_;  // the time cell as written, for the message above
  std::string previous_time_text_;
};

void ReadLines(io::LineReader& reader, BenchLog& log, const ReadOptions& options, std::size_t rows_estimate) {
  char* line = nullptr;
  while ((line = reader.next_line()) != nullptr) {
    if (ingest::IsBlankLine(line)) continue;
    if (!IsComment(line)) break;
    AddNote(line, log.notes);
  }
  if (line == nullptr) {
    throw InputError(InputErrorKind::kEmptyFile, log.path, 0, 0,
                     "the file holds no header row and no data, only comments or blank lines");
  }
  log.header_line = static_cast<long>(reader.get_file_line());
  const char delimiter = ingest::DetectDelimiter(line);
  const std::vector<ingest::HeaderCell> cells = ingest::SplitHeader(line, delimiter);
  const std::vector<ingest::ColumnPlan> plans =
      ingest::PlanColumns(cells, options, log.path, log.header_line);
  for (const ingest::HeaderCell& cell : cells) log.header_cells.push_back(cell.text);
  for (const ingest::ColumnPlan& plan : plans) log.columns.push_back(plan.source);

  RowReader rows(log, plans, static_cast<long>(cells.size()), delimiter);
  rows.Reserve(rows_estimate);
  while ((line = reader.next_line()) != nullptr) {
    if (ingest::IsBlankLine(line)) continue;
    if (IsComment(line)) {
      AddNote(line, log.notes);
      continue;
    }
    rows.Read(line, static_cast<long>(reader.get_file_line()));
  }
  if (log.line_of_row.empty()) {
    throw InputError(InputErrorKind::kEmptyFile, log.path, log.header_line, 0,
                     "the file has a header row but no data rows");
  }
}

}  // namespace

BenchLog ReadBenchLog(const std::string& path, const ReadOptions& options) {
  ValidateReadOptions(options);
  ingest::TextFile text = ingest::OpenTextFile(path);
  const std::size_t rows_estimate = EstimateRows(text);
  BenchLog log;
  log.path = path;
  io::LineReader reader(path, std::move(text.source));
  try {
    ReadLines(reader, log, options, rows_estimate);
  } catch (const io::error::line_length_limit_exceeded& error) {
    throw InputError(InputErrorKind::kBinaryFile, path, error.file_line, 0,
                     "line longer than 16 MiB; expected a CSV bench log");
  }
  return log;
}

}  // namespace coilspin
