#pragma once
// The turning motor over one sample interval, exactly (docs/methods.md §3.3).
//
// While current flows and the rotor turns, with the signs s_i = sgn(i) and
// s_ω = sgn(ω) held, the two equations
//     L·di/dt = v − R·i − Ke·ω − Vb·s_i
//     J·dω/dt = Kt·i − B·ω − Tc·s_ω
// are linear with a constant input over [t_k, t_k+1) (the logged v held,
// zero-order hold):  dx/dt = A·x + u,  x = (i, ω),
//     A = | −R/L   −Ke/L |      u = | (v − Vb·s_i)/L |
//         | Kt/J   −B/J  |          | −Tc·s_ω/J      |
// so the state Δ later is, without any integration error,
//     x_{k+1} = Φ·x_k + Γ·u,       Φ = e^(A·Δ),   Γ = A⁻¹·(Φ − I)
// and the angle turned is  ∫ω dt = [Γ·x_k + A⁻¹·(Γ − Δ·I)·u]_ω.
// A voltage that moves linearly between samples (first-order hold: the input
// u + r·t) adds Γ₂·r to the state and [A⁻¹·(Γ₂ − (Δ²/2)·I)·r]_ω to the angle,
// Γ₂ = ∫₀^Δ e^(A·(Δ−τ))·τ dτ = A⁻¹·(Γ − Δ·I) (integration by parts).
//
// Φ of a 2×2 matrix in closed form (Cayley–Hamilton): with s = tr(A)/2,
// M = A − s·I and δ = s² − det(A) (so M² = δ·I),
//     Φ = e^(s·Δ)·[C·I + S·M],   C = cosh(√δ·Δ), S = sinh(√δ·Δ)/√δ
// for δ > 0 (two real time constants, the usual motor: τ_m > 4·τ_e), with
// cos/sin of √(−δ)·Δ for δ < 0 (underdamped), and the Taylor series of C and
// S in δ·Δ² near δ = 0, where both are smooth but √δ is not. For δ > 0 the
// products are formed from the eigenvalues λ± = s ± √δ ≤ 0 as
// e^(sΔ)C = (e^(λ+Δ) + e^(λ−Δ))/2 and e^(sΔ)S = −e^(λ+Δ)·expm1(−2√δΔ)/(2√δ),
// which neither overflows nor cancels however stiff the pair is: the
// electrical time constant may be 100× shorter than the mechanical one and the
// sample interval anything from far below the first to far above it, at the
// same cost per sample.
//
// Precision: Φ − I and Γ − Δ·I lose about log10(1/(|λ|·Δ)) digits for the
// slow eigenvalue (3 digits at |λ|·Δ = 1e-3), far below any bench noise.
// det(A) = (R·B + Ke·Kt)/(L·J) > 0 whenever Ke·Kt > 0, so A⁻¹ exists.

#include <cmath>

