#pragma once
// Brushless (three-phase) datasheets quote Kt and Ke under several conventions;
// mixing two of them makes Kt/Ke differ from 1 by factors of √3, √2 and 3/2.
//
// Model: a star-connected winding with sinusoidal back-EMF, phase a's EMF
// e_a = k_ph·ω·sin θ (k_ph: phase EMF amplitude per rad/s), balanced sinusoidal
// currents of amplitude Î in phase with the EMFs. Then (physics):
//   Ke per phase, peak volts          k_ph
//   Ke per phase, rms volts           k_ph/√2            (sinusoid: peak = √2·rms)
//   Ke line-to-line, peak volts       √3·k_ph            (star: |e_a − e_b| = √3·|e_a|)
//   Ke line-to-line, rms volts        √(3/2)·k_ph
//   Kt per phase                      k_ph               (one phase as a DC machine: τ_a = e_a·i_a/ω)
//   Kt per phase, per ampere rms      k_ph/√2            (a third of the machine's, below)
//   Kt of the machine, per A peak     (3/2)·k_ph         (T·ω = Σ e·i = (3/2)·k_ph·ω·Î, Σ sin² = 3/2)
//   Kt of the machine, per A rms      (3/√2)·k_ph        (Î = √2·I_rms)
// These agree with references.md: Kt per A peak = (√3/2)·Ke_LL,pk and
// Kt per A rms = √3·Ke_LL,rms. Two pairs give Kt/Ke = 1 (per phase with phase
// peak; per phase per A rms with phase rms); every other pair gives the factor
// listed here, e.g. Ke line-to-line peak with Kt per phase: Kt/Ke = 1/√3.

#include <vector>

#include "src/check/mismatch_factor.h"

namespace coilspin::check {

// Every Kt/Ke ≠ 1 that a pair of the conventions above produces, pairs with the
// same factor joined; plus, for a factor whose reciprocal no pair produces, that
// reciprocal, explained as the two constants carrying each other's conventions.
const std::vector<MismatchFactor>& WindingConventionFactors();

}  // namespace coilspin::check
