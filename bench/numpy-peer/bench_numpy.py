"""Vectorised NumPy baseline ("peer") for the planner's heavy path: what a competent analyst
would write with NumPy for the same job.  Use it to measure Lullwatch's engine as a ratio on
the same machine, in the same run.

    python3 bench_numpy.py [--years 30] [--repeat 5] [--unique-tp] [--full]
    python3 bench_numpy.py --write-csv PATH     # the same synthetic input, as CSV

Work measured (30 years hourly = 262,968 records by default):
  1. transform   data point (60 m) -> 5 worksites: dispersion at 6 depths, refraction,
                 shoaling, depth limit
  2. status      10 operations x 5 worksites, hourly status (workable / marginal / not / no data)
  3. monthly     workability and go-start share per calendar month for the 50 pairs
     or, with --full, "statistics": every figure GET /workability returns, per calendar month
     and per year-month (workability, go-start share, waiting on weather mean, type-7 P90 and
     censored count, usable windows per year and mean length), alpha applied.
No Python loop touches records: loops run over worksites and operations (and the 50 pairs).
The data are synthetic (synthetic_sea.generate, fixed seed) and generated before timing starts.
--unique-tp solves the dispersion once per distinct Tp value (the data hold Tp to 0.01 s), the
trick a careful NumPy user would add.  The sites and operations are SITES and OPS below.
Needs numpy and scipy (Debian: python3-numpy python3-scipy).  This machine may set
OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE, which slow current NumPy: time it with
`env -u OPENBLAS_CORETYPE -u OPENBLAS_L2_SIZE python3 bench_numpy.py ...`.
"""

from __future__ import annotations

import argparse
import math
import statistics
import time

import numpy as np

import synthetic_sea as make_hindcast

G = 9.81
TWO_PI = 2 * math.pi
D_SRC = 60.0
SITES = [  # depth m, shore-normal bearing (None = no refraction), gamma_b
    (3.0, 250.0, 0.6), (8.0, 250.0, 0.6), (15.0, 230.0, 0.6), (30.0, None, 0.6), (50.0, 270.0, 0.6),
]
OPS = [
    {"tpop_h": 4, "tc_h": 2, "limits": {"hs_max": 1.0}},
    {"tpop_h": 6, "tc_h": 6, "limits": {"hs_max": 1.5}},
    {"tpop_h": 3, "tc_h": 1, "limits": {"hs_max": 2.5, "tp_exclude": [[7.0, 9.0]]}},
    {"tpop_h": 12, "tc_h": 6, "limits": {"hs_tp_curve": [[3.0, 1.2], [5.0, 1.8], [8.0, 2.2],
                                                          [11.0, 1.6], [13.0, 1.0]]}},
    {"tpop_h": 4, "tc_h": 2, "limits": {"ubed_max": 0.35, "ubed_method": "linear"}},
    {"tpop_h": 8, "tc_h": 4, "limits": {"ubed_max": 0.5, "ubed_method": "soulsby"}},
    {"tpop_h": 24, "tc_h": 12, "limits": {"hs_max": 2.0, "wind_max": 12.0}},
    {"tpop_h": 8, "tc_h": 4, "limits": {"hs_max": 3.0, "tp_min": 5.0, "tp_max": 12.0}},
    {"tpop_h": 48, "tc_h": 24, "limits": {"wind_max": 15.0}},
    {"tpop_h": 60, "tc_h": 24, "limits": {"hs_max": 1.2, "wind_max": 10.0}},
]
ALPHA_HS = np.array([1.0, 2.0, 4.0, 6.0])
ALPHA_ROWS = [(12.0, [0.65, 0.76, 0.79, 0.80]), (24.0, [0.63, 0.73, 0.76, 0.78]),
              (36.0, [0.62, 0.71, 0.73, 0.76]), (48.0, [0.60, 0.68, 0.71, 0.74]),
              (72.0, [0.55, 0.63, 0.68, 0.72])]
TZ_OVER_TP = 0.6673 + 0.05037 * 3.3 - 0.006230 * 3.3 ** 2 + 0.0003341 * 3.3 ** 3


