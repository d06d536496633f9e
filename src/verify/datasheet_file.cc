#include "src/verify/datasheet_file.h"

#include <algorithm>
#include <cmath>
#include <fstream>
#include <set>
#include <sstream>
#include <toml++/toml.h>

#include "src/ingest/input_error.h"
#include "src/units/constants.h"
#include "src/units/datasheet_units.h"
#include "src/units/unit_text.h"

namespace coilspin::verify {
namespace {

// A figure as the sheet writes it ("28.5 mN*m/A").
constexpr const char* kExample = "28.5 mN*m/A";
constexpr const char* kPercent = "%";

class SheetReader {
 public:
  explicit SheetReader(std::string file) : file_(std::move(file)) {}

  [[noreturn]] void Fail(const toml::source_region& where, const std::string& key, const std::string& message) const {
    throw InputError(InputErrorKind::kBadDatasheet, file_, static_cast<long>(where.begin.line),
                     static_cast<long>(where.begin.column), "'" + key + "': " + message);
  }

  void RejectUnknown(const toml::table& table, const std::string& where, const std::set<std::string>& allowed) const {
    for (const auto& [key, node] : table) {
      if (allowed.count(std::string(key.str()))) continue;
      std::string list;
      for (const auto& a : allowed) list += (list.empty() ? "" : ", ") + a;
      Fail(key.source(), where.empty() ? std::string(key.str()) : where + "." + std::string(key.str()),
           "unknown key (expected one of: " + list + ")");
    }
  }

  // "<number> <unit>" in `dimension`, or (dimensionless lines) a bare number.
  struct Figure {
    double value = 0.0;     // as written
    std::string unit;       // normalised; "%" for a percentage
    double factor_to_si = 1.0;
    double offset_to_si = 0.0;
    double Si() const { return value * factor_to_si + offset_to_si; }
  };

  Figure ReadFigure(const toml::node& node, const std::string& key, units::Dimension dimension,
                    bool percent_allowed) const {
    Figure figure;
    if (node.is_number() && dimension == units::Dimension::kRatio) {
      figure.value = node.value<double>().value();
      return figure;
    }
    const std::optional<std::string> text = node.value<std::string>();
    if (!text) Fail(node.source(), key, "expected a string such as \"" + std::string(kExample) + "\"");
    const units::NumberAndUnit split = units::SplitNumberAndUnit(*text, kExample);
    if (!split.value) Fail(node.source(), key, split.error);
    figure.value = *split.value;
    if (percent_allowed && units::NormalisedUnitSpelling(split.unit) == kPercent) {
      figure.unit = kPercent;
      return figure;
    }
    const std::optional<units::DatasheetUnit> unit = units::LookUpDatasheetUnit(dimension, split.unit);
    if (!unit) Fail(node.source(), key, UnitProblem(split.unit, dimension, percent_allowed));
    figure.unit = unit->spelling;
    figure.factor_to_si = unit->factor_to_si;
    figure.offset_to_si = unit->offset_to_si;
    return figure;
  }

 private:
  static std::string Accepted(units::Dimension dimension, bool percent_allowed) {
    std::string list;
    for (const std::string& s : units::AcceptedDatasheetUnits(dimension)) list += (list.empty() ? "" : ", ") + s;
    return "accepted units of " + std::string(units::DimensionName(dimension)) + ": " + list +
           (percent_allowed ? ", or % of the nominal" : "");
  }

  static std::string UnitProblem(const std::string& unit, units::Dimension dimension, bool percent_allowed) {
    if (unit.empty()) return "the figure has no unit; " + Accepted(dimension, percent_allowed);
    const std::vector<units::Dimension> other = units::DimensionsOfUnit(unit);
    if (!other.empty()) {
      return "'" + unit + "' is a unit of " + std::string(units::DimensionName(other.front())) + ", not of " +
             std::string(units::DimensionName(dimension)) + "; " + Accepted(dimension, percent_allowed);
    }
    return "unknown unit '" + unit + "'; " + Accepted(dimension, percent_allowed);
  }

