#include "src/model/coast_closed_form.h"

#include <cmath>
#include <limits>

namespace coilspin::model {

double CoastStopTime_s(const MotorParameters& motor, double initial_speed_rad_s) {
  const double speed = std::abs(initial_speed_rad_s);
  if (speed == 0.0) return 0.0;
  const double j = motor.inertia_kg_m2;
  const double b = motor.viscous_friction_N_m_s_per_rad;
  const double tc = motor.coulomb_friction_N_m;
  if (tc == 0.0) return std::numeric_limits<double>::infinity();
  if (b == 0.0) return j * speed / tc;              // t_stop = J·ω₀/Tc
  return j / b * std::log1p(b * speed / tc);        // t_stop = (J/B)·ln(1 + B·ω₀/Tc)
}

double CoastSpeed_rad_s(const MotorParameters& motor, double initial_speed_rad_s, double time_s) {
  if (time_s >= CoastStopTime_s(motor, initial_speed_rad_s)) return 0.0;
  const double direction = initial_speed_rad_s > 0.0 ? 1.0 : -1.0;
  const double speed = std::abs(initial_speed_rad_s);
  const double j = motor.inertia_kg_m2;
  const double b = motor.viscous_friction_N_m_s_per_rad;
  const double tc = motor.coulomb_friction_N_m;
  if (b == 0.0) return direction * (speed - tc / j * time_s);  // ω₀ − (Tc/J)·t
  // (ω₀ + Tc/B)·e^(−x) − Tc/B = ω₀·e^(−x) + (Tc/B)·expm1(−x),  x = t·B/J
  const double x = time_s * b / j;
  return direction * (speed * std::exp(-x) + tc / b * std::expm1(-x));
}

}  // namespace coilspin::model