# ------------------------------------------------------------------ dispersion
def solve_kd(k0d):
    """kd tanh kd = k0d: Fenton & McKee start + 3 Newton steps (machine precision; 2 are not)."""
    r = np.sqrt(k0d)
    x = k0d / np.cbrt(np.tanh(r * np.sqrt(r)) ** 2)     # k0d coth(k0d^(3/4))^(2/3)
    for _ in range(3):
        t = np.tanh(x)
        x -= (x * t - k0d) / (t + x * (1.0 - t * t))
    return x


def props(tp, d):
    """C, Cg and 1/sinh(kd) at depth d (tp has no NaN here)."""
    omega = TWO_PI / tp
    k0 = omega * omega / G
    kd = solve_kd(k0 * d)
    em = -np.expm1(-2.0 * kd)                          # 1 - e^-2kd
    e = np.exp(-2.0 * kd)
    ish = 2.0 * np.sqrt(e) / em                        # 1/sinh(kd)
    n = 0.5 + 2.0 * kd * e / (em * (2.0 - em))         # (1 + 2kd/sinh 2kd)/2
    c = omega * d / kd
    return c, n * c, ish


# ------------------------------------------------------------------ stage 1
def transform(hs, tp, dr, unique=False, sites=SITES, d_src=D_SRC):
    """Hs at every worksite (n_sites, N) and 1/sinh(k_p d_site) for the bed velocity.

    unique=True: the depth-dependent factors are computed once per distinct Tp and
    gathered (one np.unique for all depths).  sin/cos of (Dir - beta) come from sin/cos of
    Dir by the angle-difference identities; the landward test uses the wrapped angle in
    degrees so that |theta| = 90 exactly is landward, as in the reference.
    """
    ok_tp = np.isfinite(tp)
    tps = np.where(ok_tp, tp, 10.0)
    if unique:
        base, inv = np.unique(tps, return_inverse=True)
    else:
        base, inv = tps, None
    gather = (lambda a: a[inv]) if unique else (lambda a: a)
    c_src, cg_src, _ = props(base, d_src)
    rad = np.radians(dr)
    sd, cd = np.sin(rad), np.cos(rad)
    ang = {}
    out_hs, out_ish = [], []
    for d, beta, gb in sites:
        c, cg, ish = props(base, d)
        ks = gather(np.sqrt(cg_src / cg))
        h = hs * ks
        if beta is not None:
            if beta not in ang:
                th_deg = 180.0 - np.mod(180.0 - (dr - beta), 360.0)       # (-180, 180]
                cb, sb = math.cos(math.radians(beta)), math.sin(math.radians(beta))
                ang[beta] = (np.abs(th_deg) >= 90.0, sd * cb - cd * sb, cd * cb + sd * sb)
            landward, sin_t, cos_t = ang[beta]
            s = gather(c / c_src) * sin_t
            with np.errstate(invalid="ignore", divide="ignore"):
                kr = np.sqrt(cos_t / np.sqrt(1.0 - s * s))
            h *= np.where(landward, 1.0, kr)                                 # NaN dir -> NaN
        h[~ok_tp] = np.nan
        out_hs.append(np.minimum(h, gb * d))                                 # NaN stays NaN
        out_ish.append(gather(ish))
    return np.array(out_hs), np.array(out_ish)


# ------------------------------------------------------------------ stage 2
def alpha_for(tpop, tr, alpha_rows=ALPHA_ROWS):
    if tr > 96:
        return None
    for bound, row in alpha_rows:
        if tpop <= bound:
            return np.array(row)
    return None


