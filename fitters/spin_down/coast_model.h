#pragma once
// The open-circuit coast (i = 0):  J·dω/dt = −B·ω − Tc·sgn(ω).
// With b = B/J and c = Tc/J, from ω(0) = ω₀ > 0 (physics: solve the linear ODE):
//   ω(t) = (ω₀ + c/b)·e^(−b·t) − c/b                         for t < t_s
//   θ(t) − θ(0) = (ω₀ + c/b)·(1 − e^(−b·t))/b − (c/b)·t       for t < t_s
//   t_s = ln(1 + b·ω₀/c)/b   (rest; afterwards ω = 0, θ = θ(t_s))
// Without Coulomb friction (c = 0) the rotor never quite stops.

#include <cmath>

namespace coilspin::spin_down {

template <typename T>
T CoastStopTime(const T& omega0, const T& b, const T& c) {
  using std::log;
  return log(1.0 + b * omega0 / c) / b;
}

template <typename T>
T CoastSpeed(double t_s, const T& omega0, const T& b, const T& c) {
  using std::exp;
  if (c > 0.0 && !(T(t_s) < CoastStopTime(omega0, b, c))) return T(0.0);
  return (omega0 + c / b) * exp(-b * t_s) - c / b;
}

template <typename T>
T CoastAngle(double t_s, const T& omega0, const T& b, const T& c) {
  using std::exp;
  T t = T(t_s);
  if (c > 0.0) {
    const T stop = CoastStopTime(omega0, b, c);
    if (!(t < stop)) t = stop;
  }
  return (omega0 + c / b) * (1.0 - exp(-b * t)) / b - (c / b) * t;
}

}  // namespace coilspin::spin_down
