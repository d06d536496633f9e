#include "src/result/result_reader.h"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <limits>
#include <nlohmann/json.hpp>
#include <optional>
#include <sstream>
#include <stdexcept>

#include "src/result/parameter_covariance.h"

namespace coilspin::result {
namespace {

using Json = nlohmann::ordered_json;

const char* TypeName(const Json& j) { return j.type_name(); }

// One value of the file with its key path, for errors that name the key.
class Node {
 public:
  Node(const Json& json, std::string path, const std::string& file) : json_(json), path_(std::move(path)), file_(file) {}

  [[noreturn]] void Fail(const std::string& message) const { throw ResultFileError(file_, 0, 0, path_, message); }

  const Json& json() const { return json_; }
  const std::string& path() const { return path_; }

  bool Has(const char* key) const { return json_.contains(key); }

  Node At(const std::string& key) const {
    const Node object = Object();
    const auto it = object.json_.find(key);
    if (it == object.json_.end()) Node(json_, Child(key), file_).Fail("missing");
    return Node(*it, Child(key), file_);
  }
  std::optional<Node> Find(const std::string& key) const {
    const Node object = Object();
    const auto it = object.json_.find(key);
    if (it == object.json_.end()) return std::nullopt;
    return Node(*it, Child(key), file_);
  }
  Node Item(std::size_t k) const { return Node(json_[k], path_ + "[" + std::to_string(k) + "]", file_); }

  Node Object() const {
    if (!json_.is_object()) Fail(std::string("expected an object, found ") + TypeName(json_));
    return *this;
  }
  Node Array() const {
    if (!json_.is_array()) Fail(std::string("expected an array, found ") + TypeName(json_));
    return *this;
  }
  std::size_t Size() const { return json_.size(); }

  // A number; null stands for a value that is not a number (NaN, written as null).
  double Number() const {
    if (json_.is_null()) return std::numeric_limits<double>::quiet_NaN();
    if (!json_.is_number()) Fail(std::string("expected a number, found ") + TypeName(json_));
    return json_.get<double>();
  }
  std::optional<double> NumberOrNothing() const {
    if (json_.is_null()) return std::nullopt;
    return Number();
  }
  template <typename Integer>
  Integer Whole() const {
    if (!json_.is_number_integer()) Fail(std::string("expected a whole number, found ") + TypeName(json_));
    if (json_.is_number_unsigned()) return static_cast<Integer>(json_.get<unsigned long long>());
    return static_cast<Integer>(json_.get<long long>());
  }
  std::string Text() const {
    if (!json_.is_string()) Fail(std::string("expected a string, found ") + TypeName(json_));
    return json_.get<std::string>();
  }
  bool Flag() const {
    if (!json_.is_boolean()) Fail(std::string("expected true or false, found ") + TypeName(json_));
    return json_.get<bool>();
  }
  std::vector<std::string> Texts() const {
    std::vector<std::string> texts;
    const Node list = Array();
    for (std::size_t k = 0; k < list.Size(); ++k) texts.push_back(list.Item(k).Text());
    return texts;
  }
  std::vector<double> Numbers(std::size_t expected_size) const {
    const Node list = Array();
    if (list.Size() != expected_size)
      Fail("expected " + std::to_string(expected_size) + " numbers, found " + std::to_string(list.Size()));
    std::vector<double> numbers;
    for (std::size_t k = 0; k < list.Size(); ++k) numbers.push_back(list.Item(k).Number());
    return numbers;
  }
  // Each key of an object with its node, in the file's order.
  std::vector<std::pair<std::string, Node>> Members() const {
    std::vector<std::pair<std::string, Node>> members;
    const Node object = Object();
    for (auto it = object.json_.begin(); it != object.json_.end(); ++it)
      members.push_back({it.key(), Node(it.value(), Child(it.key()), file_)});
    return members;
  }

 private:
  std::string Child(const std::string& key) const { return path_.empty() ? key : path_ + "." + key; }