def statuses(hs_sites, ish_sites, tp, wind, sites=SITES, ops=OPS, alpha_rows=ALPHA_ROWS):
    """int8 array (n_sites, n_ops, N): 2 workable, 1 marginal, 0 not workable, -1 no data."""
    ns, n = hs_sites.shape
    out = np.empty((ns, len(ops), n), dtype=np.int8)
    tp_ok = np.isfinite(tp)
    wind_ok = np.isfinite(wind)
    tps = np.where(tp_ok, tp, 10.0)
    # site-independent parts per operation (Tp limits, curve limits, alpha)
    pre = []
    for op in ops:
        L = op["limits"]
        tr = op["tpop_h"] + op["tc_h"]
        row = alpha_for(op["tpop_h"], tr, alpha_rows)
        ok_tp = np.ones(n, dtype=bool)
        if "tp_min" in L:
            ok_tp &= tp >= L["tp_min"]
        if "tp_max" in L:
            ok_tp &= tp <= L["tp_max"]
        for lo, hi in L.get("tp_exclude", []):
            ok_tp &= ~((tp >= lo) & (tp <= hi))
        lim = wf = None
        if "hs_max" in L:
            a = 1.0 if row is None else float(np.interp(L["hs_max"], ALPHA_HS, row))
            lim, wf = L["hs_max"], a * L["hs_max"]
        if "hs_tp_curve" in L:
            xs, ys = np.array(L["hs_tp_curve"]).T
            inside = (tps >= xs[0]) & (tps <= xs[-1])
            hc = np.where(inside, np.interp(tps, xs, ys), -np.inf)
            a = 1.0 if row is None else np.interp(np.where(inside, hc, 1.0), ALPHA_HS, row)
            lim = hc if lim is None else np.minimum(lim, hc)
            wf = a * hc if wf is None else np.minimum(wf, a * hc)
        need_tp = "hs_tp_curve" in L or "tp_min" in L or "tp_max" in L or "tp_exclude" in L \
            or "ubed_max" in L
        miss = np.zeros(n, dtype=bool)
        if need_tp:
            miss |= ~tp_ok
        if "wind_max" in L:
            miss |= ~wind_ok
            ok_tp &= wind <= L["wind_max"]
        pre.append((ok_tp, lim, wf, miss))
    for si, (d, _, _) in enumerate(sites):
        h = hs_sites[si]
        h_ok = np.isfinite(h)
        u_lin = np.pi * h / tps * ish_sites[si]
        tn = math.sqrt(d / G)
        t = tn / (tps * TZ_OVER_TP)
        A = (6500.0 + (0.56 + 15.54 * t) ** 6) ** (1.0 / 6.0)
        u_sou = 2.0 * (h / (4.0 * tn)) / (1.0 + A * t * t) ** 3
        for oi, op in enumerate(ops):
            L = op["limits"]
            ok_other, lim, wf, miss = pre[oi]
            if "ubed_max" in L:
                u = u_lin if L.get("ubed_method", "linear") == "linear" else u_sou
                ok_other = ok_other & (u <= L["ubed_max"])
            if lim is not None or "ubed_max" in L:
                miss = miss | ~h_ok
            st = out[si, oi]
            if lim is None:
                st[:] = np.where(ok_other, 2, 0)
            else:
                st[:] = np.where(ok_other & (h <= wf), 2, np.where(ok_other & (h <= lim), 1, 0))
            st[miss] = -1
    return out


# ------------------------------------------------------------------ stage 3
def monthly(times, st):
    """Workability and go-start share per calendar month for every (site, op).

    Per (site, op) row (a loop of 50, which keeps each row's work in cache): one cumulative
    sum of the workable flags serves both the go-starts (sliding window of TR records:
    cs[i+TR] - cs[i] == TR) and the monthly workable counts (months are contiguous blocks
    of the sorted series); data and go-start counts use add.reduceat on uint8 views.
    """
    ns, no, n = st.shape
    ym = times.astype("datetime64[M]")
    bounds = np.flatnonzero(np.r_[True, ym[1:] != ym[:-1]])
    ends = np.r_[bounds[1:], n]
    cal = ym[bounds].astype(np.int64) % 12
    onehot = np.zeros((bounds.size, 12))
    onehot[np.arange(bounds.size), cal] = 1.0
    flat = st.reshape(ns * no, n)
    trs = np.tile([op["tpop_h"] + op["tc_h"] for op in OPS], ns)
    nw = np.empty((ns * no, bounds.size))
    nd = np.empty_like(nw)
    ng = np.empty_like(nw)
    go = np.zeros((ns * no, n), dtype=bool)
    cs = np.zeros(n + 1, dtype=np.int32)
    for i in range(ns * no):
        row = flat[i]
        np.cumsum(row == 2, out=cs[1:])
        tr = trs[i]
        np.equal(cs[tr:] - cs[:n - tr + 1], tr, out=go[i, :n - tr + 1])
        nw[i] = cs[ends] - cs[bounds]
        nd[i] = np.add.reduceat((row != -1).view(np.uint8), bounds, dtype=np.int16)
        ng[i] = np.add.reduceat(go[i].view(np.uint8), bounds, dtype=np.int16)
    nw, nd, ng = nw @ onehot, nd @ onehot, ng @ onehot
    with np.errstate(invalid="ignore", divide="ignore"):
        return (nw / nd).reshape(ns, no, 12), (ng / nd).reshape(ns, no, 12), \
            nw.reshape(ns, no, 12), ng.reshape(ns, no, 12), go.reshape(ns, no, n)


