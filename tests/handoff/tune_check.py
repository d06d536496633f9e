#!/usr/bin/env python3
"""Checks a `coilspin tune --json` file against the textbook rules and SciPy (Debian python3-scipy).

Usage: tune_check.py RESULT.json TUNING.json

1. Gains from the rules, written here from their sources:
   current loop, pole-zero cancellation of the winding (kp/ki = L/R) for the
   closed loop 1/(s/wc + 1): kp = L*wc, ki = R*wc (from memory; e.g. Mohan,
   "Electric Drives", the current-loop design of a DC drive);
   speed loop, SIMC (Skogestad 2003, J. Process Control 13:291-309, from memory):
   first-order process k/(tau1 s + 1) with k = Kt/B, tau1 = J/B, the closed current
   loop a lag tau2 = 1/wc moved by the half rule into theta = tau2/2 and
   tau1' = tau1 + tau2/2; Kc = tau1'/(k (tauc + theta)), tauI = min(tau1', 4 (tauc + theta)),
   tauc = 1/ws; parallel form kp = Kc, ki = Kc/tauI. Agreement to 1e-9.
2. Phase margins from scipy.signal.freqresp of the open loops built here from the
   parameters (back-EMF coupling included), phase unwrapped from low frequency:
   agreement with the file to 0.05 degrees.
3. Closed-loop steps with scipy.signal.lsim:
   a. current loop, shaft locked: i(1/wc) = 1 - e^-1 of the step, to 1 %
      (the design is exactly first order there);
   b. the cascade, shaft free: a speed step settles (error below 1 % after
      20 (tauc + theta): on a near-integrating process SIMC's PI puts a double
      pole near -1/(2 tauc), whose tail (1 + t/(2 tauc)) e^(-t/(2 tauc)) is 0.05 %
      there and 4 % at 10 tauc), its 63 % rise time within 30 % of tauc + theta (SIMC's
      target response e^(-theta s)/(tauc s + 1)), overshoot below 25 % (SIMC's
      PI on a near-integrating process overshoots a setpoint step by some
      15 %, from memory), every closed-loop pole in the left half-plane.
Prints the figures; exits 1 when a check fails.
"""
import json
import math
import sys

import numpy as np
from scipy import optimize, signal


def margin(num, den, w_design):
    """Crossover frequency and phase margin of the open loop num/den (polynomials in s)."""
    w = np.logspace(math.log10(w_design) - 4, math.log10(w_design) + 4, 8001)
    _, h = signal.freqresp(signal.TransferFunction(num, den), w)
    mag = np.abs(h)
    k = np.nonzero((mag[:-1] >= 1) & (mag[1:] < 1))[0][0]
    f = lambda lw: abs(signal.freqresp(signal.TransferFunction(num, den), [10 ** lw])[1][0]) - 1
    wx = 10 ** optimize.brentq(f, math.log10(w[k]), math.log10(w[k + 1]), xtol=1e-14)
    phase = np.unwrap(np.angle(h))
    # Branch: at low frequency the loop is c/s^m with c > 0 (m integrators), phase near -90 m degrees.
    m = (len(den) - len(np.trim_zeros(den, "b"))) - (len(num) - len(np.trim_zeros(num, "b")))
    phase += 2 * math.pi * round((-m * math.pi / 2 - phase[0]) / (2 * math.pi))
    ph = np.interp(math.log10(wx), np.log10(w), phase)
    return wx, 180.0 + math.degrees(ph)


