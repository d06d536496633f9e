#include "src/output/torque_speed_csv.h"

#include <sstream>

#include "src/output/number_format.h"

namespace coilspin::output {

std::string TorqueSpeedCsv(const TorqueSpeedLine& line, const ExportSource& source) {
  std::ostringstream out;
  out << "# torque-speed line" << (source.motor_label.empty() ? "" : " of " + source.motor_label)
      << ", exported by coilspin from " << source.result_file << " (" << source.result_format << ")\n"
      << "# at_voltage: " << ExactNumber(line.at_voltage_V) << " V\n"
      << "# includes_friction: " << (line.includes_friction ? "yes" : "no") << "\n"
      << "# band: pointwise " << ShortNumber(100.0 * source.confidence, 4)
      << " % interval of the torque at each speed (torque_low, torque_high)\n"
      << "speed [rad/s],torque [N*m],torque_low [N*m],torque_high [N*m]\n";
  for (const auto& p : line.points)
    out << ExactNumber(p.speed_rad_s) << "," << ExactNumber(p.torque_N_m) << "," << ExactNumber(p.ci_low) << ","
        << ExactNumber(p.ci_high) << "\n";
  return out.str();
}

}  // namespace coilspin::output