# ------------------------------------------------------------------ stage 3, --full
# The statistics of the downtime schedule (docs/domain.md#hindcast-statistics-the-downtime-schedule, the product's
# GET /workability returns), per (site, op) pair, per calendar month and per year-month.


def calendar(ts):
    """Site-independent groundwork of --full for one time axis (int64 s, strictly ascending).

    dt is the median spacing; `brk` lists the records that do not continue the one before
    (gap > 1.5 dt).  Year-months are contiguous blocks [b, b + lens) of the ascending series.
    dest_ym / dest_m scatter the records into 2-D arrays with one row per year-month and one
    row per calendar month (its years in time order), rows padded to the longest: the type-7
    P90s then come from one row-wise sort per layout.  Times and waits are kept in seconds
    from the first record, as int32 when the series spans under 68 years (exact, and it
    halves the sorts), else int64; `sent`, the dtype's maximum, marks censored and padding.
    """
    n = ts.size
    step = np.diff(ts)
    if np.any(step <= 0):
        raise ValueError("record times must ascend strictly")
    dt = int(np.median(step))
    ym = ts.astype("datetime64[s]").astype("datetime64[M]").astype(np.int64)
    b = np.flatnonzero(np.r_[True, ym[1:] != ym[:-1]])
    lens = np.diff(np.r_[b, n])
    k = b.size
    mon = ym[b] % 12                                     # 0 = January
    gid = np.repeat(np.arange(k), lens)
    pos = np.arange(n) - b[gid]                          # place inside its year-month
    order = np.argsort(mon, kind="stable")               # year-months of each month, in time order
    cum = np.cumsum(lens[order]) - lens[order]
    off = np.empty(k, dtype=np.int64)
    off[order] = cum - cum[np.searchsorted(mon[order], mon[order])]
    month_len = np.bincount(mon, weights=lens, minlength=12).astype(np.int64)
    onehot = np.zeros((k, 12))
    onehot[np.arange(k), mon] = 1.0
    width, width_m = int(lens.max()), int(month_len.max())
    wdt = np.int32 if ts[-1] - ts[0] < np.iinfo(np.int32).max else np.int64
    return dict(n=n, dt=dt, brk=np.flatnonzero(step > 1.5 * dt) + 1,
                trel=(ts - ts[0]).astype(wdt), sent=np.iinfo(wdt).max,
                b=b, lens=lens, k=k, mon=mon, ym=ym[b], gid=gid, onehot=onehot,
                n_years=np.bincount(mon, minlength=12),   # years with records in the month
                dest_ym=gid * width + pos, dest_m=mon[gid] * width_m + off[gid] + pos,
                width=width, width_m=width_m)


def _workspace(cal):
    """Buffers reused by every row; the padding of the 2-D layouts stays `sent` for good (after
    a row-wise sort it is still at each row's end, outside the positions the scatter writes)."""
    n, dt = cal["n"], cal["trel"].dtype
    return dict(pad=np.zeros(n + 2, dtype=np.int8), wait=np.empty(n, dtype=dt),
                buf_ym=np.full((cal["k"], cal["width"]), cal["sent"], dtype=dt),
                buf_m=np.full((12, cal["width_m"]), cal["sent"], dtype=dt))


def _p90_sorted_rows(buf, nv):
    """Type-7 (numpy's default 'linear') 90th percentile of the first nv[r] values of each
    row of the row-sorted buf; NaN where nv is 0."""
    h = (nv - 1) * 0.9
    lo = np.maximum(np.floor(h).astype(np.int64), 0)
    hi = np.minimum(lo + 1, np.maximum(nv - 1, 0))
    r = np.arange(buf.shape[0])
    a = buf[r, lo].astype(float)
    v = a + (h - lo) * (buf[r, hi].astype(float) - a)
    return np.where(nv > 0, v, np.nan)


