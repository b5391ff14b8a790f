#!/usr/bin/python3
"""Exact yardstick for larder's ordering rules: the Markov decision process of one store-item,
solved by relative value iteration (Puterman 1994, section 8.5.5), written from model.md
independently of the C++ code (numpy + scipy.sparse, Debian's python3-scipy).

Model (model.md, one day of one store): an order placed after close arrives `lead` days later
as the freshest units (shelf life `life`); each day Poisson(lam) customers; with a next-day
discount each customer takes a discounted unit with probability `take` when one is shown (and
the other tier when the chosen one is empty); full-price units are picked Binomial(sold, fifo)
from the oldest end, the rest from the freshest; units on their last day leave at close
(discarded, or to the discounted tier for one more day, then discarded). Profit per day:
price * full-price sales + discount price * discounted sales - cost * ordered units.

Check: Hendrix, Ortega, Haijema, Buisman and Garcia (2019), "On computing optimal policies in
perishable inventory control using value iteration", Computational and Mathematical Methods
1(4) e1027, report optimal profits of 2.22 (shelf life 2) and 2.40 (shelf life 3) a day for
Poisson(5), price 1, cost 0.5, FIFO and one period between order and arrival (larder's
lead_time_days 2). Run `python3 tests/mdp/perishable_mdp.py` to print every case the C++
tests paste.
"""
import itertools
import sys

import numpy as np
from scipy import sparse
from scipy.stats import binom, poisson


def solve(lam, price, cost, life, lead, fifo, cap, take=0.0, dprice=0.0, discount=False,
          policy=None, tol=1e-9, iters=20000):
    """Returns (gain, best order per state dict). State: stock slots a=0..life-2, [discounted],
    pipeline arrivals for days 1..lead-1."""
    kmax = int(poisson.isf(1e-10, lam)) + 1
    pd = poisson.pmf(np.arange(kmax + 1), lam)
    pd[-1] += 1.0 - pd.sum()
    dims = (life - 1) + (1 if discount else 0) + (lead - 1)
    states = list(itertools.product(range(cap + 1), repeat=dims))
    index = {s: i for i, s in enumerate(states)}
    n = len(states)

    day_cache = {}

    def day(shelf, x):
        key = (shelf, x)
        if key in day_cache:
            return day_cache[key]
        out = {}
        reward = 0.0
        full_total = sum(shelf)
        for d in range(kmax + 1):
            accept = binom.pmf(np.arange(d + 1), d, take) if (discount and x > 0) else [1.0]
            for a, pa in enumerate(accept):
                w = pd[d] * pa
                if w <= 0:
                    continue
                b = d - a
                take_d = min(a, x)
                take_f = min(b, full_total)
                full = take_f + min(full_total - take_f, a - take_d)
                disc = take_d + min(x - take_d, b - take_f)
                if fifo in (0.0, 1.0):
                    splits = [(1.0, full if fifo == 1.0 else 0)]
                else:
                    splits = list(zip(binom.pmf(np.arange(full + 1), full, fifo), range(full + 1)))
                for pk, old in splits:
                    ww = w * pk
                    s = list(shelf)
                    need = old
                    for i in range(life):
                        t = min(need, s[i]); s[i] -= t; need -= t
                    need = full - old
                    for i in reversed(range(life)):
                        t = min(need, s[i]); s[i] -= t; need -= t
                    leaving = s[0]
                    part = tuple(min(v, cap) for v in s[1:]) + ((min(leaving, cap),) if discount else ())
                    reward += ww * (price * full + dprice * disc)
                    out[part] = out.get(part, 0.0) + ww
        day_cache[key] = (reward, out)
        return day_cache[key]

    P = []
    R = []
    for q in range(cap + 1):
        rows, cols, vals = [], [], []
        r = np.empty(n)
        for i, st in enumerate(states):
            stock = st[:life - 1]
            x = st[life - 1] if discount else 0
            pipe = st[(life - 1) + (1 if discount else 0):]
            arrival = pipe[0] if lead > 1 else q
            rew, out = day(tuple(stock) + (arrival,), x)
            r[i] = rew - cost * q
            newpipe = (tuple(pipe[1:]) + (q,)) if lead > 1 else ()
            for part, pr in out.items():
                rows.append(i); cols.append(index[part + newpipe]); vals.append(pr)
        P.append(sparse.csr_matrix((vals, (rows, cols)), shape=(n, n)))
        R.append(r)
    V = np.zeros(n)
    choice = None
    for _ in range(iters):
        if policy is None:
            Q = np.stack([R[q] + P[q] @ V for q in range(cap + 1)])
            choice = Q.argmax(axis=0)
            T = Q.max(axis=0)
        else:
            T = np.array([R[policy(states[i])][i] + P[policy(states[i])][i] @ V for i in range(n)])
        diff = T - V
        V = T - T[0]
        if diff.max() - diff.min() < tol:
            break
    gain = 0.5 * (diff.max() + diff.min())
    return gain, (dict(zip(states, choice)) if choice is not None else None)


CASES = [
    # name, lam, price, cost, life, lead, fifo, cap, take, dprice, discount
    ("hendrix_life2", 5, 1.0, 0.5, 2, 2, 1.0, 16, 0, 0, False),
    ("hendrix_life3", 5, 1.0, 0.5, 3, 2, 1.0, 16, 0, 0, False),
]
for life in (2, 3):
    for lead in (1, 2):
        for fifo in (1.0, 0.5, 0.0):
            CASES.append((f"life{life}_lead{lead}_fifo{fifo}", 5, 1.0, 0.5, life, lead, fifo, 16,
                          0, 0, False))
CASES.append(("discount_next_day", 20, 3.0, 1.0, 1, 1, 1.0, 40, 0.3, 1.5, True))
CASES.append(("discount_next_day_lead2", 20, 3.0, 1.0, 1, 2, 1.0, 40, 0.3, 1.5, True))

if __name__ == "__main__":
    wanted = sys.argv[1:]
    for case in CASES:
        if wanted and case[0] not in wanted:
            continue
        name, lam, price, cost, life, lead, fifo, cap, take, dprice, discount = case
        g, _ = solve(lam, price, cost, life, lead, fifo, cap, take, dprice, discount)
        print(f"{name}: {g:.9f}", flush=True)
