#include "src/output/bench_log_csv.h"

#include <array>
#include <charconv>
#include <cmath>
#include <cstddef>
#include <optional>
#include <stdexcept>
#include <utility>

#include "src/output/atomic_file.h"

namespace coilspin::output {

namespace {

constexpr int kMinSignificantDigits = 1;
constexpr int kMaxSignificantDigits = 17;  // enough for every IEEE 754 double
constexpr std::size_t kNumberBufferSize = 64;
// Every integer up to 2⁵³ is an exact IEEE 754 double: counts beyond it are not whole numbers.
constexpr double kLargestExactInteger = 9007199254740992.0;

struct Column {
  units::Quantity quantity;
  const std::vector<double>* values;
  const std::string* unit;
};

std::vector<Column> ColumnsOf(const model::SampledLog& log, const CsvStyle& style) {
  using units::Quantity;
  const Column all[] = {
      {Quantity::kTime, &log.time_s, &style.time_unit},
      {Quantity::kVoltage, &log.voltage_V, &style.voltage_unit},
      {Quantity::kCurrent, &log.current_A, &style.current_unit},
      {Quantity::kSpeed, &log.speed_rad_s, &style.speed_unit},
      {Quantity::kPosition, &log.position_rad, &style.position_unit},
      {Quantity::kTorque, &log.torque_N_m, &style.torque_unit},
      {Quantity::kTemperature, &log.temperature_degC, &style.temperature_unit},
  };
  std::vector<Column> written;
  for (const Column& column : all) {
    if (!column.values->empty()) written.push_back(column);
  }
  return written;
}

bool SetError(std::string* error, const std::string& message) {
  if (error != nullptr) *error = message;
  return false;
}

// The table's conversion, with counts resolved by the counts per revolution
// (x_SI = n·2π/cpr); none for an unknown unit or counts without cpr > 0.
std::optional<units::Conversion> UsableConversion(units::Quantity quantity, const std::string& unit,
                                                  int counts_per_rev) {
  std::optional<units::Conversion> conversion = units::LookUpUnit(quantity, unit);
  if (conversion && conversion->needs_counts_per_rev) {
    if (counts_per_rev <= 0) return std::nullopt;
    conversion->factor /= counts_per_rev;
    conversion->needs_counts_per_rev = false;
  }
  if (conversion && conversion->factor == 0.0) return std::nullopt;
  return conversion;
}

bool IsCounts(units::Quantity quantity, const std::string& unit) {
  const std::optional<units::Conversion> conversion = units::LookUpUnit(quantity, unit);
  return conversion && conversion->needs_counts_per_rev;
}

std::string HeaderCell(const Column& column, const CsvStyle& style) {
  const auto renamed = style.header_for.find(column.quantity);
  if (renamed != style.header_for.end()) return renamed->second;
  return std::string(units::QuantityName(column.quantity)) + " [" + *column.unit + "]";
}

// An encoder count: the nearest integer, written in full.
void AppendCount(std::string& out, double count) {
  if (!(std::abs(count) <= kLargestExactInteger)) {
    throw std::invalid_argument("bench-log CSV: an encoder count beyond 2^53 is not a whole number");
  }
  out += std::to_string(std::llround(count));
}

void AppendNumber(std::string& out, double value, const CsvStyle& style) {
  std::array<char, kNumberBufferSize> buffer{};
  const auto [end, status] = std::to_chars(buffer.data(), buffer.data() + buffer.size(), value,
                                           std::chars_format::general, style.significant_digits);
  if (status != std::errc()) throw std::invalid_argument("bench-log CSV: cannot format a value");
  for (const char* c = buffer.data(); c != end; ++c) {
    out.push_back(style.decimal_comma && *c == '.' ? ',' : *c);
  }
}

void ValidateLog(const std::vector<Column>& columns, const model::SampledLog& log) {
  if (log.time_s.empty()) throw std::invalid_argument("bench-log CSV: the log has no samples");
  for (const Column& column : columns) {
    const std::string name(units::QuantityName(column.quantity));
    if (column.values->size() != log.time_s.size()) {
      throw std::invalid_argument("bench-log CSV: the " + name + " channel has " +
                                  std::to_string(column.values->size()) + " samples, time has " +
                                  std::to_string(log.time_s.size()));
    }
    for (double value : *column.values) {
      if (!std::isfinite(value)) {
        throw std::invalid_argument("bench-log CSV: the " + name + " channel holds " +
                                    std::to_string(value));
      }
    }
  }
}

}  // namespace

bool CsvStyle::IsValid(std::string* error) const {
  if (delimiter != ',' && delimiter != ';' && delimiter != '\t') {
    return SetError(error, "delimiter must be ',', ';' or a tab");
  }
  if (decimal_comma && delimiter != ';') {
    return SetError(error, "a decimal comma needs the ';' delimiter");
  }
  if (significant_digits < kMinSignificantDigits || significant_digits > kMaxSignificantDigits) {
    return SetError(error, "significant digits must be 1 to 17, not " +
                               std::to_string(significant_digits));
  }
  const std::pair<units::Quantity, const std::string*> unit_choices[] = {
      {units::Quantity::kTime, &time_unit},
      {units::Quantity::kVoltage, &voltage_unit},
      {units::Quantity::kCurrent, &current_unit},
      {units::Quantity::kSpeed, &speed_unit},
      {units::Quantity::kPosition, &position_unit},
      {units::Quantity::kTorque, &torque_unit},
      {units::Quantity::kTemperature, &temperature_unit},
  };
  if (IsCounts(units::Quantity::kPosition, position_unit) && counts_per_rev <= 0) {
    return SetError(error, "position in counts needs the encoder's counts per revolution (> 0), not " +
                               std::to_string(counts_per_rev));
  }
  for (const auto& [quantity, unit] : unit_choices) {
    if (!UsableConversion(quantity, *unit, counts_per_rev)) {
      std::string accepted;
      for (const std::string& spelling : units::AcceptedUnits(quantity)) {
        accepted += (accepted.empty() ? "" : ", ") + spelling;
      }
      return SetError(error, "unit \"" + *unit + "\" cannot be written for " +
                                 std::string(units::QuantityName(quantity)) + " (accepted: " +
                                 accepted + ")");
    }
  }
  for (const auto& [quantity, header] : header_for) {
    if (header.find_first_of("\r\n") != std::string::npos ||
        header.find(delimiter) != std::string::npos) {
      return SetError(error, "the header for " + std::string(units::QuantityName(quantity)) +
                                 " holds a line break or the delimiter");
    }
  }
  for (const std::string& line : comment_lines) {
    if (line.find_first_of("\r\n") != std::string::npos) {
      return SetError(error, "a comment line holds a line break");
    }
  }
  return true;
}

void WriteBenchLogCsv(const model::SampledLog& log, const std::string& path,
                      const CsvStyle& style) {
  std::string error;
  if (!style.IsValid(&error)) throw std::invalid_argument("bench-log CSV style: " + error);
  const std::vector<Column> columns = ColumnsOf(log, style);
  ValidateLog(columns, log);

  std::vector<units::Conversion> conversions;
  std::vector<bool> whole_counts;
  for (const Column& column : columns) {
    conversions.push_back(*UsableConversion(column.quantity, *column.unit, style.counts_per_rev));
    whole_counts.push_back(IsCounts(column.quantity, *column.unit));
  }

  std::string text;
  for (const std::string& line : style.comment_lines) text += "# " + line + "\n";
  for (std::size_t c = 0; c < columns.size(); ++c) {
    if (c > 0) text.push_back(style.delimiter);
    text += HeaderCell(columns[c], style);
  }
  text.push_back('\n');

  for (std::size_t row = 0; row < log.time_s.size(); ++row) {
    for (std::size_t c = 0; c < columns.size(); ++c) {
      if (c > 0) text.push_back(style.delimiter);
      // x = (x_SI − offset)/factor
      const double value_SI = (*columns[c].values)[row];
      const double value = (value_SI - conversions[c].offset) / conversions[c].factor;
      if (whole_counts[c]) {
        AppendCount(text, value);
      } else {
        AppendNumber(text, value, style);
      }
    }
    text.push_back('\n');
  }
  WriteFileAtomically(path, text);
}

}  // namespace coilspin::output