namespace coilspin::step {

// Below |δ|·Δ² = kSeriesLimit the series C = 1 + z/2 + z²/24 + z³/720,
// S/Δ = 1 + z/6 + z²/120 + z³/5040 (z = δ·Δ²) is used; its truncation error,
// z⁴/8! ≈ 2.5e-21, is below double rounding (Taylor series of cosh and sinh).
inline constexpr double kSeriesLimit = 1e-4;

template <typename T>
struct Matrix2 {
  T a11, a12, a21, a22;
};

template <typename T>
struct Vector2 {
  T x1, x2;
};

template <typename T>
Vector2<T> Multiply(const Matrix2<T>& m, const Vector2<T>& v) {
  return {m.a11 * v.x1 + m.a12 * v.x2, m.a21 * v.x1 + m.a22 * v.x2};
}

// e^(A·Δ) by the closed form above.
template <typename T>
Matrix2<T> Exponential(const Matrix2<T>& a, const T& interval_s) {
  using std::cos;
  using std::exp;
  using std::expm1;
  using std::sin;
  using std::sqrt;
  const T s = 0.5 * (a.a11 + a.a22);
  const T det = a.a11 * a.a22 - a.a12 * a.a21;
  const T delta = s * s - det;
  const T z = delta * (interval_s * interval_s);
  T c_scaled, s_scaled;  // e^(sΔ)·C and e^(sΔ)·S
  if (z < kSeriesLimit && z > -kSeriesLimit) {
    const T growth = exp(s * interval_s);
    c_scaled = growth * (1.0 + z * (1.0 / 2.0 + z * (1.0 / 24.0 + z / 720.0)));
    s_scaled = growth * interval_s * (1.0 + z * (1.0 / 6.0 + z * (1.0 / 120.0 + z / 5040.0)));
  } else if (z > 0.0) {
    const T root = sqrt(delta);
    const T slow = exp((s + root) * interval_s);
    const T fast = exp((s - root) * interval_s);
    c_scaled = 0.5 * (slow + fast);
    s_scaled = -slow * expm1(-2.0 * root * interval_s) / (2.0 * root);
  } else {
    const T frequency = sqrt(-delta);
    const T growth = exp(s * interval_s);
    c_scaled = growth * cos(frequency * interval_s);
    s_scaled = growth * sin(frequency * interval_s) / frequency;
  }
  return {c_scaled + s_scaled * (a.a11 - s), s_scaled * a.a12, s_scaled * a.a21, c_scaled + s_scaled * (a.a22 - s)};
}

template <typename T>
Matrix2<T> Product(const Matrix2<T>& p, const Matrix2<T>& q) {
  return {p.a11 * q.a11 + p.a12 * q.a21, p.a11 * q.a12 + p.a12 * q.a22, p.a21 * q.a11 + p.a22 * q.a21,
          p.a21 * q.a12 + p.a22 * q.a22};
}

template <typename T>
Matrix2<T> Inverse(const Matrix2<T>& a) {
  const T det = a.a11 * a.a22 - a.a12 * a.a21;
  return {a.a22 / det, -a.a12 / det, -a.a21 / det, a.a11 / det};
}

// The state and the angle turned Δ after (i, ω), under A and the held input u.
// Δ is of type T: after a breakaway inside an interval it depends on the parameters.
template <typename T>
struct IntervalResult {
  Vector2<T> state;
  T angle_rad;
};

// Φ, A⁻¹, Γ = A⁻¹·(Φ − I) and Γ₂ = A⁻¹·(Γ − Δ·I) for one A and Δ. They depend on
// the parameters and Δ only, so a log sampled at a constant Δ needs them once
// per evaluation, not once per sample (step_dynamics.h keeps them).
template <typename T>
struct Discretisation {
  T interval_s;
  Matrix2<T> phi, inverse, gamma, gamma2;
};

template <typename T>
Discretisation<T> Discretise(const Matrix2<T>& a, const T& interval_s) {
  Discretisation<T> d;
  d.interval_s = interval_s;
  d.phi = Exponential(a, interval_s);
  d.inverse = Inverse(a);
  d.gamma = Product(d.inverse, Matrix2<T>{d.phi.a11 - 1.0, d.phi.a12, d.phi.a21, d.phi.a22 - 1.0});
  d.gamma2 = Product(d.inverse, Matrix2<T>{d.gamma.a11 - interval_s, d.gamma.a12, d.gamma.a21, d.gamma.a22 - interval_s});
  return d;
}

template <typename T>
IntervalResult<T> AdvanceLinear(const Discretisation<T>& d, const Vector2<T>& u, const Vector2<T>& ramp,
                                const Vector2<T>& x) {
  const T half_square = 0.5 * d.interval_s * d.interval_s;
  const Vector2<T> free = Multiply(d.phi, x);
  const Vector2<T> forced = Multiply(d.gamma, u);
  const Vector2<T> ramped = Multiply(d.gamma2, ramp);
  // ∫x dt = Γ·x_k + Γ₂·u + A⁻¹·(Γ₂ − (Δ²/2)·I)·r; only the ω row is needed.
  const Vector2<T> gamma2_r_less = {ramped.x1 - half_square * ramp.x1, ramped.x2 - half_square * ramp.x2};
  const Vector2<T> gamma2_u = Multiply(d.gamma2, u);
  const T angle = d.gamma.a21 * x.x1 + d.gamma.a22 * x.x2 + gamma2_u.x2 + d.inverse.a21 * gamma2_r_less.x1 +
                  d.inverse.a22 * gamma2_r_less.x2;
  return {{free.x1 + forced.x1 + ramped.x1, free.x2 + forced.x2 + ramped.x2}, angle};
}

}  // namespace coilspin::step
