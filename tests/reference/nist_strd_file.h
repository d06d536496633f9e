#pragma once
// Reader for the NIST/ITL Statistical Reference Datasets, nonlinear regression
// (https://www.itl.nist.gov/div898/strd/nls/nls_main.shtml). Every number —
// starting values, certified values, data — is read from the .dat file at run
// time; the file's own header says on which lines each part sits:
//
//     File Format:   ASCII
//                    Starting Values   (lines 41 to 42)
//                    Certified Values  (lines 41 to 47)
//                    Data              (lines 61 to 74)
//
// A parameter line reads `b1 = start1 start2 certified_value certified_std_dev`;
// the certified block continues with the residual sum of squares, residual
// standard deviation, degrees of freedom and number of observations; a data
// line is the response followed by the predictor(s).

#include <cctype>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace coilspin::nist {

// A certified number and the significant digits it is printed with (the most an
// estimate can be said to match it).
struct CertifiedValue {
  double value = 0.0;
  int significant_digits = 0;
};

struct DataSetParameter {
  std::string name;                 // "b1", "b2", …
  std::vector<double> starts;       // start 1, start 2
  CertifiedValue estimate;
  CertifiedValue standard_deviation;
};

struct DataSet {
  std::string name;
  std::vector<DataSetParameter> parameters;
  CertifiedValue residual_sum_of_squares;
  CertifiedValue residual_standard_deviation;
  int degrees_of_freedom = 0;
  int num_observations = 0;
  // One row per observation: response, then predictors.
  std::vector<std::vector<double>> rows;
};

struct ReadResult {
  DataSet data;
  std::string error;  // empty on success
};

namespace detail {

inline std::vector<std::string> Words(const std::string& line) {
  std::istringstream in(line);
  std::vector<std::string> words;
  for (std::string word; in >> word;) words.push_back(word);
  return words;
}

// Significant digits of a number printed as `2.3894212918E+02`: the mantissa's
// digits without leading zeros.
inline int SignificantDigits(const std::string& text) {
  int digits = 0;
  bool leading = true;
  for (char c : text) {
    if (c == 'e' || c == 'E') break;
    if (!std::isdigit(static_cast<unsigned char>(c))) continue;
    if (leading && c == '0') continue;
    leading = false;
    ++digits;
  }
  return digits;
}

inline bool ParseDouble(const std::string& text, double* value) {
  std::istringstream in(text);
  in >> *value;
  return !in.fail() && in.eof();
}

inline bool ParseCertified(const std::string& text, CertifiedValue* out) {
  out->significant_digits = SignificantDigits(text);
  return ParseDouble(text, &out->value);
}

// Reads "(lines A to B)" after `label` anywhere in the header.
inline bool LineRange(const std::vector<std::string>& lines, const std::string& label, int* first, int* last) {
  for (const std::string& line : lines) {
    const std::size_t at = line.find(label);
    if (at == std::string::npos) continue;
    const std::size_t open = line.find("(lines", at);
    if (open == std::string::npos) continue;
    std::istringstream in(line.substr(open + std::string("(lines").size()));
    std::string to;
    in >> *first >> to >> *last;
    return !in.fail() && to == "to";
  }
  return false;
}

// The number after the colon of a certified summary line such as
// "Residual Sum of Squares:   1.2455138894E-01".
inline bool SummaryValue(const std::vector<std::string>& lines, int first, int last, const std::string& label,
                         std::string* text) {
  for (int n = first; n <= last; ++n) {
    const std::string& line = lines[static_cast<std::size_t>(n - 1)];
    if (line.find(label) == std::string::npos) continue;
    const std::vector<std::string> words = Words(line.substr(line.find(':') + 1));
    if (words.empty()) return false;
    *text = words.front();
    return true;
  }
  return false;
}

}  // namespace detail

