#pragma once
// CLI11 validators for numeric options, with short plain messages
// ("--resistance: must be a positive number, got -3.1"). CLI11's own
// PositiveNumber prints its range with std::to_string(DBL_MAX), 300 digits;
// and its ranges let "nan" through. Every number here must be finite.

#include <CLI/CLI.hpp>

namespace coilspin::cli {

CLI::Validator PositiveNumber();     // finite, > 0
CLI::Validator NonNegativeNumber();  // finite, >= 0
CLI::Validator FiniteNumber();       // finite
// Finite and strictly between `low` and `high` ("between 0 and 1, exclusive").
CLI::Validator OpenInterval(double low, double high);
// A whole number from `low` to `high`, both included.
CLI::Validator WholeNumberFromTo(long long low, long long high);
// A winding temperature [degC]: finite and above −234.5 °C, where the copper
// law R(θ) = R_ref·(k + θ)/(k + θ_ref) reaches zero (units::kCopperTemperatureConstant_degC).
CLI::Validator WindingTemperature();

}  // namespace coilspin::cli
