#!/usr/bin/env python3
"""Checks a `coilspin export --format state-space` file with SciPy (Debian python3-scipy).

Usage: state_space_check.py RESULT.json STATE_SPACE.json

A free-shaft voltage step from V/2 to V, the motor running steadily at V/2 before
(so that current and speed stay positive: sgn = +1 throughout and the sign terms
are the constant offsets the file names), simulated two ways:
  1. scipy.signal.lsim on the exported (A, B, C, D) with the offsets applied as the
     file says (u_eff = u + coefficient*value*sgn(state));
  2. scipy.integrate.solve_ivp on the motor's equations written here from the
     result's parameters (docs/methods.md section 1):
       L di/dt = v - R i - Ke w - Vb sgn(i),   J dw/dt = Kt i - B w - Tc sgn(w).
Both must agree to 1e-6 of the final values, and the final values must be
coilspin's own no-load speed and current at that voltage (result's `derived`) to
1e-6. Prints the figures; exits 1 on a mismatch.
"""
import json
import sys

import numpy as np
from scipy import integrate, signal


def main():
    result = json.load(open(sys.argv[1]))
    ss = json.load(open(sys.argv[2]))
    assert ss["format"] == "coilspin.state-space/1", ss["format"]
    assert ss["states"] == ["current", "speed"] and ss["inputs"] == ["voltage", "load_torque"]
    p = {k: v["value"] for k, v in result["parameters"].items()}
    r, l, ke, kt, j = p["resistance"], p["inductance"], p["back_emf_constant"], p["torque_constant"], p["inertia"]
    b, tc, vb = p.get("viscous_friction", 0.0), p.get("coulomb_friction", 0.0), p.get("brush_drop", 0.0)
    v = result["derived"]["no_load_speed"]["at_voltage"]

    # 1. lsim on the export.
    u_step = np.array([v, 0.0])
    offset = np.zeros(2)
    sign_of = {"current": 1.0, "speed": 1.0}  # both positive after the step
    for off in ss["offsets"].values():
        offset[ss["inputs"].index(off["input"])] += off["coefficient"] * off["value"] * sign_of[off["sign_of"]]
    system = signal.StateSpace(np.array(ss["A"]), np.array(ss["B"]), np.array(ss["C"]), np.array(ss["D"]))
    tau_m = r * j / (kt * ke)
    t = np.linspace(0.0, 20.0 * tau_m, 40001)  # e^-20 of the slow mode left: final = steady state
    # Running steadily at v/2 (the equations below with d/dt = 0).
    w0 = (kt * (v / 2 - vb) / r - tc) / (kt * ke / r + b)
    x0 = [(b * w0 + tc) / kt, w0]
    assert min(x0) > 0
    u = np.tile(u_step + offset, (t.size, 1))
    _, y, _ = signal.lsim(system, u, t, X0=x0)

    # 2. The equations, integrated on their own.
    def motor(_, x):
        i, w = x
        return [(v - r * i - ke * w - vb * np.sign(i)) / l, (kt * i - b * w - tc * np.sign(w)) / j]

    ode = integrate.solve_ivp(motor, (t[0], t[-1]), x0, t_eval=t, method="LSODA", rtol=1e-10, atol=1e-12)
    assert ode.success and np.all(ode.y > 0), "current and speed stay positive"
    scale = np.array([abs(y[-1, 0]), abs(y[-1, 1])])
    worst = np.max(np.abs(y - ode.y.T) / scale, axis=0)
    i_nl = result["derived"]["no_load_current"]["value"]
    w_nl = result["derived"]["no_load_speed"]["value"]
    print(f"lsim vs equations: worst difference {worst[0]:.2e} (current), {worst[1]:.2e} (speed) of final value")
    print(f"final: current {y[-1, 0]:.9g} A (coilspin no-load {i_nl:.9g}), speed {y[-1, 1]:.9g} rad/s "
          f"(coilspin no-load {w_nl:.9g})")
    ok = worst.max() < 1e-6 and abs(y[-1, 0] / i_nl - 1) < 1e-6 and abs(y[-1, 1] / w_nl - 1) < 1e-6
    return 0 if ok else 1


if __name__ == "__main__":
    sys.exit(main())
