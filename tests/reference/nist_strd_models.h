#pragma once
// The model forms of the NIST StRD nonlinear regression sets, written from the
// "Model:" section of each .dat file. One functor per form; sets that share a
// form share it. Each gives the mean response f(x; b) for parameters b[0] = b1,
// b[1] = b2, … and is templated so that Ceres can substitute its Jet type.
// The numbers inside the formulas (the 2 of Misra1b, the 12-month period of
// ENSO, …) are part of the published model statements, not fitted values.
//
// x[0] is the predictor (x1 for Nelson, x[1] = x2). Response(y) is the
// quantity the model explains: y itself, except for Nelson, whose model is
// stated for log[y].

#include <boost/math/constants/constants.hpp>
#include <cmath>
#include <cstddef>

namespace coilspin::nist {

struct PlainResponse {
  static constexpr std::size_t kPredictors = 1;
  static double Response(double y) { return y; }
};

// Misra1a, BoxBOD:  y = b1*(1-exp[-b2*x])
struct ExponentialRise : PlainResponse {
  static constexpr int kParameters = 2;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::exp;
    return b[0] * (1.0 - exp(-b[1] * x[0]));
  }
};

// Misra1b:  y = b1 * (1-(1+b2*x/2)**(-2))
struct Misra1b : PlainResponse {
  static constexpr int kParameters = 2;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    const T base = 1.0 + b[1] * x[0] / 2.0;
    return b[0] * (1.0 - 1.0 / (base * base));
  }
};

// Misra1c:  y = b1 * (1-(1+2*b2*x)**(-.5))
struct Misra1c : PlainResponse {
  static constexpr int kParameters = 2;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::sqrt;
    return b[0] * (1.0 - 1.0 / sqrt(1.0 + 2.0 * b[1] * x[0]));
  }
};

// Misra1d:  y = b1*b2*x*((1+b2*x)**(-1))
struct Misra1d : PlainResponse {
  static constexpr int kParameters = 2;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    return b[0] * b[1] * x[0] / (1.0 + b[1] * x[0]);
  }
};

// Chwirut1, Chwirut2:  y = exp[-b1*x]/(b2+b3*x)
struct Chwirut : PlainResponse {
  static constexpr int kParameters = 3;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::exp;
    return exp(-b[0] * x[0]) / (b[1] + b[2] * x[0]);
  }
};

// DanWood:  y = b1*x**b2
struct DanWood : PlainResponse {
  static constexpr int kParameters = 2;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::pow;
    return b[0] * pow(x[0], b[1]);
  }
};

// Nelson:  log[y] = b1 - b2*x1 * exp[-b3*x2]
struct Nelson {
  static constexpr int kParameters = 3;
  static constexpr std::size_t kPredictors = 2;
  static double Response(double y) { return std::log(y); }
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::exp;
    return b[0] - b[1] * x[0] * exp(-b[2] * x[1]);
  }
};

// MGH17:  y = b1 + b2*exp[-x*b4] + b3*exp[-x*b5]
struct Mgh17 : PlainResponse {
  static constexpr int kParameters = 5;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::exp;
    return b[0] + b[1] * exp(-x[0] * b[3]) + b[2] * exp(-x[0] * b[4]);
  }
};

// Lanczos1, Lanczos2, Lanczos3:  y = b1*exp(-b2*x) + b3*exp(-b4*x) + b5*exp(-b6*x)
struct Lanczos : PlainResponse {
  static constexpr int kParameters = 6;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::exp;
    return b[0] * exp(-b[1] * x[0]) + b[2] * exp(-b[3] * x[0]) + b[4] * exp(-b[5] * x[0]);
  }
};

// Gauss1, Gauss2, Gauss3:
//   y = b1*exp( -b2*x ) + b3*exp( -(x-b4)**2 / b5**2 ) + b6*exp( -(x-b7)**2 / b8**2 )
struct Gauss : PlainResponse {
  static constexpr int kParameters = 8;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::exp;
    const T first = (x[0] - b[3]) / b[4];
    const T second = (x[0] - b[6]) / b[7];
    return b[0] * exp(-b[1] * x[0]) + b[2] * exp(-first * first) + b[5] * exp(-second * second);
  }
};

