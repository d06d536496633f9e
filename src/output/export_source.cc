#include "src/output/export_source.h"

#include <cctype>

namespace coilspin::output {

nlohmann::ordered_json SourceJson(const ExportSource& source) {
  nlohmann::ordered_json from = {{"result", source.result_file}, {"format", source.result_format}};
  if (!source.motor_label.empty()) from["motor"] = source.motor_label;
  return from;
}

std::string IdentifierFrom(const std::string& text, const std::string& fallback) {
  std::string id;
  for (const char c : text) {
    const bool word = std::isalnum(static_cast<unsigned char>(c)) != 0;
    if (word && static_cast<unsigned char>(c) < 0x80) {
      id += c;
    } else if (!id.empty() && id.back() != '_') {
      id += '_';
    }
  }
  while (!id.empty() && id.back() == '_') id.pop_back();
  if (id.empty()) return fallback;
  if (std::isdigit(static_cast<unsigned char>(id.front()))) id = "m_" + id;
  return id;
}

}  // namespace coilspin::output