  const Json& json_;
  std::string path_;
  const std::string& file_;
};

// The unit of a residual channel (the file names the channel only).
std::string ChannelUnit(const std::string& channel) {
  if (channel == "voltage") return "V";
  if (channel == "current") return "A";
  if (channel == "speed") return "rad/s";
  if (channel == "position") return "rad";
  if (channel == "torque") return "N*m";
  return "";
}

QuantityEstimate ReadQuantity(const std::string& key, const Node& n) {
  QuantityEstimate q;
  q.key = key;
  q.symbol = n.At("symbol").Text();
  q.unit = n.At("unit").Text();
  q.value = n.At("value").Number();
  q.std_error = n.At("std_error").Number();
  const std::vector<double> ci = n.At("ci").Numbers(2);
  q.ci_low = ci[0];
  q.ci_high = ci[1];
  q.degrees_of_freedom = n.At("degrees_of_freedom").Number();
  q.tests = n.At("tests").Texts();
  if (auto b = n.Find("basis")) q.basis = b->Text();
  if (auto v = n.Find("at_voltage")) q.at_voltage_V = v->Number();
  if (auto t = n.Find("at_temperature_degC")) q.at_temperature_degC = t->Number();
  if (auto note = n.Find("note")) q.note = note->Text();
  if (auto assumes = n.Find("assumes")) q.assumes = assumes->Texts();
  return q;
}

std::vector<QuantityEstimate> ReadQuantities(const Node& n, int format_version) {
  std::vector<QuantityEstimate> quantities;
  for (const auto& [key, entry] : n.Members()) {
    const std::string name = format_version == 1 && key == "speed_torque_gradient" ? "speed_torque_slope" : key;
    quantities.push_back(ReadQuantity(name, entry));
  }
  return quantities;
}

// Format 2 matrices are symmetric exactly; format 1 wrote the correlation as
// computed, asymmetric by rounding (up to 2e-7), and it is read as its
// symmetric part.
NamedMatrix ReadMatrix(const Node& n, int format_version) {
  NamedMatrix m;
  m.names = n.At("names").Texts();
  const Node rows = n.At("matrix").Array();
  if (rows.Size() != m.names.size())
    rows.Fail("expected " + std::to_string(m.names.size()) + " rows (one per name), found " +
              std::to_string(rows.Size()));
  for (std::size_t a = 0; a < rows.Size(); ++a) m.matrix.push_back(rows.Item(a).Numbers(m.names.size()));
  for (std::size_t a = 0; a < m.names.size(); ++a)
    for (std::size_t b = 0; b < a; ++b) {
      if (format_version == 1) m.matrix[a][b] = m.matrix[b][a] = 0.5 * (m.matrix[a][b] + m.matrix[b][a]);
      if (m.matrix[a][b] != m.matrix[b][a])
        rows.Fail("not symmetric: " + m.names[a] + ", " + m.names[b] + " differs from " + m.names[b] + ", " +
                  m.names[a]);
    }
  return m;
}

IntervalReport ReadIntervals(const Node& n) {
  IntervalReport r;
  r.method = n.At("method").Text();
  r.robust_loss = n.At("robust_loss").Text();
  if (auto k = n.Find("replicates")) r.replicates = k->Whole<int>();
  if (auto k = n.Find("failed_replicates")) r.failed_replicates = k->Whole<int>();
  if (auto k = n.Find("seed")) r.seed = k->Whole<unsigned long long>();
  r.notes = n.At("notes").Texts();
  return r;
}

TestSummary ReadTest(const Node& n) {
  TestSummary t;
  t.kind = n.At("kind").Text();
  t.file = n.At("file").Text();
  t.samples = n.At("samples").Whole<long>();
  if (auto m = n.Find("method")) t.method = m->Text();
  const Node rms = n.At("rms_residual");
  const auto per_channel = [&](const char* key, const std::string& channel) -> std::optional<Node> {
    if (auto map = n.Find(key)) return map->Find(channel);
    return std::nullopt;
  };
  for (const auto& [channel, value] : rms.Members()) {
    ChannelResidual r;
    r.channel = channel;
    r.unit = ChannelUnit(channel);
    r.rms = value.Number();
    if (auto s = per_channel("noise_sigma", channel)) r.sigma = s->Number();
    if (auto a = per_channel("residual_lag1_autocorrelation", channel)) r.lag1_autocorrelation = a->Number();
    if (auto u = per_channel("residuals_used", channel)) r.samples = u->Whole<int>();
    t.residuals.push_back(r);
  }
  if (auto share = n.Find("information_share"))
    for (const auto& [key, value] : share->Members()) t.information_share.push_back({key, value.Number()});
  if (auto aside = n.Find("set_aside"))
    for (const auto& [channel, entry] : aside->Members()) {
      const Node lines = entry.At("lines").Array();
      std::vector<long> numbers;
      for (std::size_t k = 0; k < lines.Size(); ++k) numbers.push_back(lines.Item(k).Whole<long>());
      t.set_aside.push_back({channel, numbers});
    }
  t.warnings = n.At("warnings").Texts();
  if (auto contributed = n.Find("contributed")) t.contributed = contributed->Flag();
  return t;
}

TorqueSpeedLine ReadTorqueSpeed(const Node& n) {
  TorqueSpeedLine line;
  line.at_voltage_V = n.At("at_voltage").Number();
  if (n.At("speed_unit").Text() != "rad/s") n.At("speed_unit").Fail("expected \"rad/s\"");
  if (n.At("torque_unit").Text() != "N*m") n.At("torque_unit").Fail("expected \"N*m\"");
  line.includes_friction = n.At("includes_friction").Flag();
  const Node points = n.At("points").Array();
  for (std::size_t k = 0; k < points.Size(); ++k) {
    const Node p = points.Item(k);
    const std::vector<double> ci = p.At("ci").Numbers(2);
    line.points.push_back({p.At("speed").Number(), p.At("torque").Number(), ci[0], ci[1]});
  }
  return line;
}

Consistency ReadConsistency(const Node& n) {
  Consistency c;
  c.kt_over_ke = n.At("kt_over_ke").NumberOrNothing();
  if (!n.At("ci").json().is_null()) {
    const std::vector<double> ci = n.At("ci").Numbers(2);
    c.ci_low = ci[0];
    c.ci_high = ci[1];
  }
  c.tolerance = n.At("tolerance").Number();
  c.verdict = n.At("verdict").Text();
  c.note = n.At("note").Text();
  return c;
}

// Format 1 has no covariance: C_ab = ρ_ab·se_a·se_b over the correlation's names.
void CovarianceFromCorrelation(const NamedMatrix& correlation, const Node& where, MotorEstimate* e) {
  e->correlation_names = correlation.names;
  e->correlation = correlation.matrix;
  std::vector<double> se;
  for (const auto& name : correlation.names) {
    const QuantityEstimate* q = e->Find(name);
    if (!q) where.Fail("names " + name + ", which is not among the parameters");
    se.push_back(q->std_error);
  }
  const std::size_t n = se.size();
  e->covariance.assign(n, std::vector<double>(n, 0.0));
  for (std::size_t a = 0; a < n; ++a)
    for (std::size_t b = 0; b <= a; ++b)
      e->covariance[a][b] = e->covariance[b][a] = correlation.matrix[a][b] * (se[a] * se[b]);
}

int FormatVersion(const Node& root) {
  const Node format = root.At("format");
  const std::string text = format.Text();
  if (text == kResultFormat1) return 1;
  if (text == kResultFormat2) return 2;
  if (text.rfind("coilspin.result/", 0) == 0)
    format.Fail("result format '" + text + "' is newer than this coilspin reads (" + kResultFormat1 + ", " +
                kResultFormat2 + ")");
  format.Fail("'" + text + "' is not a coilspin result file; expected \"" + kResultFormat2 + "\" (or \"" +
              kResultFormat1 + "\")");
}

// 1-based line and column of a 1-based byte position in `text`.
std::pair<long, long> LineAndColumn(const std::string& text, std::size_t byte) {
  long line = 1, column = 1;
  for (std::size_t k = 0; k + 1 < byte && k < text.size(); ++k) {
    if (text[k] == '\n') {
      ++line;
      column = 1;
    } else {
      ++column;
    }
  }
  return {line, column};
}

}  // namespace

ResultFile ParseResult(const std::string& text, const std::string& file) {
  Json json;
  try {
    json = Json::parse(text);
  } catch (const Json::parse_error& e) {
    const auto [line, column] = LineAndColumn(text, e.byte);
    std::string what = e.what();  // "[json.exception.parse_error.101] parse error at line 1, column 2: ..."
    const std::size_t colon = what.find(": ");
    throw ResultFileError(file, line, column, "",
                          "not a JSON file: " + (colon == std::string::npos ? what : what.substr(colon + 2)));
  }
  const Node root(json, "", file);
  root.Object();
  ResultFile result;
  result.format_version = FormatVersion(root);
  MotorEstimate& e = result.estimate;
  if (auto motor = root.Find("motor")) e.motor_label = motor->At("label").Text();
  e.confidence = root.At("confidence").Number();
  if (!(e.confidence > 0.0 && e.confidence < 1.0)) root.At("confidence").Fail("expected a level between 0 and 1");
  if (auto intervals = root.Find("intervals")) e.intervals = ReadIntervals(*intervals);
  e.parameters = ReadQuantities(root.At("parameters"), result.format_version);
  for (const auto& [key, reason] : root.At("not_identified").Members()) e.not_identified.push_back({key, reason.Text()});
  if (auto ratios = root.Find("ratios")) e.ratios = ReadQuantities(*ratios, result.format_version);
  const Node correlation_node = root.At("correlation");
  const NamedMatrix correlation = ReadMatrix(correlation_node, result.format_version);
  if (result.format_version == 1) {
    CovarianceFromCorrelation(correlation, correlation_node, &e);
  } else {
    const Node covariance_node = root.At("covariance");
    try {
      SetFromFull(ReadMatrix(covariance_node, result.format_version), correlation, &e);
    } catch (const std::invalid_argument& error) {
      covariance_node.Fail(error.what());
    } catch (const std::out_of_range& error) {
      covariance_node.Fail(error.what());
    }
  }
  if (auto derived = root.Find("derived")) e.derived = ReadQuantities(*derived, result.format_version);
  if (auto offsets = root.Find("sensor_offsets")) e.sensor_offsets = ReadQuantities(*offsets, result.format_version);
  if (auto line = root.Find("torque_speed")) e.torque_speed = ReadTorqueSpeed(*line);
  if (auto consistency = root.Find("consistency")) e.consistency = ReadConsistency(*consistency);
  const Node tests = root.At("tests").Array();
  for (std::size_t k = 0; k < tests.Size(); ++k) e.tests.push_back(ReadTest(tests.Item(k)));
  e.warnings = root.At("warnings").Texts();
  if (auto solver = root.Find("solver")) {
    solver->Array();
    for (std::size_t k = 0; k < solver->Size(); ++k) {
      const Node s = solver->Item(k);
      e.solver.push_back({s.At("converged").Flag(), s.At("termination").Text(), s.At("iterations").Whole<int>(),
                          s.At("initial_cost").Number(), s.At("final_cost").Number()});
    }
  }
  if (auto settings = root.Find("settings"))
    for (const auto& [key, value] : settings->Members())
      e.settings.push_back({key, value.json().is_number() ? value.json().dump() : value.Text()});
  if (auto verification = root.Find("verification")) result.verification = verification->Object().json();
  return result;
}

ResultFile ReadResultFile(const std::string& path) {
  std::error_code ignored;
  if (std::filesystem::is_directory(path, ignored))
    throw InputError(InputErrorKind::kCannotOpen, path, 0, 0, "cannot open the result file: it is a folder");
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError(InputErrorKind::kCannotOpen, path, 0, 0, "cannot open the result file");
  std::ostringstream text;
  text << in.rdbuf();
  if (in.bad()) throw InputError(InputErrorKind::kCannotOpen, path, 0, 0, "cannot read the result file");
  return ParseResult(text.str(), path);
}

}  // namespace coilspin::result