// Kirby2:  y = (b1 + b2*x + b3*x**2) / (1 + b4*x + b5*x**2)
struct QuadraticOverQuadratic : PlainResponse {
  static constexpr int kParameters = 5;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    const double u = x[0];
    return (b[0] + b[1] * u + b[2] * u * u) / (1.0 + b[3] * u + b[4] * u * u);
  }
};

// Hahn1, Thurber:  y = (b1 + b2*x + b3*x**2 + b4*x**3) / (1 + b5*x + b6*x**2 + b7*x**3)
struct CubicOverCubic : PlainResponse {
  static constexpr int kParameters = 7;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    const double u = x[0];
    return (b[0] + b[1] * u + b[2] * u * u + b[3] * u * u * u) /
           (1.0 + b[4] * u + b[5] * u * u + b[6] * u * u * u);
  }
};

// ENSO:  y = b1 + b2*cos( 2*pi*x/12 ) + b3*sin( 2*pi*x/12 )
//             + b5*cos( 2*pi*x/b4 ) + b6*sin( 2*pi*x/b4 )
//             + b8*cos( 2*pi*x/b7 ) + b9*sin( 2*pi*x/b7 )
struct Enso : PlainResponse {
  static constexpr int kParameters = 9;
  static constexpr double kAnnualPeriod = 12.0;  // months: the model's fixed yearly cycle
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::cos;
    using std::sin;
    const double two_pi = boost::math::constants::two_pi<double>();
    const double annual = two_pi * x[0] / kAnnualPeriod;
    const T second = two_pi * x[0] / b[3];
    const T third = two_pi * x[0] / b[6];
    return b[0] + b[1] * cos(annual) + b[2] * sin(annual) + b[4] * cos(second) + b[5] * sin(second) +
           b[7] * cos(third) + b[8] * sin(third);
  }
};

// MGH09:  y = b1*(x**2+x*b2) / (x**2+x*b3+b4)
struct Mgh09 : PlainResponse {
  static constexpr int kParameters = 4;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    const double u = x[0];
    return b[0] * (u * u + u * b[1]) / (u * u + u * b[2] + b[3]);
  }
};

// MGH10:  y = b1 * exp[b2/(x+b3)]
struct Mgh10 : PlainResponse {
  static constexpr int kParameters = 3;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::exp;
    return b[0] * exp(b[1] / (x[0] + b[2]));
  }
};

// Eckerle4:  y = (b1/b2) * exp[-0.5*((x-b3)/b2)**2]
struct Eckerle4 : PlainResponse {
  static constexpr int kParameters = 3;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::exp;
    const T z = (x[0] - b[2]) / b[1];
    return (b[0] / b[1]) * exp(-0.5 * z * z);
  }
};

// Rat42:  y = b1 / (1+exp[b2-b3*x])
struct Rat42 : PlainResponse {
  static constexpr int kParameters = 3;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::exp;
    return b[0] / (1.0 + exp(b[1] - b[2] * x[0]));
  }
};

// Rat43:  y = b1 / ((1+exp[b2-b3*x])**(1/b4))
struct Rat43 : PlainResponse {
  static constexpr int kParameters = 4;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::exp;
    using std::pow;
    return b[0] / pow(1.0 + exp(b[1] - b[2] * x[0]), 1.0 / b[3]);
  }
};

// Bennett5:  y = b1 * (b2+x)**(-1/b3)
struct Bennett5 : PlainResponse {
  static constexpr int kParameters = 3;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::pow;
    return b[0] * pow(b[1] + x[0], -1.0 / b[2]);
  }
};

// Roszman1:  y = b1 - b2*x - arctan[b3/(x-b4)]/pi
// The angle is the four-quadrant one, atan2(b3, x − b4). Measured: x − b4 < 0
// throughout the data, where the principal value arctan(b3/(x − b4)) is
// smaller by π, and fitting with it reproduces b2, b3, b4 and every standard
// deviation but gives b1 smaller by exactly 1 than the certified value.
struct Roszman1 : PlainResponse {
  static constexpr int kParameters = 4;
  template <typename T>
  static T Mean(const T* b, const double* x) {
    using std::atan2;
    return b[0] - b[1] * x[0] - atan2(b[2], x[0] - b[3]) / boost::math::constants::pi<double>();
  }
};

}  // namespace coilspin::nist
