#include "src/verify/sheet_relations.h"

#include <algorithm>
#include <cmath>

namespace coilspin::verify {
namespace {

bool Has(const std::vector<std::string>& present, const char* key) {
  return std::find(present.begin(), present.end(), key) != present.end();
}

// Which line stands for each symbol, and how its SI value is read.
struct Symbols {
  std::string kt;          // key standing for Kt ("" when none): torque_constant, else Ke's line
  std::string ke;          // key standing for Ke ("" when none)
  bool ke_from_kv = false; // Ke = 1/Kv
  bool has_vb = false;
  bool has_i0 = false;

  double Kt(const LineValues& v) const { return kt == "torque_constant" ? v.at(kt) : Ke(v); }
  double Ke(const LineValues& v) const { return ke_from_kv ? 1.0 / v.at(ke) : v.at(ke); }
  double Vb(const LineValues& v) const { return has_vb ? v.at("brush_drop") : 0.0; }
  double I0(const LineValues& v) const { return has_i0 ? v.at("no_load_current") : 0.0; }
};

Symbols SymbolsFor(const std::vector<std::string>& present) {
  Symbols s;
  for (const char* key : {"back_emf_constant", "speed_constant", "speed_constant_si", "torque_constant"}) {
    if (Has(present, key)) {
      s.ke = key;
      s.ke_from_kv = std::string(key).rfind("speed_constant", 0) == 0;
      break;
    }
  }
  s.kt = Has(present, "torque_constant") ? "torque_constant" : s.ke;
  s.has_vb = Has(present, "brush_drop");
  s.has_i0 = Has(present, "no_load_current");
  return s;
}

// Appends `key` to `inputs` once.
void Use(std::vector<std::string>* inputs, const std::string& key) {
  if (!key.empty() && std::find(inputs->begin(), inputs->end(), key) == inputs->end()) inputs->push_back(key);
}

}  // namespace

std::vector<Relation> RelationsFor(const std::vector<std::string>& present) {
  const Symbols s = SymbolsFor(present);
  const std::string drive = s.has_vb ? "(V - Vb)" : "V";
  const std::string drive_less_i0 =
      std::string("(V") + (s.has_vb ? " - Vb" : "") + (s.has_i0 ? " - R*I0" : "") + ")";
  const std::string ke_text = "Ke";
  const std::string with_kv = s.ke_from_kv ? ", Ke = 1/Kv" : "";  // appended where Ke comes from Kv
  std::vector<Relation> relations;
  const auto add = [&](const char* stated, const std::string& formula, std::vector<std::string> inputs,
                       bool uses_voltage, std::function<double(const LineValues&, double)> predict) {
    if (!Has(present, stated)) return;
    for (const std::string& k : inputs)
      if (k.empty()) return;  // the sheet lacks a line the relation needs
    if (s.has_vb && uses_voltage) Use(&inputs, "brush_drop");
    const bool reads_ke = std::find(inputs.begin(), inputs.end(), s.ke) != inputs.end() && s.ke != "torque_constant";
    relations.push_back({std::string(stated) + " = " + formula + (reads_ke ? with_kv : ""), stated, inputs,
                         uses_voltage, std::move(predict)});
  };

  if (s.ke != "torque_constant" && Has(present, "torque_constant")) {
    add("torque_constant", ke_text + " (in SI)", {s.ke}, false, [s](const LineValues& v, double) { return s.Ke(v); });
  }
  if (s.ke == "back_emf_constant") {
    for (const char* kv : {"speed_constant", "speed_constant_si"})
      add(kv, "1/Ke (in SI)", {s.ke}, false, [s](const LineValues& v, double) { return 1.0 / s.Ke(v); });
  }
  add("stall_torque", "Kt*" + drive + "/R", {s.kt, "resistance"}, true,
      [s](const LineValues& v, double V) { return s.Kt(v) * (V - s.Vb(v)) / v.at("resistance"); });
  add("stall_current", drive + "/R", {"resistance"}, true,
      [s](const LineValues& v, double V) { return (V - s.Vb(v)) / v.at("resistance"); });
  {
    std::vector<std::string> inputs = {s.ke, "resistance"};
    if (s.has_i0) inputs.push_back("no_load_current");
    add("no_load_speed", drive_less_i0 + "/" + ke_text, inputs, true, [s](const LineValues& v, double V) {
      return (V - s.Vb(v) - v.at("resistance") * s.I0(v)) / s.Ke(v);
    });
  }
  add("motor_constant", "Kt/sqrt(R)", {s.kt, "resistance"}, false,
      [s](const LineValues& v, double) { return s.Kt(v) / std::sqrt(v.at("resistance")); });
  {
    std::vector<std::string> inputs = {"resistance", "inertia", s.kt};
    Use(&inputs, s.ke);
    add("mechanical_time_constant", "R*J/(Kt*" + ke_text + ")", inputs, false, [s](const LineValues& v, double) {
      return v.at("resistance") * v.at("inertia") / (s.Kt(v) * s.Ke(v));
    });
  }
  add("electrical_time_constant", "L/R", {"inductance", "resistance"}, false,
      [](const LineValues& v, double) { return v.at("inductance") / v.at("resistance"); });
  {
    std::vector<std::string> inputs = {"resistance", s.kt};
    Use(&inputs, s.ke);
    add("speed_torque_slope", "R/(Kt*" + ke_text + ")", inputs, false,
        [s](const LineValues& v, double) { return v.at("resistance") / (s.Kt(v) * s.Ke(v)); });
  }
  {
    std::vector<std::string> inputs = {"resistance"};
    if (s.has_i0) inputs.push_back("no_load_current");
    add("max_output_power", drive_less_i0 + "^2/(4*R)", inputs, true, [s](const LineValues& v, double V) {
      const double r = v.at("resistance");
      const double headroom = V - s.Vb(v) - r * s.I0(v);
      return headroom * headroom / (4.0 * r);
    });
  }
  if (s.has_i0) {
    add("peak_efficiency", (s.has_vb ? "((V - Vb)/V)*" : std::string()) + "(1 - sqrt(I0*R/" + drive + "))^2",
        {"no_load_current", "resistance"}, true, [s](const LineValues& v, double V) {
          const double root = std::sqrt(s.I0(v) * v.at("resistance") / (V - s.Vb(v)));
          return (V - s.Vb(v)) / V * (1.0 - root) * (1.0 - root);
        });
  }
  return relations;
}

}  // namespace coilspin::verify