def _in_ranges_before(s, e, x):
    """How many indices of the disjoint sorted ranges [s, e) lie below each x."""
    if s.size == 0:
        return np.zeros(x.shape, dtype=np.int64)
    k = np.searchsorted(e, x, side="right")              # ranges wholly below x
    cum = np.r_[0, np.cumsum(e - s)]
    return cum[k] + np.where(k < s.size, np.maximum(x - s[np.minimum(k, s.size - 1)], 0), 0)


def full_row(cal, st, need, use_alpha, ws):
    """Per-year-month sums and P90s of one (site, op) status row (no loop over records).

    Workable runs from the nonzero differences of the padded flags (split where a gap breaks
    them).  The go-starts of a usable run [s, e) are [s, e - need + 1), so every per-month
    count (workable, go-starts) comes from these ranges by searchsorted at the month bounds,
    and the next go-start time is np.repeat of each go range's first time over the stretch
    that ends with that range, raised to the record's own time inside it (waiting 0).  Waits
    are sorted row-wise in the year-month and calendar-month layouts for the P90s; windows
    are binned by the year-month of their first record.
    """
    n, b, k, lens = cal["n"], cal["b"], cal["k"], cal["lens"]
    ts, sent = cal["trel"], cal["sent"]
    w = (st == 2) if use_alpha else (st >= 1)
    pad = ws["pad"]
    pad[1:-1] = w
    e = np.flatnonzero(pad[1:] != pad[:-1])
    rs, re = e[0::2], e[1::2]                            # run starts, exclusive ends
    if cal["brk"].size:                                  # a gap > 1.5 dt splits a run
        x = cal["brk"][w[cal["brk"] - 1] & w[cal["brk"]]]
        if x.size:
            rs, re = np.sort(np.r_[rs, x]), np.sort(np.r_[re, x])
    cnt = re - rs
    ok = cnt >= need
    gs, uc = rs[ok], cnt[ok]                             # usable runs: go-starts [gs, ge)
    ge = re[ok] - need + 1
    first_c = int(ge[-1]) if gs.size else 0              # censored: the tail after the last go
    wait = ws["wait"]
    if gs.size:
        nt = np.repeat(ts[gs], np.diff(ge, prepend=0))   # first go-start time of the range ahead
        np.maximum(nt, ts[:first_c], out=nt)             # ... or the record's own time inside it
        np.subtract(nt, ts[:first_c], out=wait[:first_c])
    wait[first_c:] = 0
    wsum = np.add.reduceat(wait, b, dtype=np.int64)
    wait[first_c:] = sent
    cens = np.maximum(b + lens - np.maximum(b, first_c), 0)
    nwow = lens - cens
    bym, bm = ws["buf_ym"], ws["buf_m"]
    bym.reshape(-1)[cal["dest_ym"]] = wait               # a view: 5x faster than .flat
    bym.sort(axis=1)
    bm.reshape(-1)[cal["dest_m"]] = wait
    bm.sort(axis=1)
    gw = cal["gid"][gs]
    edges = np.r_[b, n]
    return dict(
        n_with_data=np.add.reduceat((st != -1).view(np.uint8), b, dtype=np.int32),
        n_workable=np.diff(_in_ranges_before(rs, re, edges)),
        n_go_starts=np.diff(_in_ranges_before(gs, ge, edges)),
        wow_sum_s=wsum, wow_n=nwow, wow_censored=cens,
        p90_ym_s=_p90_sorted_rows(bym, nwow),
        p90_m_s=_p90_sorted_rows(bm, np.bincount(cal["mon"], weights=nwow, minlength=12)
                                 .astype(np.int64)),
        usable_windows_count=np.bincount(gw, minlength=k),
        window_records=np.bincount(gw, weights=uc, minlength=k),
    ), (gs, ge)


def _derive(c, n_years, dt):
    """Ratios from the summed counts (NaN where there are no records)."""
    with np.errstate(invalid="ignore", divide="ignore"):
        c["workability"] = c["n_workable"] / c["n_with_data"]
        c["go_start_share"] = c["n_go_starts"] / c["n_with_data"]
        c["wow_mean_h"] = c["wow_sum_s"] / c["wow_n"] / 3600.0
        c["n_years"] = n_years
        c["usable_windows_per_year"] = c["usable_windows_count"] / n_years
        c["usable_windows_mean_length_h"] = c["window_records"] * (dt / 3600.0) \
            / c["usable_windows_count"]
    return c


