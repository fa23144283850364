"""Reference fixtures for engine/stats from Debian's statsmodels 0.13.5.

    /usr/bin/python3 test/oracles/diagnostics.py      (from the repository root, after
                                                        Rscript test/oracles/diagnostics.R)

Reads the input series that test/oracles/diagnostics.R stored in
test/fixtures/stats/series.json and writes test/fixtures/stats/statsmodels.json. Every value
records the exact call in its "call" field; floats are written with repr (shortest
round-trip, i.e. full double precision).
"""

import json
import os
import warnings

import numpy as np
import statsmodels
from statsmodels.tsa.adfvalues import mackinnoncrit, mackinnonp
from statsmodels.tsa.stattools import adfuller, kpss

HERE = os.path.join("test", "fixtures", "stats")

with open(os.path.join(HERE, "series.json")) as f:
    SERIES = json.load(f)["series"]


def as_float(v):
    return float(v)


adf_cases = []
kpss_cases = []
for name, s in SERIES.items():
    x = np.asarray(s["values"], dtype=float)
    for regression in ("c", "ct"):
        stat, p, usedlag, nobs, crit, icbest = adfuller(x, regression=regression, autolag="AIC")
        adf_cases.append(
            {
                "name": name,
                "regression": regression,
                "autolag": "AIC",
                "call": f"adfuller(x, regression='{regression}', autolag='AIC')",
                "statistic": as_float(stat),
                "pValue": as_float(p),
                "usedLag": int(usedlag),
                "nobs": int(nobs),
                "criticalValues": {k: as_float(v) for k, v in crit.items()},
            }
        )
        for k in (0, 3):
            stat, p, usedlag, nobs, crit = adfuller(x, maxlag=k, regression=regression, autolag=None)
            adf_cases.append(
                {
                    "name": name,
                    "regression": regression,
                    "autolag": None,
                    "maxlag": k,
                    "call": f"adfuller(x, maxlag={k}, regression='{regression}', autolag=None)",
                    "statistic": as_float(stat),
                    "pValue": as_float(p),
                    "usedLag": int(usedlag),
                    "nobs": int(nobs),
                    "criticalValues": {k2: as_float(v) for k2, v in crit.items()},
                }
            )
    for regression in ("c", "ct"):
        for nlags in ("auto", "legacy"):
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")
                stat, p, lags, crit = kpss(x, regression=regression, nlags=nlags)
            kpss_cases.append(
                {
                    "name": name,
                    "regression": regression,
                    "nlags": nlags,
                    "call": f"kpss(x, regression='{regression}', nlags='{nlags}')",
                    "statistic": as_float(stat),
                    "pValue": as_float(p),
                    "lag": int(lags),
                }
            )

tau_grid = [-30.0, -19.0, -8.0, -5.0, -4.2, -3.9, -3.5, -3.2, -3.0, -2.9, -2.5, -2.0, -1.6, -1.0, -0.5, 0.0,
            0.5, 0.6, 0.7, 0.9, 2.0, 3.0]
mackinnon_p = []
for regression in ("c", "ct"):
    for t in tau_grid:
        mackinnon_p.append(
            {
                "regression": regression,
                "tau": t,
                "call": f"mackinnonp({t!r}, regression='{regression}', N=1)",
                "value": as_float(mackinnonp(t, regression=regression, N=1)),
            }
        )
mackinnon_crit = []
for regression in ("c", "ct"):
    for nobs in (20, 50, 95, 130, 360, 1000):
        mackinnon_crit.append(
            {
                "regression": regression,
                "nobs": nobs,
                "call": f"mackinnoncrit(N=1, regression='{regression}', nobs={nobs})",
                "value": [as_float(v) for v in mackinnoncrit(N=1, regression=regression, nobs=nobs)],
            }
        )

out = {
    "versions": {"statsmodels": statsmodels.__version__, "numpy": np.__version__},
    "note": "x is series.json series[name].values",
    "adfuller": adf_cases,
    "kpss": kpss_cases,
    "mackinnonp": mackinnon_p,
    "mackinnoncrit": mackinnon_crit,
}
path = os.path.join(HERE, "statsmodels.json")
with open(path, "w") as f:
    json.dump(out, f, separators=(",", ":"))
    f.write("\n")
print("wrote", path)
