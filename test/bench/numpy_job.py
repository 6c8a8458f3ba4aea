"""The comparison job for `npm run bench`: what `roundwise analyze --json` does, written the way a numpy user would.

Reads a table in the labelled-matrix layout written by the bench (label column, n sector columns, household
consumption, other final demand, total output; then labour income, other value added, imports, employment and
total input rows), inverts the open system I - A and the household-closed system, computes the multipliers and
linkages and the Perron root of A (power iteration until the Collatz-Wielandt bounds agree to 1e-12, as
src/model/perron.ts stops), and prints them as one JSON object. Usage: python3 numpy_job.py TABLE.csv
"""
import json
import sys

import numpy as np

path = sys.argv[1]
with open(path, encoding="utf-8") as f:
    header = f.readline().rstrip("\n").split(",")
n = len(header) - 4  # label, sectors..., households, other final demand, total output

block = np.loadtxt(path, delimiter=",", skiprows=1, max_rows=n, usecols=range(1, n + 4), quotechar='"')
Z, hc, x = block[:, :n], block[:, n], block[:, n + 2]
extra = np.loadtxt(path, delimiter=",", skiprows=1 + n, max_rows=4, usecols=range(1, n + 1), quotechar='"')
labour, other_va, imports, jobs = extra

A = Z / x
h = labour / x
e = jobs / x
va = (labour + other_va) / x
L = np.linalg.inv(np.eye(n) - A)

xh = labour.sum()
Abar = np.zeros((n + 1, n + 1))
Abar[:n, :n] = A
Abar[n, :n] = h
Abar[:n, n] = hc / xh
Lbar = np.linalg.inv(np.eye(n + 1) - Abar)
Lb = Lbar[:n, :n]

inc_simple = h @ L
inc_total = Lbar[n, :n]
emp_simple = e @ L
emp_total = e @ Lb
total = L.sum()

v = np.ones(n)
lower, upper = 0.0, np.inf
for _ in range(2000):
    av = A @ v
    ratios = av / v
    lower, upper = max(lower, ratios.min()), min(upper, ratios.max())
    if upper - lower <= 1e-12 * upper:
        break
    v = av / av.max()

out = {
    "sectors": header[1:n + 1],
    "multipliers": {
        "output": {"typeI": L.sum(axis=0).tolist(), "typeII": Lb.sum(axis=0).tolist()},
        "income": {"simple": inc_simple.tolist(), "typeI": (inc_simple / h).tolist(), "total": inc_total.tolist(), "typeII": (inc_total / h).tolist()},
        "employment": {"simple": emp_simple.tolist(), "typeI": (emp_simple / e).tolist(), "total": emp_total.tolist(), "typeII": (emp_total / e).tolist()},
        "valueAdded": {"simple": (va @ L).tolist(), "total": (va @ Lb).tolist()},
    },
    "viability": {"perronRoot": (lower + upper) / 2},
    "linkages": {"backward": (n * L.sum(axis=0) / total).tolist(), "forward": (n * L.sum(axis=1) / total).tolist()},
}
json.dump(out, sys.stdout)
