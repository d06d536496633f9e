#!/usr/bin/env python3
"""Independent fit of a locked-rotor step log with SciPy (outside reference).

Model (the exact zero-order-hold discretisation of L·di/dt = v − R·i − Vb·sgn,
with the logged terminal voltage v held over each sample interval):
    î_0 = i0
    a_k = exp(−(t_{k+1} − t_k)·R/L)
    u_k = v_k − Vb·sgn(v_k)  if |v_k| > Vb,  else 0
    î_{k+1} = a_k·î_k + (1 − a_k)·u_k/R              k = 0 … N−2
    r_k = i_k − î_k                                   k = 0 … N−1
Parameters R, L, i0 by scipy.optimize.least_squares (method 'lm',
xtol = ftol = gtol = 1e-15, x_scale = the starting values), with the Jacobian
of î propagated exactly through the recursion. Standard errors from
cov = s²·(JᵀJ)⁻¹, s² = RSS/(N − 3), J = res.jac.

Usage:
    scipy_step_fit.py LOG.csv --brush-drop VB --resistance R0 --inductance L0
LOG.csv: a header row "time [s],voltage [V],current [A]" (other columns are
ignored, "# ..." lines skipped), then numbers. Prints JSON on stdout:
    {"resistance": {"value": …, "std_error": …}, "inductance": {…},
     "initial_current": {…}, "rss": …, "dof": …, "status": …, "message": …}
Exit status 2 on unusable input, 1 when the fit fails.
"""

import argparse
import csv
import json
import math
import sys

import numpy as np
from scipy.optimize import least_squares

TOLERANCE = 1e-15          # xtol, ftol and gtol of the Levenberg–Marquardt solve
NUM_PARAMETERS = 3         # R, L, i0
REQUIRED_COLUMNS = ("time [s]", "voltage [V]", "current [A]")
EXIT_BAD_INPUT = 2
EXIT_FIT_FAILED = 1
INITIAL_CURRENT_SCALE_A = 1.0  # x_scale for i0 when its start (0 A) gives no magnitude


def read_log(path):
    with open(path, newline="") as handle:
        rows = [row for row in csv.reader(handle) if row and not row[0].startswith("#")]
    if not rows:
        raise ValueError(f"{path}: no header row")
    header = [cell.strip() for cell in rows[0]]
    try:
        columns = [header.index(name) for name in REQUIRED_COLUMNS]
    except ValueError:
        raise ValueError(f"{path}: header must hold {', '.join(REQUIRED_COLUMNS)}; got {header}")
    data = np.array([[float(row[c]) for c in columns] for row in rows[1:]], dtype=float)
    if data.shape[0] <= NUM_PARAMETERS:
        raise ValueError(f"{path}: {data.shape[0]} samples, need more than {NUM_PARAMETERS}")
    if not np.all(np.diff(data[:, 0]) > 0):
        raise ValueError(f"{path}: time is not strictly increasing")
    return data[:, 0], data[:, 1], data[:, 2]


def drive(voltage, brush_drop):
    """u_k = v_k − Vb·sgn(v_k) if |v_k| > Vb, else 0."""
    return np.where(np.abs(voltage) > brush_drop, voltage - brush_drop * np.sign(voltage), 0.0)


def simulate(theta, dt, u):
    """î_k and ∂î_k/∂(R, L, i0) for k = 0 … N−1."""
    resistance, inductance, initial_current = theta
    a = np.exp(-dt * resistance / inductance)
    da_dr = -dt / inductance * a                       # ∂a/∂R
    da_dl = dt * resistance / inductance ** 2 * a      # ∂a/∂L
    n = dt.size + 1
    current = np.empty(n)
    sensitivity = np.empty((n, NUM_PARAMETERS))
    i_hat, d_r, d_l, d_i0 = initial_current, 0.0, 0.0, 1.0
    current[0] = i_hat
    sensitivity[0] = (d_r, d_l, d_i0)
    for k in range(n - 1):
        target = u[k] / resistance                     # u/R
        # î_{k+1} = a·î + (1 − a)·u/R
        next_i = a[k] * i_hat + (1.0 - a[k]) * target
        d_r = da_dr[k] * (i_hat - target) + a[k] * d_r - (1.0 - a[k]) * target / resistance
        d_l = da_dl[k] * (i_hat - target) + a[k] * d_l
        d_i0 = a[k] * d_i0
        i_hat = next_i
        current[k + 1] = i_hat
        sensitivity[k + 1] = (d_r, d_l, d_i0)
    return current, sensitivity


def fit(time, voltage, current, brush_drop, resistance0, inductance0):
    dt = np.diff(time)
    u = drive(voltage[:-1], brush_drop)

    def residuals(theta):
        return current - simulate(theta, dt, u)[0]     # r_k = i_k − î_k

    def jacobian(theta):
        return -simulate(theta, dt, u)[1]

    start = np.array([resistance0, inductance0, current[0]])
    scale = np.array([resistance0, inductance0,
                      abs(current[0]) if current[0] != 0.0 else INITIAL_CURRENT_SCALE_A])
    result = least_squares(residuals, start, jac=jacobian, method="lm", x_scale=scale,
                           xtol=TOLERANCE, ftol=TOLERANCE, gtol=TOLERANCE)
    rss = float(result.fun @ result.fun)
    dof = current.size - NUM_PARAMETERS
    variance = rss / dof                                   # s² = RSS/(N − 3)
    covariance = variance * np.linalg.inv(result.jac.T @ result.jac)   # s²·(JᵀJ)⁻¹
    std_error = np.sqrt(np.diag(covariance))
    names = ("resistance", "inductance", "initial_current")
    report = {name: {"value": float(value), "std_error": float(error)}
              for name, value, error in zip(names, result.x, std_error)}
    report.update({"rss": rss, "dof": dof, "status": int(result.status),
                   "message": str(result.message)})
    return result.success, report


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("log")
    parser.add_argument("--brush-drop", type=float, required=True, help="Vb [V], held fixed")
    parser.add_argument("--resistance", type=float, required=True, help="starting R [ohm]")
    parser.add_argument("--inductance", type=float, required=True, help="starting L [H]")
    args = parser.parse_args()
    if not (args.resistance > 0 and args.inductance > 0 and args.brush_drop >= 0):
        print("starting R and L must be > 0 and Vb >= 0", file=sys.stderr)
        return EXIT_BAD_INPUT
    try:
        time, voltage, current = read_log(args.log)
    except (OSError, ValueError) as error:
        print(error, file=sys.stderr)
        return EXIT_BAD_INPUT
    try:
        success, report = fit(time, voltage, current, args.brush_drop, args.resistance,
                              args.inductance)
    except np.linalg.LinAlgError as error:
        print(f"fit failed: JᵀJ is singular ({error})", file=sys.stderr)
        return EXIT_FIT_FAILED
    print(json.dumps(report))
    if not success or not all(math.isfinite(report[name]["std_error"])
                              for name in ("resistance", "inductance", "initial_current")):
        print(f"fit failed: {report['message']}", file=sys.stderr)
        return EXIT_FIT_FAILED
    return 0


if __name__ == "__main__":
    sys.exit(main())
