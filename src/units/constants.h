#pragma once
// Named physical and mathematical constants of coilspin, each with its source.
// Code elsewhere uses these names, never the bare numbers.

namespace coilspin::units {

// ---- Mathematics -----------------------------------------------------------

inline constexpr double kPi = 3.14159265358979323846;
inline constexpr double kRadiansPerRevolution = 2.0 * kPi;  // physics (definition of the radian)
inline constexpr double kDegreesPerRevolution = 360.0;      // physics (definition of the degree)

// ---- Time and temperature --------------------------------------------------

inline constexpr double kSecondsPerMinute = 60.0;  // physics (definition)
// 1 rad/s = 60/(2π) rpm (physics: one revolution is 2π rad, one minute 60 s).
inline constexpr double kRpmPerRadPerSecond = kSecondsPerMinute / kRadiansPerRevolution;
// 0 degC = 273.15 K exactly: t/degC = T/K − 273.15 (NIST SP 811, 4.2.1.1, degree Celsius).
inline constexpr double kCelsiusZero_K = 273.15;

// ---- SI prefixes (NIST SP 811, section 4.3) --------------------------------

inline constexpr double kMilli = 1e-3;
inline constexpr double kMicro = 1e-6;
inline constexpr double kCenti = 1e-2;
inline constexpr double kKilo = 1e3;
inline constexpr double kPercent = 1e-2;  // NIST SP 811, 7.10.2: % = 0.01

// ---- Units of force and torque ---------------------------------------------

// Standard acceleration of gravity g_n = 9.80665 m/s² (exact, by definition of the
// 3rd CGPM 1901); 1 kgf = 9.80665 N exactly (NIST SP 811, Appendix B).
inline constexpr double kStandardGravity_m_s2 = 9.80665;
// 1 ozf·in = 7.061552 × 10⁻³ N·m (NIST SP 811, Appendix B, ounce (avoirdupois)-force inch).
inline constexpr double kOunceForceInch_N_m = 7.061552e-3;
// 1 lbf·in = 1.129848 × 10⁻¹ N·m (NIST SP 811, Appendix B, pound-force inch).
inline constexpr double kPoundForceInch_N_m = 1.129848e-1;

// ---- Units of mass and length (for moments of inertia) ------------------------

// 1 lb (avoirdupois) = 0.45359237 kg exactly (NIST SP 811, Appendix B, pound (avoirdupois)).
inline constexpr double kPound_kg = 0.45359237;
// 1 oz (avoirdupois) = 1/16 lb (NIST SP 811, Appendix B: 2.834952 × 10⁻² kg).
inline constexpr double kOuncesPerPound = 16.0;
// 1 in = 0.0254 m and 1 ft = 0.3048 m exactly (NIST SP 811, Appendix B, inch and foot).
inline constexpr double kInch_m = 0.0254;
inline constexpr double kFoot_m = 0.3048;

// ---- Three-phase windings (star-connected, sinusoidal) ------------------------

// Peak over rms of a sinusoid: √2 (physics: mean of sin² over a period is 1/2).
inline constexpr double kSinusoidPeakOverRms = 1.41421356237309504880;
// Line-to-line over phase voltage of a star connection: √3 (physics: two phasors of
// equal length 120° apart differ by √3 times that length, |1 − e^(−j2π/3)| = √3).
inline constexpr double kStarLineOverPhaseVoltage = 1.73205080756887729353;

// ---- Tolerances --------------------------------------------------------------

// Kt/Ke is "consistent" when it can lie within 1 ± 0.05 (common practice: catalogue
// constants are usually quoted to within a few per cent; the user may override it).
inline constexpr double kDefaultKtKeTolerance = 0.05;

// ---- Logged values -----------------------------------------------------------

// The largest magnitude a logged value may have once in SI: 1e100. No bench
// reading comes near it (the largest in use are speeds of ~1e4 rad/s and times of
// ~1e6 s); below it a reading's square, the product of two readings and sums of
// them over 10^10 rows stay finite (1e200·1e10 < 1.8e308, the largest double,
// IEEE 754), so no fit's sum of squares can overflow on a value the reader let in.
inline constexpr double kLargestLoggedMagnitude = 1e100;
// The shortest time between two logged rows: 1e-12 s, a sample rate of 1 THz.
// The fastest digitisers sample at some 1e11 per second (common practice), so
// a shorter step is a wrong time unit or a corrupt time column, and dividing by
// it (a derivative, a rate) would leave the range where a fit is meaningful.
inline constexpr double kShortestSampleInterval_s = 1e-12;

// The supply voltages small DC motors are rated at, for recognising a datasheet
// figure printed for another voltage than the sheet's rated one (common
// practice: battery multiples of 1.2 V and 1.5 V cells, and the usual bus voltages).
inline constexpr double kCommonRatedVoltages_V[] = {1.5, 3.0,  4.5,  4.8,  6.0,  7.2,  9.0,   12.0,  14.4, 18.0,
                                                     24.0, 36.0, 48.0, 60.0, 90.0, 110.0, 180.0, 220.0, 230.0};

// ---- Materials ---------------------------------------------------------------

// Resistance–temperature constant of copper windings, R(θ) = R_ref·(k + θ)/(k + θ_ref):
// IEC 60028 annealed copper α20 = 0.00393/K → 1/α − 20 = 234.5 °C;
// IEEE Std 113 uses 234.5, IEC 60034-1 uses 235.
inline constexpr double kCopperTemperatureConstant_degC = 234.5;

}  // namespace coilspin::units
