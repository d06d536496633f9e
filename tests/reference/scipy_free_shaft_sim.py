#!/usr/bin/env python3
"""Free-shaft motor by numerical integration with SciPy (outside reference).

Integrates, with scipy.integrate.solve_ivp (DOP853, rtol 1e-10),
    L·di/dt = V_s − (R + R_s)·i − Ke·ω − Vb·sgn(i)
    J·dω/dt = Kt·i − B·ω − Tc·sgn(ω) − τ_load
    dθ/dt  = ω
through segments of whole sample periods. A segment either connects a
source V_s behind R_s (a braking resistor is V_s = 0, R_s = R_brake) or
leaves the terminals open (i = 0 from the segment's start). The motor starts
at rest, i = ω = θ = 0.

Switching rules (terminal events end each smooth stretch):
  brushes: a current flowing in direction d integrates with sgn(i) = d until
    it reaches zero; at i = 0 with u = V_s − Ke·ω it stays 0 while |u| ≤ Vb and
    starts in the direction of u when |u| passes Vb;
  stiction: a rotor turning in direction d integrates with sgn(ω) = d until
    ω reaches zero; at ω = 0 with τ_d = Kt·i − τ_load it stays at rest while
    |τ_d| ≤ Tc and starts in the direction of τ_d when |τ_d| passes Tc.
Vb = 0 (Tc = 0) removes the sign term and its events.

Usage:
    scipy_free_shaft_sim.py --resistance R --inductance L --back-emf-constant KE
        --torque-constant KT --inertia J [--viscous-friction B]
        [--coulomb-friction TC] [--brush-drop VB] [--load-torque TL]
        --sample-period DT --segment supply:V:RS:N | open:N  [--segment ...]
Prints one line per sample t_k = k·DT: "i ω θ".
"""

import argparse
import sys

import numpy as np
from scipy.integrate import solve_ivp

RELATIVE_TOLERANCE = 1e-10
ABSOLUTE_TOLERANCE_FRACTION = 1e-13   # of each component's scale below
SCALE_FLOOR = 1e-9                    # keeps atol > 0 when a scale is 0
METHOD = "DOP853"
EXIT_BAD_INPUT = 2
EXIT_INTEGRATION_FAILED = 1

FREE, HELD = "free", "held"           # branches besides the directions +1 and −1


class Segment:
    def __init__(self, text):
        fields = text.split(":")
        if fields[0] == "open" and len(fields) == 2:
            self.open, self.supply, self.resistance = True, 0.0, 0.0
        elif fields[0] == "supply" and len(fields) == 4:
            self.open, self.supply, self.resistance = False, float(fields[1]), float(fields[2])
        else:
            raise ValueError(f"--segment expects supply:V:RS:N or open:N, got {text}")
        self.samples = int(fields[-1])


def branch_of(value, drive, threshold):
    """Direction of a variable with a sign term, or HELD at zero."""
    if value > 0:
        return 1
    if value < 0:
        return -1
    if drive > threshold:
        return 1
    if drive < -threshold:
        return -1
    return HELD


def sign(branch):
    return branch if branch in (1, -1) else 0


class Model:
    def __init__(self, args, segment):
        self.a, self.s = args, segment

    def current_drive(self, y):           # u = V_s − Ke·ω
        return self.s.supply - self.a.back_emf_constant * y[1]

    def drive_torque(self, y):            # τ_d = Kt·i − τ_load
        return self.a.torque_constant * y[0] - self.a.load_torque

    def current_branch(self, y):
        if self.s.open:
            return HELD
        if self.a.brush_drop == 0:
            return FREE
        return branch_of(y[0], self.current_drive(y), self.a.brush_drop)

    def speed_branch(self, y):
        if self.a.coulomb_friction == 0:
            return FREE
        return branch_of(y[1], self.drive_torque(y), self.a.coulomb_friction)

    def rhs(self, branches):
        a, s = self.a, self.s
        loop = a.resistance + s.resistance
        current, speed = branches

        def f(_t, y):
            di = 0.0 if current == HELD else (
                s.supply - loop * y[0] - a.back_emf_constant * y[1] - a.brush_drop * sign(current)
            ) / a.inductance
            dw = 0.0 if speed == HELD else (
                self.drive_torque(y) - a.viscous_friction * y[1]
                - a.coulomb_friction * sign(speed)
            ) / a.inertia
            return [di, dw, y[1]]
        return f

    def events(self, branches):
        """Terminal events, each with what happens when it fires."""
        current, speed = branches
        found = []

        def event(function, direction, action):
            function.terminal = True
            function.direction = direction
            found.append((function, action))

        if current in (1, -1):
            event(lambda _t, y: y[0], -current, ("current", "zero"))
        elif current == HELD and not self.s.open:
            vb = self.a.brush_drop
            event(lambda _t, y: self.current_drive(y) - vb, 1, ("current", 1))
            event(lambda _t, y: self.current_drive(y) + vb, -1, ("current", -1))
        if speed in (1, -1):
            event(lambda _t, y: y[1], -speed, ("speed", "zero"))
        elif speed == HELD:
            tc = self.a.coulomb_friction
            event(lambda _t, y: self.drive_torque(y) - tc, 1, ("speed", 1))
            event(lambda _t, y: self.drive_torque(y) + tc, -1, ("speed", -1))
        return found


