#!/usr/bin/python3
"""Reference values for policies/network/in_stock_calibration.test.cpp.

The plain fit is a binomial GLM with a probit link on the covariate Phi^-1(expected), fitted by
statsmodels; the fit with a normal prior on the slope maximises the penalised log-likelihood with
scipy.optimize (BFGS). Run: /usr/bin/python3 tests/reference/probit_calibration.py
"""
import numpy as np
import statsmodels.api as sm
from scipy import optimize, stats

expected = np.array([0.30, 0.50, 0.70, 0.90])
open_days = np.array([200, 300, 250, 400])
in_stock = np.array([50, 120, 150, 330])

z = stats.norm.ppf(expected)
exog = sm.add_constant(z)
endog = np.column_stack([in_stock, open_days - in_stock])
glm = sm.GLM(endog, exog, family=sm.families.Binomial(link=sm.families.links.probit()))
res = glm.fit(tol=1e-12)
print("glm shift %.9f slope %.9f" % tuple(res.params))


def penalised(theta, slope_sd):
    a, b = theta
    p = np.clip(stats.norm.cdf(a + b * z), 1e-12, 1 - 1e-12)
    ll = np.sum(in_stock * np.log(p) + (open_days - in_stock) * np.log1p(-p))
    return -(ll - 0.5 * (b - 1.0) ** 2 / slope_sd**2)


for sd in (0.1,):
    r = optimize.minimize(penalised, [0.0, 1.0], args=(sd,), method="BFGS", options={"gtol": 1e-10})
    print("prior sd %.2f shift %.9f slope %.9f" % (sd, r.x[0], r.x[1]))

# One expected probability only (every group at one level): the prior fixes the slope near 1.
one = np.array([0.75])
n1 = np.array([1000])
y1 = np.array([700])
z1 = stats.norm.ppf(one)


def penalised1(theta, slope_sd):
    a, b = theta
    p = np.clip(stats.norm.cdf(a + b * z1), 1e-12, 1 - 1e-12)
    ll = np.sum(y1 * np.log(p) + (n1 - y1) * np.log1p(-p))
    return -(ll - 0.5 * (b - 1.0) ** 2 / slope_sd**2)


r = optimize.minimize(penalised1, [0.0, 1.0], args=(0.1,), method="BFGS", options={"gtol": 1e-10})
print("one level: shift %.9f slope %.9f calibrated %.9f" % (r.x[0], r.x[1],
      stats.norm.cdf(r.x[0] + r.x[1] * z1[0])))