inline ReadResult ReadDataSet(const std::string& path, const std::string& name) {
  using namespace detail;
  ReadResult result;
  result.data.name = name;
  std::ifstream file(path);
  if (!file) {
    result.error = "cannot open " + path;
    return result;
  }
  std::vector<std::string> lines;
  for (std::string line; std::getline(file, line);) {
    if (!line.empty() && line.back() == '\r') line.pop_back();
    lines.push_back(line);
  }
  int start_first = 0, start_last = 0, certified_first = 0, certified_last = 0, data_first = 0, data_last = 0;
  if (!LineRange(lines, "Starting Values", &start_first, &start_last) ||
      !LineRange(lines, "Certified Values", &certified_first, &certified_last) ||
      !LineRange(lines, "Data", &data_first, &data_last)) {
    result.error = path + ": the header does not give the line ranges";
    return result;
  }
  const int line_count = static_cast<int>(lines.size());
  if (start_first < 1 || certified_last > line_count || data_first < 1 || data_last > line_count) {
    result.error = path + ": a line range lies outside the file";
    return result;
  }

  // A parameter line, word by word: b1 = start1 start2 value std_dev
  constexpr std::size_t kNameWord = 0, kEqualsWord = 1, kFirstStartWord = 2, kStarts = 2;
  constexpr std::size_t kValueWord = kFirstStartWord + kStarts, kDeviationWord = kValueWord + 1;
  for (int n = start_first; n <= start_last; ++n) {
    const std::vector<std::string> words = Words(lines[static_cast<std::size_t>(n - 1)]);
    if (words.size() != kDeviationWord + 1 || words[kEqualsWord] != "=") {
      result.error = path + ":" + std::to_string(n) + ": not a parameter line";
      return result;
    }
    DataSetParameter parameter;
    parameter.name = words[kNameWord];
    for (std::size_t k = kFirstStartWord; k < kFirstStartWord + kStarts; ++k) {
      double start = 0.0;
      if (!ParseDouble(words[k], &start)) {
        result.error = path + ":" + std::to_string(n) + ": bad starting value '" + words[k] + "'";
        return result;
      }
      parameter.starts.push_back(start);
    }
    if (!ParseCertified(words[kValueWord], &parameter.estimate) ||
        !ParseCertified(words[kDeviationWord], &parameter.standard_deviation)) {
      result.error = path + ":" + std::to_string(n) + ": bad certified value";
      return result;
    }
    result.data.parameters.push_back(parameter);
  }

  std::string text;
  bool summary_ok = SummaryValue(lines, certified_first, certified_last, "Residual Sum of Squares", &text) &&
                    ParseCertified(text, &result.data.residual_sum_of_squares);
  summary_ok = summary_ok &&
               SummaryValue(lines, certified_first, certified_last, "Residual Standard Deviation", &text) &&
               ParseCertified(text, &result.data.residual_standard_deviation);
  double count = 0.0;
  summary_ok = summary_ok && SummaryValue(lines, certified_first, certified_last, "Degrees of Freedom", &text) &&
               ParseDouble(text, &count);
  result.data.degrees_of_freedom = static_cast<int>(count);
  summary_ok = summary_ok && SummaryValue(lines, certified_first, certified_last, "Number of Observations", &text) &&
               ParseDouble(text, &count);
  result.data.num_observations = static_cast<int>(count);
  if (!summary_ok) {
    result.error = path + ": the certified summary (residual sum of squares, …) is incomplete";
    return result;
  }

  for (int n = data_first; n <= data_last; ++n) {
    const std::vector<std::string> words = Words(lines[static_cast<std::size_t>(n - 1)]);
    std::vector<double> row;
    for (const std::string& word : words) {
      double value = 0.0;
      if (!ParseDouble(word, &value)) {
        result.error = path + ":" + std::to_string(n) + ": bad data value '" + word + "'";
        return result;
      }
      row.push_back(value);
    }
    if (row.size() < 2 || (!result.data.rows.empty() && row.size() != result.data.rows.front().size())) {
      result.error = path + ":" + std::to_string(n) + ": a data line needs the response and the same predictors";
      return result;
    }
    result.data.rows.push_back(row);
  }
  if (static_cast<int>(result.data.rows.size()) != result.data.num_observations) {
    result.error = path + ": " + std::to_string(result.data.rows.size()) + " data lines but " +
                   std::to_string(result.data.num_observations) + " observations certified";
  }
  return result;
}

}  // namespace coilspin::nist
