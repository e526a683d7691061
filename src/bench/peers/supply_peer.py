"""A vectorised NumPy peer of trimfree's Monte Carlo benchmark, for `npm run bench -- --peers` only (never a test).

It runs the bench model of examples/engine/bench-supply.json (an invented CV/CC bench-supply module) with the same
statistics as trimfree's bench case and as supply-peer.c beside it: worst case over every vertex of the parts' bands,
then the trials in chunks of 65536, whole-array operations per chunk, each output reduced to moments (two-pass per
chunk, merged by Chan, Golub & LeVeque 1983), an 8192-bin histogram over the widened worst-case range and the in-spec
count; then from the histogram the percentiles, the symmetric and shortest 95 % and 99.73 % intervals
(JCGM 101:2008 7.7), the yield and Cp/Cpk (NIST/SEMATECH e-Handbook 6.1.6). Random numbers: NumPy's default
generator (PCG64); normal draws by the same inverse CDF as trimfree (Acklam 2003), truncated ones through the same
Φ (Numerical Recipes 2nd ed. §6.2 erfcc) and clamped to the band.

Input on stdin, as for supply-peer.c (written by src/bench/peers.ts). Output on stdout: one JSON object with the CPU
time of the computation (time.process_time(), after NumPy is imported and the input read), its wall time
(time.perf_counter()) and each output's figures.
"""
import json
import math
import sys
import time

import numpy as np

PERCENTILES = [0.135, 1, 2.5, 5, 25, 50, 75, 95, 97.5, 99, 99.865]
OUTPUT_NAMES = ["vout", "dividerCurrent", "ilimit", "shuntLoss", "ampOutput"]
# Part order of the bench Model (peers.ts checks the names).
T_AMB, VREF, VREF_TC, R1, R1_TCR, R2, R2_TCR, IFB, RS, RS_TCR, VTH, VOS_CMP, VOS_AMP, IB_AMP, RF, RG = range(16)

A = [-3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2, -3.066479806614716e1, 2.506628277459239]
B = [-5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1, -1.328068155288572e1]
C = [-7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783]
D = [7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416]
P_LOW = 0.02425


def inverse_normal(u):
    """Acklam's Φ⁻¹ over an array: the central rational function everywhere, the tails redone where they apply."""
    p = np.where(u > 0, u, 2.0**-33)
    q = p - 0.5
    r = q * q
    x = (((((A[0] * r + A[1]) * r + A[2]) * r + A[3]) * r + A[4]) * r + A[5]) * q / (((((B[0] * r + B[1]) * r + B[2]) * r + B[3]) * r + B[4]) * r + 1)
    tail = (p < P_LOW) | (p > 1 - P_LOW)
    if tail.any():
        pt = p[tail]
        lower = pt < P_LOW
        qt = np.sqrt(-2 * np.log(np.where(lower, pt, 1 - pt)))
        z = (((((C[0] * qt + C[1]) * qt + C[2]) * qt + C[3]) * qt + C[4]) * qt + C[5]) / ((((D[0] * qt + D[1]) * qt + D[2]) * qt + D[3]) * qt + 1)
        x[tail] = np.where(lower, z, -z)
    return x


def erfc_nr(x):
    z = abs(x)
    t = 1 / (1 + 0.5 * z)
    ans = t * math.exp(-z * z - 1.26551223 + t * (1.00002368 + t * (0.37409196 + t * (0.09678418 + t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))))
    return ans if x >= 0 else 2 - ans


def normal_cdf(z):
    return 0.5 * erfc_nr(-z / math.sqrt(2))


