#!/usr/bin/env python3
"""Locked-rotor current by numerical integration with SciPy (outside reference).

Integrates, with scipy.integrate.solve_ivp (DOP853, rtol 1e-10),
    L·di/dt = V_s − (R + R_s)·i − Vb·sgn(i)
for a supply V_s stepped through levels, each held for a whole number of
sample periods, starting from i(0) = I0. Brush drop, diode-like rule: the
drop opposes the current; a current flowing in direction d integrates
di/dt = (V_s − (R + R_s)·i − Vb·d)/L until it reaches zero (a terminal
event); from i = 0 no current is driven while |V_s| ≤ Vb, otherwise it starts
in the direction of V_s.

Usage:
    scipy_locked_rotor_sim.py --resistance R --inductance L --brush-drop VB
        --supply-resistance RS --sample-period DT --samples-per-level N
        --levels V1,V2,... [--initial-current I0]
Prints i(t_k), t_k = k·DT, k = 0 … N·len(levels) − 1, one value per line.
"""

import argparse
import sys

import numpy as np
from scipy.integrate import solve_ivp

RELATIVE_TOLERANCE = 1e-10
ABSOLUTE_TOLERANCE_FRACTION = 1e-13   # of the current scale below
CURRENT_SCALE_FLOOR_A = 1e-9          # keeps atol > 0 when every level and i(0) are 0
METHOD = "DOP853"
EXIT_BAD_INPUT = 2
EXIT_INTEGRATION_FAILED = 1


def direction(current, supply, brush_drop):
    if current > 0:
        return 1
    if current < 0:
        return -1
    if supply > brush_drop:
        return 1
    if supply < -brush_drop:
        return -1
    return 0


def integrate_level(current, supply, t_samples, circuit, atol):
    """Currents at t_samples (ascending; the first is the start of the level, the
    last its end) with the supply held at `supply` from i(t_samples[0]) = current."""
    loop_resistance, inductance, brush_drop = circuit
    values = np.zeros(t_samples.size)   # a current that stops stays 0
    t_now, filled = t_samples[0], 0
    while filled < t_samples.size:
        d = direction(current, supply, brush_drop)
        if d == 0:
            break

        def rhs(_t, i, d=d):
            # L·di/dt = V_s − (R + R_s)·i − Vb·d
            return [(supply - loop_resistance * i[0] - brush_drop * d) / inductance]

        def reaches_zero(_t, i):
            return i[0]
        reaches_zero.terminal = True
        reaches_zero.direction = -d

        solution = solve_ivp(rhs, (t_now, t_samples[-1]), [current], method=METHOD,
                             t_eval=t_samples[filled:], events=reaches_zero,
                             rtol=RELATIVE_TOLERANCE, atol=atol)
        if solution.status < 0:
            raise RuntimeError(solution.message)
        count = solution.t.size
        values[filled:filled + count] = solution.y[0]
        filled += count
        if solution.status != 1:          # reached the end of the level
            break
        t_now, current = float(solution.t_events[0][0]), 0.0   # the current reached zero
    return values


def simulate(args, levels):
    loop_resistance = args.resistance + args.supply_resistance
    circuit = (loop_resistance, args.inductance, args.brush_drop)
    scale = max(max(abs(v) for v in levels) / loop_resistance, abs(args.initial_current),
                CURRENT_SCALE_FLOOR_A)
    atol = ABSOLUTE_TOLERANCE_FRACTION * scale
    n = args.samples_per_level
    current, out = args.initial_current, []
    for level, supply in enumerate(levels):
        # samples of this level and the instant the next level starts
        t_samples = np.arange(level * n, (level + 1) * n + 1) * args.sample_period
        values = integrate_level(current, supply, t_samples, circuit, atol)
        out.extend(values[:-1])
        current = float(values[-1])
    return out


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--resistance", type=float, required=True, help="R [ohm]")
    parser.add_argument("--inductance", type=float, required=True, help="L [H]")
    parser.add_argument("--brush-drop", type=float, default=0.0, help="Vb [V]")
    parser.add_argument("--supply-resistance", type=float, default=0.0, help="R_s [ohm]")
    parser.add_argument("--sample-period", type=float, required=True, help="Δ [s]")
    parser.add_argument("--samples-per-level", type=int, required=True)
    parser.add_argument("--levels", required=True, help="V_s levels [V], comma separated")
    parser.add_argument("--initial-current", type=float, default=0.0, help="i(0) [A]")
    args = parser.parse_args()
    try:
        levels = [float(v) for v in args.levels.split(",")]
    except ValueError:
        print(f"--levels: not a list of numbers: {args.levels}", file=sys.stderr)
        return EXIT_BAD_INPUT
    if not (args.resistance + args.supply_resistance > 0 and args.inductance > 0
            and args.brush_drop >= 0 and args.sample_period > 0 and args.samples_per_level > 0):
        print("need R + R_s > 0, L > 0, Vb >= 0, sample period > 0, samples per level > 0",
              file=sys.stderr)
        return EXIT_BAD_INPUT
    try:
        currents = simulate(args, levels)
    except RuntimeError as error:
        print(f"solve_ivp failed: {error}", file=sys.stderr)
        return EXIT_INTEGRATION_FAILED
    sys.stdout.write("".join(f"{value!r}\n" for value in map(float, currents)))
    return 0


if __name__ == "__main__":
    sys.exit(main())
