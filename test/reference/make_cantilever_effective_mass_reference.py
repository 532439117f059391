"""Effective-mass fractions of a uniform Euler-Bernoulli cantilever (clamped-free), for
test/model/participation.test.ts.

Mode shapes (standard result, e.g. Blevins, Formulas for Natural Frequency and Mode Shape,
Table 8-1, clamped-free):
    phi(x) = cosh(bx) - cos(bx) - s (sinh(bx) - sin(bx)),  s = (cosh bL + cos bL)/(sinh bL + sin bL)
with cos(bL) cosh(bL) = -1. For base translation the effective mass fraction of mode i is
    (int_0^L phi dx)^2 / (L int_0^L phi^2 dx)    (uniform mass per length).
Run: python3 test/reference/make_cantilever_effective_mass_reference.py
"""
import numpy as np
from scipy.integrate import quad
from scipy.optimize import brentq

roots = [brentq(lambda b: np.cos(b) * np.cosh(b) + 1, a, a + 1.5) for a in (1.0, 4.0, 7.0, 10.5)]
fractions = []
for b in roots:
    s = (np.cosh(b) + np.cos(b)) / (np.sinh(b) + np.sin(b))
    phi = lambda x: np.cosh(b * x) - np.cos(b * x) - s * (np.sinh(b * x) - np.sin(b * x))
    first = quad(phi, 0, 1, epsabs=1e-13, epsrel=1e-12)[0]
    second = quad(lambda x: phi(x) ** 2, 0, 1, epsabs=1e-13, epsrel=1e-12)[0]
    fractions.append(first ** 2 / second)
print("roots", [f"{r:.8f}" for r in roots])
print("fractions", [f"{f:.8f}" for f in fractions])