def full_statistics(ts, st, trs, use_alpha=True, cal=None, keep_go=False):
    """All --full statistics for the status rows st (n_pairs, N) with reference periods trs (h).

    Returns (month, year_month[, go ranges]): dicts of arrays (n_pairs, 12) and (n_pairs, K),
    keyed by operation and worksite; year_month["ym"] holds the K year-months.
    """
    if cal is None:
        cal = calendar(ts)
    ws = _workspace(cal)
    rows = [full_row(cal, st[i], max(1, math.ceil(trs[i] * 3600.0 / cal["dt"] - 1e-9)),
                     use_alpha, ws) for i in range(st.shape[0])]
    keys = ("n_with_data", "n_workable", "n_go_starts", "wow_sum_s", "wow_n", "wow_censored",
            "usable_windows_count", "window_records")
    ym = {key: np.array([r[0][key] for r in rows]) for key in keys}
    ym["n_records"] = np.broadcast_to(cal["lens"], ym["wow_n"].shape)
    mo = {key: v @ cal["onehot"] for key, v in ym.items()}
    mo["wow_p90_h"] = np.array([r[0]["p90_m_s"] for r in rows]) / 3600.0
    ym["wow_p90_h"] = np.array([r[0]["p90_ym_s"] for r in rows]) / 3600.0
    _derive(mo, cal["n_years"], cal["dt"])
    _derive(ym, 1, cal["dt"])
    ym["ym"] = cal["ym"].astype("datetime64[M]")
    if keep_go:
        return mo, ym, [r[1] for r in rows]
    return mo, ym


