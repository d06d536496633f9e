#!/usr/bin/env python3
"""Independent profile-likelihood interval with SciPy (outside reference).

Model y = a·exp(−k·x), residual r = y − a·exp(−k·x), one group, unknown σ.
Full fit by scipy.optimize.least_squares (method 'lm', xtol = ftol = gtol =
1e-15); s² = RSS/(n − 2), se from s²·(JᵀJ)⁻¹, t = scipy.stats.t.ppf((1+c)/2, n − 2).
Profile of k: for k held, a by least_squares; D(k) = (S(k) − S_min)/s²; the
interval ends solve D(k) = t² (scipy.optimize.brentq, xtol 1e-14), bracketed
by stepping out from k̂ ± t·se, doubling the distance.

Usage: scipy_profile.py DATA CONFIDENCE
DATA: lines "x y". Prints "k_hat se low high" (17 significant digits).
"""

import sys

import numpy as np
from scipy import optimize, stats


def residuals(a, k, x, y):
    return y - a * np.exp(-k * x)


def main():
    data = np.loadtxt(sys.argv[1])
    confidence = float(sys.argv[2])
    x, y = data[:, 0], data[:, 1]
    n = len(x)
    tight = dict(method="lm", xtol=1e-15, ftol=1e-15, gtol=1e-15)
    full = optimize.least_squares(lambda p: residuals(p[0], p[1], x, y), [1.0, 1.0], **tight)
    a_hat, k_hat = full.x
    s_min = float(np.sum(full.fun ** 2))
    s2 = s_min / (n - 2)
    cov = s2 * np.linalg.inv(full.jac.T @ full.jac)
    se = float(np.sqrt(cov[1, 1]))
    t = float(stats.t.ppf(0.5 * (1.0 + confidence), n - 2))

    def excess(k):
        fit = optimize.least_squares(lambda p: residuals(p[0], k, x, y), [a_hat], **tight)
        return float(np.sum(fit.fun ** 2) - s_min) / s2 - t * t

    ends = []
    for direction in (-1.0, 1.0):
        distance = t * se
        while excess(k_hat + direction * distance) < 0.0:
            distance *= 2.0
        ends.append(optimize.brentq(excess, k_hat, k_hat + direction * distance, xtol=1e-14))
    print("%.17g %.17g %.17g %.17g" % (k_hat, se, ends[0], ends[1]))


if __name__ == "__main__":
    main()
