"""The comparison job for `roundwise scenario --paths`: the same scenario, written the way a numpy user would.

Reads the bench's table (as numpy_job.py does) and a shock file (sector,amount,kind,local_share,note; kinds
final-demand, output, jobs), inverts the open system I - A and the household-closed system I - Abar, solves the mixed
model (fixed-output sectors) in both, splits the effects into direct, indirect, induced and total for output, value
added, labour income and employment, runs the spending rounds until 99.9 % of the open-model output is covered (at most
200 rounds), and searches the structural paths to one sector in the household-closed model with the same rules as
src/scenario/paths.ts (at most 6 arcs, partial paths carrying less than 1e-4 of the destination's change dropped,
200 000 search steps, the 20 largest listed). Prints one JSON object. Usage:
    python3 numpy_scenario.py TABLE.csv SHOCK.csv DESTINATION
"""
import csv
import json
import sys

import numpy as np

path, shock_path, destination = sys.argv[1], sys.argv[2], sys.argv[3]
with open(path, encoding="utf-8") as f:
    header = f.readline().rstrip("\n").split(",")
n = len(header) - 4
sectors = header[1:n + 1]
block = np.loadtxt(path, delimiter=",", skiprows=1, max_rows=n, usecols=range(1, n + 4), quotechar='"')
Z, hc, x = block[:, :n], block[:, n], block[:, n + 2]
labour, other_va, imports, jobs = np.loadtxt(path, delimiter=",", skiprows=1 + n, max_rows=4, usecols=range(1, n + 1), quotechar='"')

A = Z / x
h = labour / x
e = jobs / x
va = h + other_va / x
L = np.linalg.inv(np.eye(n) - A)
Abar = np.zeros((n + 1, n + 1))
Abar[:n, :n] = A
Abar[n, :n] = h
Abar[:n, n] = hc / labour.sum()
Lbar = np.linalg.inv(np.eye(n + 1) - Abar)

index = {s: i for i, s in enumerate(sectors)}
df = np.zeros(n)
fixed = {}
with open(shock_path, encoding="utf-8") as f:
    for row in csv.DictReader(f):
        j = index[row["sector"]]
        kind = row.get("kind") or "final-demand"
        amount = float(row["amount"])
        if kind == "final-demand":
            df[j] += amount * float(row.get("local_share") or 1)
        else:
            fixed[j] = fixed.get(j, 0.0) + (amount / e[j] if kind == "jobs" else amount)
fix = np.array(sorted(fixed), dtype=int)
targets = np.array([fixed[j] for j in fix])


def mixed(Linv, f):
    """Mixed model on an explicit inverse: the fixed sectors get the extra final demand mu that meets their targets."""
    base = Linv @ f
    mu = np.linalg.solve(Linv[np.ix_(fix, fix)], targets - base[fix])
    out = base + Linv[:, fix] @ mu
    out[fix] = targets
    eff = f.copy()
    eff[fix] += mu
    return out, eff


x_open, f_open = mixed(L, df)
x_closed, f_closed = mixed(Lbar, np.append(df, 0.0))
direct = df.copy()
direct[fix] = targets
effects = {}
totals = {}
for name, c in (("output", np.ones(n)), ("valueAdded", va), ("income", h), ("employment", e)):
    d, o, t = c * direct, c * x_open, c * x_closed[:n]
    effects[name] = {"direct": d.tolist(), "indirect": (o - d).tolist(), "induced": (t - o).tolist(), "total": t.tolist()}
    totals[name] = {"direct": d.sum(), "indirect": (o - d).sum(), "induced": (t - o).sum(), "total": t.sum()}

# Spending rounds of the open model.
r = f_open.copy()
cum = np.zeros(n)
x_norm = np.abs(x_open).sum()
round_totals, round_income, coverage = [], [], []
for k in range(200):
    if k > 0:
        r = A @ r
    cum += r
    round_totals.append(r.sum())
    round_income.append(h @ r)
    coverage.append(1 - np.abs(x_open - cum).sum() / x_norm)
    if coverage[-1] >= 0.999:
        break

# Structural paths in the household-closed model (households are pole n).
m = n + 1
dest = index[destination]
to_dest = Lbar[dest, :]
f = f_closed
dest_total = to_dest @ f
threshold = 1e-4 * abs(dest_total)
max_visits, max_length = 200_000, 6
found = []
on_path = np.zeros(m, dtype=bool)
stack = []
visits = 0
truncated = False


def extend(origin, last, direct_so_far):
    """Follow every arc out of `last` in pole order, counting search steps exactly as paths.ts does."""
    global visits, truncated
    col = Abar[:, last]
    cand = np.flatnonzero((col != 0) & ~on_path)
    d = direct_so_far * col[cand]
    follow = (cand != dest) & (len(stack) < max_length) & (np.abs(f[origin] * d * to_dest[cand]) >= threshold)
    events = np.flatnonzero(follow | (cand == dest))
    start = visits
    consumed = 0
    for p in events:
        if start + consumed + p + 1 > max_visits:
            break
        k = cand[p]
        if k == dest:
            found.append((stack + [k], d[p], origin))
            continue
        before = visits = start + consumed + p + 1
        on_path[k] = True
        stack.append(k)
        extend(origin, k, d[p])
        stack.pop()
        on_path[k] = False
        consumed += visits - before
        if truncated:
            return
    if start + consumed + len(cand) > max_visits:
        visits = max_visits + 1
        truncated = True
    else:
        visits = start + consumed + len(cand)


for o in range(m):
    if f[o] == 0:
        continue
    if o == dest:
        found.append(([o], 1.0, o))
        continue
    on_path[o] = True
    stack.append(o)
    extend(o, o, 1.0)
    stack.pop()
    on_path[o] = False
    if truncated:
        break

labels = sectors + ["Households"]
paths = []
for poles, d, origin in found:
    pm = np.linalg.det(Lbar[np.ix_(poles, poles)])
    paths.append({"sectors": [labels[p] for p in poles], "direct": d, "pathMultiplier": pm, "total": d * pm, "global": to_dest[origin],
                  "shock": f[origin], "contribution": d * pm * f[origin]})
paths.sort(key=lambda p: -abs(p["contribution"]))
json.dump({
    "effects": effects,
    "totals": totals,
    "rounds": {"output": round_totals, "income": round_income, "coverage": coverage},
    "paths": {"destinationTotal": dest_total, "found": len(found), "truncated": truncated, "paths": paths[:20]},
}, sys.stdout, default=float)