def regular_grid(times, *cols):
    """Reindex onto a full regular grid (rows absent -> NaN), so gaps act as no data."""
    dt = np.median(np.diff(times.astype(np.int64)))
    t0 = times[0].astype(np.int64)
    idx = ((times.astype(np.int64) - t0) // dt).astype(np.int64)
    if idx[-1] == times.size - 1:
        return (times,) + cols
    full = np.full(idx[-1] + 1, np.nan)
    out = []
    for c in cols:
        f = full.copy()
        f[idx] = c
        out.append(f)
    return (times[0] + np.arange(idx[-1] + 1) * np.timedelta64(int(dt), "s"),) + tuple(out)


def run_once(d, unique):
    t = {}
    c0 = time.perf_counter()
    times, hs, tp, dr, wind = regular_grid(d["time"], d["hs"], d["tp"], d["dir"], d["wind"])
    hs_sites, ish = transform(hs, tp, dr, unique)
    c1 = time.perf_counter()
    st = statuses(hs_sites, ish, tp, wind)
    c2 = time.perf_counter()
    res = monthly(times, st)
    c3 = time.perf_counter()
    t["transform"], t["status"], t["monthly"], t["total"] = c1 - c0, c2 - c1, c3 - c2, c3 - c0
    return t, (times, hs_sites, st, res)


def run_once_full(d, unique):
    """--full: no reindexing (absent rows are not records, docs/domain.md#convention-12); the calendar
    groundwork (dt, gap breaks, year-month blocks, scatter maps) is timed with the statistics,
    as the product's bench times its step detection and calendar index."""
    t = {}
    c0 = time.perf_counter()
    ts = d["time"].astype("datetime64[s]").astype(np.int64)
    hs_sites, ish = transform(d["hs"], d["tp"], d["dir"], unique)
    c1 = time.perf_counter()
    st = statuses(hs_sites, ish, d["tp"], d["wind"])
    c2 = time.perf_counter()
    ns, no, n = st.shape
    trs = [op["tpop_h"] + op["tc_h"] for op in OPS] * ns
    res = full_statistics(ts, st.reshape(ns * no, n), trs, True)
    c3 = time.perf_counter()
    t["transform"], t["status"], t["statistics"], t["total"] = c1 - c0, c2 - c1, c3 - c2, c3 - c0
    return t, (ts, st, res)


YM_KEYS = ("workability", "go_start_share", "wow_mean_h", "wow_p90_h", "wow_censored",
           "usable_windows_count", "usable_windows_mean_length_h")


def campaign(ts, dt, go_times, tpops, years):
    """Campaign durations, vectorised over the start dates (1st of each month 00:00 UTC)."""
    start = np.array([[f"{y:04d}-{m:02d}-01" for m in range(1, 13)] for y in years],
                     dtype="datetime64[s]").astype(np.int64)
    t = start.copy()
    cens = np.zeros(t.shape, dtype=bool)
    for gt, tpop in zip(go_times, tpops):
        if gt.size == 0:
            cens[:] = True
            break
        j = np.searchsorted(gt, t, side="left")
        cens |= j >= gt.size
        t = gt[np.minimum(j, gt.size - 1)] + int(round(tpop * 3600))
    cens |= t > ts[-1] + dt
    dur = (t - start) / 3600.0
    pct = lambda x, q: float(np.percentile(x, q)) if x.size else None   # type 7
    out = []
    for m in range(12):
        dm = dur[~cens[:, m], m]
        wow = dm - float(sum(tpops))
        out.append(dict(month=m + 1, n_censored=int(cens[:, m].sum()),
                        duration_p50_h=pct(dm, 50), duration_p90_h=pct(dm, 90),
                        wow_p50_h=pct(wow, 50), wow_p90_h=pct(wow, 90)))
    return out


BAR_TOL = {"workability": 1e-6, "go_start_share": 1e-6, "wow_mean_h": 1e-3, "wow_p90_h": 1e-3,
           "wow_censored": 0, "usable_windows_per_year": 1e-6,
           "usable_windows_mean_length_h": 1e-3}
ALL_TOL = dict(BAR_TOL, n_records=0, n_with_data=0, n_workable=0, n_go_starts=0, wow_n=0,
               usable_windows_count=0, n_years=0)


def _ramp(s, e):
    """0, 1, ..., e_i - s_i - 1 for every range, concatenated (no loop)."""
    lens = e - s
    return np.arange(lens.sum()) - np.repeat(np.cumsum(lens) - lens, lens)


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--years", type=int, default=30)
    ap.add_argument("--repeat", type=int, default=5)
    ap.add_argument("--unique-tp", action="store_true")
    ap.add_argument("--write-csv", metavar="PATH",
                    help="write the synthetic input as CSV (time,hs,tp,dir,wind) and exit")
    ap.add_argument("--full", action="store_true",
                    help="all monthly and year-month statistics (the set GET /workability returns)")
    a = ap.parse_args()
    g0 = time.perf_counter()
    d = make_hindcast.generate(start="1994-01-01", years=a.years, seed=4242, gaps=False)
    if a.write_csv:
        make_hindcast.write_csv(a.write_csv, d)
        return
    n = d["time"].size
    print(f"records {n:,} ({a.years} years hourly), worksites {len(SITES)}, operations {len(OPS)}; "
          f"data generated in {time.perf_counter() - g0:.2f} s (not timed)")
    runs = []
    out = None
    for _ in range(a.repeat):
        t, out = (run_once_full if a.full else run_once)(d, a.unique_tp)
        runs.append(t)
    stages = ("transform", "status", "statistics" if a.full else "monthly", "total")
    for k in stages:
        v = [r[k] for r in runs]
        print(f"  {k:{10 if a.full else 9}s} best {min(v) * 1000:8.1f} ms   "
              f"median {statistics.median(v) * 1000:8.1f} ms")
    best = min(r["total"] for r in runs)
    best_st = min(r["status"] for r in runs)
    evals = n * len(OPS) * len(SITES)
    print(f"records x operations x worksites = {evals:,}")
    print(f"  end to end : {evals / best / 1e6:8.2f} M record-operation-worksite per s "
          f"({n * len(OPS) / best / 1e6:.2f} M record-operations per s)")
    print(f"  status only: {evals / best_st / 1e6:8.2f} M record-operation-worksite per s")
    if a.full:
        v = [r["total"] for r in runs]
        print(f"numpy full: total best {min(v) * 1000:.1f} ms median "
              f"{statistics.median(v) * 1000:.1f} ms "
              f"({'--unique-tp' if a.unique_tp else 'direct dispersion'}, {a.repeat} runs)")


if __name__ == "__main__":
    main()
