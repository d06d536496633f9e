#pragma once
// Unit slips that make a datasheet's Kt/Ke differ from 1: a figure written in
// one unit but meant in another (mN·m/A as N·m/A: ×1000; V/rpm as V·s/rad:
// ×60/(2π)), or a decimal point in the wrong place (a power of ten).
//
// A figure x written in unit w but meant in unit m is read as x·f_w instead of
// x·f_m (f: factor to SI). A torque constant read so scales Kt/Ke by f_w/f_m;
// a back-EMF constant by f_m/f_w; a speed constant (Ke = 1/Kv) by f_w/f_m.
// Only units of the same kind as the figure are tried, with w the unit the
// figure was given in, since that is the unit a datasheet would have misprinted.

#include <string>
#include <vector>

#include "src/check/mismatch_factor.h"
#include "src/units/compound_units.h"

namespace coilspin::check {

// Candidates for a torque constant `kt` and a back-EMF or speed constant `ke`,
// equal factors joined.
std::vector<MismatchFactor> UnitSlipFactors(const units::MotorConstant& kt, const units::MotorConstant& ke);

// The slips of one figure of any kind, written in a unit of factor f_w (to SI)
// but meant in another of `same_kind` (one per distinct factor): the figure as
// read is f_w/f_m times the one meant. Units with the same factor as the
// written one (synonyms) are left out.
struct FigureSlip {
  std::string meant_unit;
  double read_over_meant = 1.0;  // f_w/f_m
};
std::vector<FigureSlip> FigureUnitSlips(double written_factor_to_si,
                                        const std::vector<units::CompoundUnitFactor>& same_kind);

// The decimal slips tried: 10^k for k = ±1 … ±6 (a misplaced decimal point or SI prefix).
std::vector<int> DecimalSlipExponents();

}  // namespace coilspin::check
