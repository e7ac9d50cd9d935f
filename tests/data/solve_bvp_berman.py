#!/usr/bin/python3
"""Produce a submission CSV with SciPy's general-purpose collocation BVP solver
(scipy.integrate.solve_bvp, Debian package python3-scipy). NOT part of porecert and not run in CI:
its output tests/data/scipy_solve_bvp_R10.csv is committed, and tests/test_import.cpp imports and
certifies it. Re-generate with (Debian python3):  /usr/bin/python3 tests/data/solve_bvp_berman.py 10 > tests/data/scipy_solve_bvp_R10.csv

Berman's half-channel problem f'''' + R (f' f'' - f f''') = 0, f(0) = 0, f''(0) = 0, f(1) = 1,
f'(1) = 0, as the first-order system y = (f, f', f'', f''').
"""
import sys

import numpy as np
import scipy
from scipy.integrate import solve_bvp

R = float(sys.argv[1]) if len(sys.argv) > 1 else 10.0


def rhs(x, y):
    f, f1, f2, f3 = y
    return np.vstack([f1, f2, f3, -R * (f1 * f2 - f * f3)])


def bc(ya, yb):
    return np.array([ya[0], ya[2], yb[0] - 1.0, yb[1]])


x = np.linspace(0.0, 1.0, 11)
y0 = np.vstack([(3 * x - x**3) / 2, 1.5 * (1 - x**2), -3 * x, -3 + 0 * x])  # the R = 0 profile
sol = solve_bvp(rhs, bc, x, y0, tol=1e-6, max_nodes=10000)
if not sol.success:
    sys.exit("solve_bvp failed: " + sol.message)
print(f"# scipy {scipy.__version__} solve_bvp, R = {R}, tol = 1e-6, {len(sol.x)} mesh nodes (its own mesh)")
print("x,f,f',f'',f'''")
for i, xi in enumerate(sol.x):
    print(",".join(repr(float(v)) for v in [xi, *sol.y[:, i]]))