def integrate_segment(y, model, t_samples, atol):
    """States at t_samples (the segment's sample instants and the next segment's start)."""
    out = np.zeros((t_samples.size, 3))
    if model.s.open:
        y[0] = 0.0
    branches = [model.current_branch(y), model.speed_branch(y)]
    t_now, filled = t_samples[0], 0
    while filled < t_samples.size:
        events = model.events(branches)
        solution = solve_ivp(model.rhs(tuple(branches)), (t_now, t_samples[-1]), y, method=METHOD,
                             t_eval=t_samples[filled:], events=[e for e, _ in events] or None,
                             rtol=RELATIVE_TOLERANCE, atol=atol)
        if solution.status < 0:
            raise RuntimeError(solution.message)
        count = len(solution.t)           # an empty list when no sample preceded the event
        if count > 0:
            out[filled:filled + count] = np.asarray(solution.y).T
        filled += count
        if solution.status != 1:
            break
        fired = [n for n, times in enumerate(solution.t_events) if times.size > 0][0]
        t_now = float(solution.t_events[fired][0])
        y = np.array(solution.y_events[fired][0], dtype=float)
        variable, outcome = events[fired][1]
        index = 0 if variable == "current" else 1
        if outcome == "zero":             # reached zero: the rule decides from rest
            y[index] = 0.0
            branches[index] = model.current_branch(y) if index == 0 else model.speed_branch(y)
        else:                             # the drive passed its threshold: starts moving
            branches[index] = outcome
    return out


def simulate(args, segments):
    peak_supply = max([abs(s.supply) for s in segments] + [0.0])
    current_scale = max(peak_supply / args.resistance, SCALE_FLOOR)
    speed_scale = max(peak_supply / args.back_emf_constant, SCALE_FLOOR)
    total_time = args.sample_period * sum(s.samples for s in segments)
    atol = ABSOLUTE_TOLERANCE_FRACTION * np.array(
        [current_scale, speed_scale, max(speed_scale * total_time, SCALE_FLOOR)])
    y = np.zeros(3)
    rows, k = [], 0
    for segment in segments:
        t_samples = np.arange(k, k + segment.samples + 1) * args.sample_period
        states = integrate_segment(y.copy(), Model(args, segment), t_samples, atol)
        rows.extend(states[:-1])
        y = states[-1].copy()
        k += segment.samples
    return rows


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    for name, unit in (("resistance", "ohm"), ("inductance", "H"),
                       ("back-emf-constant", "V*s/rad"), ("torque-constant", "N*m/A"),
                       ("inertia", "kg*m^2"), ("sample-period", "s")):
        parser.add_argument("--" + name, type=float, required=True, help=unit)
    for name, unit in (("viscous-friction", "N*m*s/rad"), ("coulomb-friction", "N*m"),
                       ("brush-drop", "V"), ("load-torque", "N*m")):
        parser.add_argument("--" + name, type=float, default=0.0, help=unit)
    parser.add_argument("--segment", action="append", required=True,
                        help="supply:V:RS:N or open:N")
    args = parser.parse_args()
    try:
        segments = [Segment(text) for text in args.segment]
    except ValueError as error:
        print(error, file=sys.stderr)
        return EXIT_BAD_INPUT
    if not (args.resistance > 0 and args.inductance > 0 and args.back_emf_constant > 0
            and args.torque_constant > 0 and args.inertia > 0 and args.sample_period > 0
            and min(args.viscous_friction, args.coulomb_friction, args.brush_drop) >= 0
            and all(s.samples > 0 and s.resistance >= 0 for s in segments)):
        print("need R, L, Ke, Kt, J, sample period > 0; B, Tc, Vb, R_s >= 0; samples > 0",
              file=sys.stderr)
        return EXIT_BAD_INPUT
    try:
        rows = simulate(args, segments)
    except RuntimeError as error:
        print(f"solve_ivp failed: {error}", file=sys.stderr)
        return EXIT_INTEGRATION_FAILED
    sys.stdout.write("".join(f"{float(i)!r} {float(w)!r} {float(th)!r}\n" for i, w, th in rows))
    return 0


if __name__ == "__main__":
    sys.exit(main())