  std::string file_;
};

// A tolerance or deviation in SI: relative (%) of the nominal, or absolute in the line's dimension.
double Deviation(const SheetReader& reader, const toml::node& node, const std::string& key,
                 units::Dimension dimension, const std::optional<double>& nominal) {
  const SheetReader::Figure f = reader.ReadFigure(node, key, dimension, true);
  if (f.value < 0.0) reader.Fail(node.source(), key, "a tolerance must not be negative");
  if (f.unit == kPercent) return f.value * units::kPercent * std::fabs(nominal.value_or(0.0));
  return f.value * f.factor_to_si;  // a difference: no offset
}

SpecLine ReadLine(const SheetReader& reader, const toml::key& name, const toml::node& node) {
  const std::string key(name.str());
  const std::string path = "spec." + key;
  const SpecKey* spec = FindSpecKey(key);
  if (!spec) {
    std::string list;
    for (const SpecKey& k : SpecKeys()) list += (list.empty() ? "" : ", ") + std::string(k.key);
    reader.Fail(name.source(), path, "not a line coilspin can verify (the result file's keys: " + list + ")");
  }
  const toml::table* fields = node.as_table();
  if (!fields) {
    reader.Fail(node.source(), path,
                "expected a table such as { nominal = \"" + std::string(kExample) + "\", tolerance = \"5 %\" }");
  }
  reader.RejectUnknown(*fields, path, {"nominal", "tolerance", "minus", "plus", "min", "max"});
  SpecLine line;
  line.spec = spec;
  line.key = key;
  line.line = static_cast<long>(node.source().begin.line);
  const auto field = [&](const char* name) { return fields->get(name); };
  const units::Dimension d = spec->dimension;
  bool unit_set = false;
  const auto take_unit = [&](const SheetReader::Figure& f) {
    if (unit_set) return;
    line.unit = f.unit;
    line.unit_factor_to_si = f.factor_to_si;
    unit_set = true;
  };
  if (const toml::node* n = field("nominal")) {
    const SheetReader::Figure f = reader.ReadFigure(*n, path + ".nominal", d, false);
    line.nominal = f.Si();
    take_unit(f);
  }
  const toml::node* tolerance = field("tolerance");
  const toml::node* minus = field("minus");
  const toml::node* plus = field("plus");
  const toml::node* min = field("min");
  const toml::node* max = field("max");
  if ((tolerance || minus || plus) && !line.nominal) {
    reader.Fail(node.source(), path, "missing nominal: a tolerance needs the nominal it applies to");
  }
  if (tolerance && (minus || plus)) {
    reader.Fail(node.source(), path, "give either 'tolerance' or 'minus' and 'plus', not both");
  }
  if ((minus != nullptr) != (plus != nullptr)) {
    reader.Fail(node.source(), path, "'minus' and 'plus' go together (write \"0 %\" for a side without deviation)");
  }
  if ((tolerance || minus) && (min || max)) {
    reader.Fail(node.source(), path, "give either a tolerance or limits ('min', 'max'), not both");
  }
  if (tolerance) {
    const double t = Deviation(reader, *tolerance, path + ".tolerance", d, line.nominal);
    line.band = {*line.nominal - t, *line.nominal + t};
  } else if (minus) {
    line.band = {*line.nominal - Deviation(reader, *minus, path + ".minus", d, line.nominal),
                 *line.nominal + Deviation(reader, *plus, path + ".plus", d, line.nominal)};
  } else if (min || max) {
    if (min) {
      const SheetReader::Figure f = reader.ReadFigure(*min, path + ".min", d, false);
      line.band.low = f.Si();
      take_unit(f);
    }
    if (max) {
      const SheetReader::Figure f = reader.ReadFigure(*max, path + ".max", d, false);
      line.band.high = f.Si();
      take_unit(f);
    }
    if (line.band.low > line.band.high) reader.Fail(node.source(), path, "'min' lies above 'max': the band is empty");
    if (line.nominal && !line.band.Contains(*line.nominal)) {
      reader.Fail(node.source(), path, "the nominal lies outside its own limits");
    }
  } else if (line.nominal) {
    reader.Fail(node.source(), path, "a nominal alone cannot be verified: give 'tolerance', 'minus' and 'plus', or 'min'/'max'");
  } else {
    reader.Fail(node.source(), path, "missing nominal: give 'nominal' with a tolerance, or 'min'/'max'");
  }
  return line;
}

}  // namespace

Datasheet ParseDatasheet(const std::string& text, const std::string& file) {
  toml::table root;
  try {
    root = toml::parse(text, file);
  } catch (const toml::parse_error& error) {
    throw InputError(InputErrorKind::kBadDatasheet, file, static_cast<long>(error.source().begin.line),
                     static_cast<long>(error.source().begin.column), std::string(error.description()));
  }
  const SheetReader reader(file);
  reader.RejectUnknown(root, "", {"datasheet", "spec"});
  Datasheet sheet;
  sheet.file = file;
  const toml::source_region top{};
  const toml::table* head = root["datasheet"].as_table();
  if (!head) reader.Fail(top, "datasheet", "missing: the file needs a [datasheet] table with rated_voltage");
  reader.RejectUnknown(*head, "datasheet", {"label", "rated_voltage", "reference_temperature"});
  if (const toml::node* label = head->get("label")) {
    const std::optional<std::string> text_label = label->value<std::string>();
    if (!text_label) reader.Fail(label->source(), "datasheet.label", "expected a string");
    sheet.label = *text_label;
  }
  const toml::node* rated = head->get("rated_voltage");
  if (!rated) reader.Fail(head->source(), "datasheet.rated_voltage", "missing: derived lines refer to it (e.g. \"12 V\")");
  sheet.rated_voltage_V = reader.ReadFigure(*rated, "datasheet.rated_voltage", units::Dimension::kVoltage, false).Si();
  if (!(sheet.rated_voltage_V > 0.0)) reader.Fail(rated->source(), "datasheet.rated_voltage", "must be positive");
  if (const toml::node* t = head->get("reference_temperature")) {
    sheet.reference_temperature_degC =
        reader.ReadFigure(*t, "datasheet.reference_temperature", units::Dimension::kTemperature, false).Si();
    if (!(*sheet.reference_temperature_degC + units::kCopperTemperatureConstant_degC > 0.0)) {
      reader.Fail(t->source(), "datasheet.reference_temperature",
                  "lies below the copper law's zero (-234.5 degC): R cannot be carried to it");
    }
  }
  const toml::table* spec = root["spec"].as_table();
  if (!spec || spec->empty()) reader.Fail(top, "spec", "missing: the file needs a [spec] table with at least one line");
  for (const auto& [key, node] : *spec) sheet.lines.push_back(ReadLine(reader, key, node));
  // The TOML table holds its keys sorted; the sheet keeps the file's order.
  std::stable_sort(sheet.lines.begin(), sheet.lines.end(),
                   [](const SpecLine& a, const SpecLine& b) { return a.line < b.line; });
  return sheet;
}

Datasheet LoadDatasheet(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(InputErrorKind::kCannotOpen, path, 0, 0, "cannot open the datasheet file");
  std::ostringstream text;
  text << in.rdbuf();
  return ParseDatasheet(text.str(), path);
}

}  // namespace coilspin::verify