def evaluate(x, theta):
    """The bench model on arrays (src/analysis/models/supply.ts, src/circuits/divider.ts, sense/noninv.ts)."""
    dt = x[T_AMB] - 25
    v = x[VREF] * (1 + x[VREF_TC] * dt)
    r_top = x[R1] * (1 + x[R1_TCR] * dt)
    r_bottom = x[R2] * (1 + x[R2_TCR] * dt)
    vout = v + r_top * (v / r_bottom + x[IFB])
    divider = v / r_bottom
    r_ambient = x[RS] * (1 + x[RS_TCR] * dt)
    gain = 1 + x[RF] / x[RG]
    head = (x[VTH] - x[VOS_CMP] - x[IB_AMP] * x[RF]) / gain - x[VOS_AMP]
    current = head / r_ambient
    k = current * r_ambient
    hot = (r_ambient + np.sqrt(r_ambient * r_ambient + 4 * r_ambient * x[RS_TCR] * theta * k * k)) / 2
    current = head / hot
    loss = current * current * hot
    amp = gain * (current * hot + x[VOS_AMP]) + x[IB_AMP] * x[RF]
    return [vout, divider, current, loss, amp]


def coverage_count(p, m):
    pm = p * m
    return pm if pm == math.floor(pm) else math.floor(pm + 0.5)


def symmetric_start(p, m):
    q = coverage_count(p, m)
    half = (m - q) / 2
    return max(1, half if half == math.floor(half) else math.floor((m - q + 1) / 2))


class Histogram:
    """Reading order statistics from the histogram, as src/analysis/statistics/histogram.ts does."""

    def __init__(self, counts, lo, hi, vmin, vmax):
        self.counts = counts
        self.lo, self.hi, self.min, self.max = lo, hi, vmin, vmax
        self.bins = len(counts) - 2
        self.cumulative = np.concatenate(([0.0], np.cumsum(counts)))
        self.m = self.cumulative[-1]

    def rank_values(self, ranks):
        """The rank-th smallest values (1-based), each interpolated within its bin; ranks an array."""
        ranks = np.asarray(ranks, dtype=np.float64)
        b = np.searchsorted(self.cumulative[1:], ranks, side="left")
        c = self.counts[b]
        width = (self.hi - self.lo) / self.bins
        a = np.where(b == 0, self.min, np.where(b == self.bins + 1, self.hi, self.lo + (b - 1) * width))
        z = np.where(b == 0, self.lo, np.where(b == self.bins + 1, self.max, self.lo + b * width))
        safe = np.where(c > 0, c, 1)
        return np.where(c > 0, a + ((ranks - self.cumulative[b] - 0.5) / safe) * (z - a), self.max)

    def rank_value(self, rank):
        return float(self.rank_values([rank])[0])

    def symmetric(self, p):
        q, r = coverage_count(p, self.m), symmetric_start(p, self.m)
        return [self.rank_value(r), self.rank_value(min(self.m, r + q))]

    def shortest(self, p):
        """For each bin holding a first value, the interval from that bin's first rank; the narrowest (the first)."""
        q = coverage_count(p, self.m)
        first = self.cumulative[:-1][self.counts > 0] + 1
        first = first[first + q <= self.m]
        if first.size == 0:
            return [self.min, self.max]
        low, high = self.rank_values(first), self.rank_values(first + q)
        i = int(np.argmin(high - low))
        return [float(low[i]), float(high[i])]


