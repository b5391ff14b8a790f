#!/usr/bin/python3
"""A sales history written without larder's engine, for the `larder fit` tests.

Invented demo data. numpy draws every customer (seeded), a plain stocking rule decides each
morning's delivery, and the file is written in larder's history format (README, "History
format") with hourly sales and sell-out times, plus an item file for `larder fit --items`.

The model (our own, written from the definitions in ../shared/spec/model.md, not from larder's
code):
- stores north, south, east with sizes 0.8, 1.0, 1.2; open every day, 08:00-20:00;
- items rye (negative binomial, base 18, cv 0.35), spelt (Poisson, base 14) and bun (Poisson,
  base 10), each with its own weekday multipliers and intraday profile;
- a day's demand of an item is its count law at mean base x size x weekday, by inversion of a
  uniform U = Phi(Z) (scipy's ppf); Z is N(0, 1), independent from day to day, or with
  --lag7 RHO a Gaussian AR process Z_t = RHO Z_{t-7} + sqrt(1 - RHO^2) e_t (so RHO is the
  latent lag-7 correlation of the same store-item);
- each customer arrives at a time drawn from the item's hourly profile (uniform within the
  hour); customers are served in time order while units last; a rye customer who finds rye out
  takes spelt with probability --share-rye (0.4), a bun customer who finds bun out takes spelt
  with probability --share-bun (0.3), when spelt is still in stock; otherwise the customer
  leaves (one level: spelt's customers have no substitute);
- shelf life one day (leftovers are thrown away at close), so the morning's stock is the
  delivery: round(1.2 x the sales of the same weekday a week earlier) + 1, and round(mean) in
  the first week. Items sell out on a large share of days and stock follows last week's sales,
  which selects the days that did not sell out by last week's demand.
"""

import argparse
import csv
import math

import numpy as np
from scipy import stats

STORES = [("north", 0.8), ("south", 1.0), ("east", 1.2)]
ITEMS = {
    "rye": dict(base=18.0, cv=0.35, weekday=[0.9, 0.9, 1.0, 1.0, 1.1, 1.3, 0.8],
                profile=[3, 5, 6, 5, 4, 4, 4, 5, 6, 5, 3, 2]),
    "spelt": dict(base=14.0, cv=None, weekday=[1.1, 1.0, 1.0, 0.9, 1.0, 1.2, 0.8],
                  profile=[2, 3, 4, 5, 5, 5, 5, 5, 5, 4, 3, 2]),
    "bun": dict(base=10.0, cv=None, weekday=[1.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0],
                profile=[1, 2, 3, 4, 4, 4, 4, 4, 4, 3, 2, 1]),
}
OPEN_HOUR = 8
HOURS = 12
START = np.datetime64("2027-01-04")  # a Monday


def demand_ppf(item, mean, u):
    spec = ITEMS[item]
    if spec["cv"] is None:
        return int(stats.poisson.ppf(u, mean))
    var = (spec["cv"] * mean) ** 2
    r = mean * mean / (var - mean)
    return int(stats.nbinom.ppf(u, r, r / (r + mean)))


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--seed", type=int, required=True)
    ap.add_argument("--days", type=int, default=364)
    ap.add_argument("--lag7", type=float, default=0.0)
    ap.add_argument("--share-rye", type=float, default=0.4)
    ap.add_argument("--share-bun", type=float, default=0.3)
    ap.add_argument("--out", required=True)
    ap.add_argument("--items-out", required=True)
    a = ap.parse_args()
    rng = np.random.default_rng(a.seed)
    names = list(ITEMS)
    share = {"rye": ("spelt", a.share_rye), "bun": ("spelt", a.share_bun)}
    profile = {k: np.array(v["profile"], float) / sum(v["profile"]) for k, v in ITEMS.items()}
    # Latent Gaussian variables per store, item and day.
    z = rng.standard_normal((len(STORES), len(names), a.days))
    for t in range(7, a.days):
        z[:, :, t] = a.lag7 * z[:, :, t - 7] + math.sqrt(1 - a.lag7 ** 2) * z[:, :, t]
    u = stats.norm.cdf(z)
    rows = []
    for s, (store, size) in enumerate(STORES):
        sales_hist = {k: [] for k in names}
        for t in range(a.days):
            wd = t % 7
            stock, sold, hourly, last_sale = {}, {}, {}, {}
            arrivals = []
            for i, k in enumerate(names):
                spec = ITEMS[k]
                mean = spec["base"] * size * spec["weekday"][wd]
                if t < 7:
                    stock[k] = int(round(mean))
                else:
                    stock[k] = int(round(1.2 * sales_hist[k][t - 7])) + 1
                d = demand_ppf(k, mean, u[s, i, t])
                hours = rng.choice(HOURS, size=d, p=profile[k])
                times = (OPEN_HOUR + hours + rng.random(d)) * 60.0
                arrivals += [(tm, k) for tm in times]
                sold[k] = 0
                hourly[k] = [0] * HOURS
                last_sale[k] = None
            arrivals.sort()
            choice = rng.random(len(arrivals))
            for (tm, k), c in zip(arrivals, choice):
                take = None
                if stock[k] > 0:
                    take = k
                elif k in share and c < share[k][1] and stock[share[k][0]] > 0:
                    take = share[k][0]
                if take is None:
                    continue
                stock[take] -= 1
                sold[take] += 1
                hourly[take][int(tm // 60) - OPEN_HOUR] += 1
                last_sale[take] = tm
            date = str(START + np.timedelta64(t, "D"))
            for k in names:
                sales_hist[k].append(sold[k])
                out = stock[k] == 0
                when = ""
                if out and last_sale[k] is not None:
                    m = int(last_sale[k])
                    when = f"{m // 60:02d}:{m % 60:02d}"
                rows.append([date, store, k, stock[k] + sold[k], sold[k], stock[k],
                             1 if out else 0, when] + hourly[k])
    rows.sort(key=lambda r: (r[0], r[1], r[2]))
    with open(a.out, "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["date", "store", "item", "delivered", "sold", "leftover", "sold_out",
                    "sold_out_time"] + [f"sales_{OPEN_HOUR + h:02d}" for h in range(HOURS)])
        w.writerows(rows)
    with open(a.items_out, "w", newline="") as f:
        w = csv.writer(f, lineterminator="\n")
        w.writerow(["item", "price", "unit_cost", "shelf_life_days"])
        for k in names:
            w.writerow([k, 3, 1, 1])


if __name__ == "__main__":
    main()