def main():
    result = json.load(open(sys.argv[1]))
    tuning = json.load(open(sys.argv[2]))
    assert tuning["format"] == "coilspin.tuning/1"
    p = {k: v["value"] for k, v in result["parameters"].items()}
    r, l, ke, kt, j = p["resistance"], p["inductance"], p["back_emf_constant"], p["torque_constant"], p["inertia"]
    b = p.get("viscous_friction", 0.0)
    cl, sl = tuning["current_loop"], tuning["speed_loop"]
    wc, ws = 2 * math.pi * cl["bandwidth_hz"], 2 * math.pi * sl["bandwidth_hz"]
    failures = []

    def close(name, got, want, rel):
        ok = abs(got - want) <= rel * abs(want)
        print(f"{name}: coilspin {got:.10g}, reference {want:.10g}{'' if ok else '  <-- MISMATCH'}")
        if not ok:
            failures.append(name)

    # 1. Rules.
    kpi, kii = l * wc, r * wc
    tau2 = 1 / wc
    theta, tauc = tau2 / 2, 1 / ws
    tau1 = j / b + tau2 / 2 if b > 0 else math.inf
    if b > 0:
        kc = tau1 / ((kt / b) * (tauc + theta))  # Kc = tau1'/(k (tauc + theta)), as Skogestad writes it
    else:
        kc = 1 / ((kt / j) * (tauc + theta))  # integrating process k'/s, k' = Kt/J: Kc = 1/(k' (tauc + theta))
    tau_i = min(tau1, 4 * (tauc + theta))
    close("current kp [V/A]", cl["kp"]["value"], kpi, 1e-9)
    close("current ki [V/(A*s)]", cl["ki"]["value"], kii, 1e-9)
    close("speed kp [A*s/rad]", sl["kp"]["value"], kc, 1e-9)
    close("speed ki [A/rad]", sl["ki"]["value"], kc / tau_i, 1e-9)
    kps, kis = sl["kp"]["value"], sl["ki"]["value"]

    # 2. Phase margins. Current loop: (kp s + ki)/s * (J s + B)/((L s + R)(J s + B) + Kt Ke).
    num_i = np.polymul([kpi, kii], [j, b])
    den_i = np.polymul([1, 0], np.polyadd(np.polymul([l, r], [j, b]), [kt * ke]))
    _, pm_i = margin(num_i, den_i, wc)
    close("current-loop phase margin [deg]", cl["phase_margin_deg"], pm_i, 0.05 / pm_i)
    # Speed loop: C_s * C_i Kt / ((L s + R + C_i)(J s + B) + Kt Ke), multiplied through by s twice.
    num_s = np.polymul(np.polymul([kps, kis], [kpi, kii]), [kt])
    inner = np.polyadd(np.polyadd(np.polymul([1, 0], np.polymul([l, r + kpi], [j, b])), np.polymul([kii], [j, b])),
                       [kt * ke, 0])
    den_s = np.polymul([1, 0], inner)
    _, pm_s = margin(num_s, den_s, ws)
    close("speed-loop phase margin [deg]", sl["phase_margin_deg"], pm_s, 0.05 / pm_s)

    # 3a. Current loop, shaft locked: x = [i, z], z = integral of (i* - i).
    a = np.array([[-(r + kpi) / l, kii / l], [-1.0, 0.0]])
    bm = np.array([[kpi / l], [1.0]])
    t = np.linspace(0, 10 / wc, 10001)
    _, y, _ = signal.lsim(signal.StateSpace(a, bm, np.array([[1.0, 0.0]]), np.zeros((1, 1))), np.ones_like(t), t)
    i_tau = np.interp(1 / wc, t, y)
    close("locked-shaft current at t = 1/wc [of the step]", i_tau, 1 - math.exp(-1), 0.01)

    # 3b. The cascade, shaft free: x = [i, w, z_i, z_w]; i* = kps (w* - w) + kis z_w; v = kpi (i* - i) + kii z_i.
    a = np.array([
        [(-r - kpi) / l, (-ke - kpi * kps) / l, kii / l, kpi * kis / l],
        [kt / j, -b / j, 0.0, 0.0],
        [-1.0, -kps, 0.0, kis],
        [0.0, -1.0, 0.0, 0.0]])
    bm = np.array([[kpi * kps / l], [0.0], [kps], [1.0]])
    poles = np.linalg.eigvals(a)
    print(f"closed-loop poles: {', '.join(f'{z:.4g}' for z in poles)}")
    if not np.all(poles.real < 0):
        failures.append("closed-loop poles")
    target = tauc + theta
    t = np.linspace(0, 30 * target, 30001)
    _, y, _ = signal.lsim(signal.StateSpace(a, bm, np.array([[0.0, 1.0, 0.0, 0.0]]), np.zeros((1, 1))),
                          np.ones_like(t), t)
    rise = t[np.argmax(y >= 1 - math.exp(-1))]
    overshoot = y.max() - 1
    settled = np.max(np.abs(y[t >= 20 * target] - 1))
    print(f"speed step: 63 % rise {rise:.4g} s (SIMC target {target:.4g} s), overshoot {100 * overshoot:.3g} %, "
          f"largest error after 20 (tauc + theta) {100 * settled:.3g} %")
    if not (abs(rise / target - 1) < 0.3 and overshoot < 0.25 and settled < 0.01):
        failures.append("speed step")
    print("all checks passed" if not failures else f"FAILED: {', '.join(failures)}")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