def main():
    words = sys.stdin.read().split()
    trials, seed, bins, chunk, theta = int(float(words[0])), int(float(words[1])), int(words[2]), int(float(words[3])), float(words[4])
    windows = [float(w) for w in words[5:13]]
    kinds, lo, hi, k = [], [], [], []
    for i in range(16):
        row = words[13 + 4 * i: 17 + 4 * i]
        kinds.append(int(row[0]))
        lo.append(float(row[1]))
        hi.append(float(row[2]))
        k.append(float(row[3]))
    start = time.process_time()
    wall_start = time.perf_counter()
    rng = np.random.default_rng(seed)
    mean = [(a + b) / 2 for a, b in zip(lo, hi)]
    sigma = [(b - a) / 2 / kk for a, b, kk in zip(lo, hi, k)]
    p_lo = [normal_cdf((a - m) / s) if kind == 2 else 0 for kind, a, m, s in zip(kinds, lo, mean, sigma)]
    span = [normal_cdf((b - m) / s) - pl if kind == 2 else 0 for kind, b, m, s, pl in zip(kinds, hi, mean, sigma, p_lo)]

    # Worst case: every vertex of the bands (2^16 of them, as one array evaluation).
    vertex = np.arange(1 << 16)
    corners = [np.where((vertex >> i) & 1, hi[i], lo[i]) for i in range(16)]
    worst = [(float(y.min()), float(y.max())) for y in evaluate(corners, theta)]
    ranges = []
    for wmin, wmax in worst:
        pad = (wmax - wmin) / 2 if wmax > wmin else max(abs(wmin) * 1e-9, 1e-300)
        ranges.append((wmin - pad, wmax + pad))
    spec_of = [0, None, 1, 2, 3]
    specs = [(windows[2 * s], windows[2 * s + 1]) if s is not None else (-math.inf, math.inf) for s in spec_of]

    acc = [{"n": 0, "mean": 0.0, "m2": 0.0, "min": math.inf, "max": -math.inf, "in": 0, "counts": np.zeros(bins + 2)} for _ in range(5)]
    done = 0
    while done < trials:
        n = min(chunk, trials - done)
        u = rng.random((16, n))
        x = []
        for i in range(16):
            if kinds[i] == 0:
                x.append(lo[i] + (hi[i] - lo[i]) * u[i])
            elif kinds[i] == 1:
                x.append(mean[i] + sigma[i] * inverse_normal(u[i]))
            else:
                x.append(np.clip(mean[i] + sigma[i] * inverse_normal(p_lo[i] + span[i] * u[i]), lo[i], hi[i]))
        for o, y in enumerate(evaluate(x, theta)):
            a = acc[o]
            rlo, rhi = ranges[o]
            f = (y - rlo) * (bins / (rhi - rlo))
            # Bin 0 below the range, bins + 1 above it, else ⌊f⌋ + 1 (as trimfree's scan).
            index = np.floor(np.clip(f, -1, bins)).astype(np.int64) + 1
            a["counts"] += np.bincount(index, minlength=bins + 2)
            a["in"] += int(np.count_nonzero((y >= specs[o][0]) & (y <= specs[o][1])))
            m = float(y.sum()) / n
            d = y - m
            m2 = max(0.0, float(d @ d) - float(d.sum()) ** 2 / n)
            total = a["n"] + n
            delta = m - a["mean"]
            a["m2"] += m2 + delta * delta * a["n"] * n / total
            a["mean"] += delta * n / total
            a["n"] = total
            a["min"] = min(a["min"], float(y.min()))
            a["max"] = max(a["max"], float(y.max()))
        done += n

    outputs = {}
    for o, name in enumerate(OUTPUT_NAMES):
        a = acc[o]
        h = Histogram(a["counts"], ranges[o][0], ranges[o][1], a["min"], a["max"])
        s = math.sqrt(a["m2"] / (a["n"] - 1))
        ranks = [min(h.m, max(1, math.ceil(p / 100 * h.m))) for p in PERCENTILES]
        out = {
            "mean": a["mean"], "sigma": s, "min": a["min"], "max": a["max"], "worstCase": list(worst[o]),
            "median": h.rank_value(ranks[5]),
            "interval95": h.symmetric(0.95), "interval9973": h.symmetric(0.9973),
            "shortest95": h.shortest(0.95), "shortest9973": h.shortest(0.9973),
        }
        if spec_of[o] is not None:
            lsl, usl = specs[o]
            out["yieldPct"] = 100 * a["in"] / a["n"]
            out["cp"] = (usl - lsl) / (6 * s)
            out["cpk"] = min(usl - a["mean"], a["mean"] - lsl) / (3 * s)
        outputs[name] = out
    cpu = time.process_time() - start
    wall = time.perf_counter() - wall_start
    print(json.dumps({"runner": "numpy", "trials": trials, "threads": 1, "cpuSeconds": cpu, "wallSeconds": wall, "outputs": outputs}))


main()
