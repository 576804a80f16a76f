"""Writes the invented assumption tables of the fictional Wrenfield University Endowment (test scenario).

INVENTED AND ILLUSTRATIVE: every number below is made up for tests; none is market data or a forecast.
Volatilities and expected returns are set by hand per asset class; the correlations come from an invented
four-factor model (equity, rates, credit spread, inflation) plus an asset-specific part, so the matrix is a valid
correlation matrix by construction. Run with python3 and numpy from this folder; it rewrites
expected_returns.csv and covariance.csv.
"""
import numpy as np

# asset, expected return, volatility, loadings on (equity, rates, credit, inflation)
ASSETS = [
    ("Domestic Large Cap Equity",      0.068, 0.16, (0.85, -0.10, 0.20, 0.10)),
    ("Domestic Small Cap Equity",      0.075, 0.21, (0.80, -0.10, 0.30, 0.10)),
    ("International Developed Equity", 0.070, 0.17, (0.80, -0.05, 0.20, 0.15)),
    ("Emerging Markets Equity",        0.082, 0.23, (0.70, -0.05, 0.30, 0.25)),
    ("Global Low-Volatility Equity",   0.060, 0.12, (0.75, 0.10, 0.10, 0.05)),
    ("Frontier Markets Equity",        0.085, 0.26, (0.55, 0.00, 0.30, 0.25)),
    ("Government Bonds",               0.038, 0.05, (-0.20, 0.90, -0.10, 0.10)),
    ("Long Government Bonds",          0.043, 0.11, (-0.25, 0.90, -0.10, 0.05)),
    ("Inflation-Linked Bonds",         0.037, 0.06, (-0.05, 0.60, 0.00, 0.55)),
    ("Investment-Grade Credit",        0.047, 0.065, (0.15, 0.70, 0.45, 0.05)),
    ("High Yield Bonds",               0.060, 0.10, (0.55, 0.10, 0.65, 0.05)),
    ("Emerging Market Debt",           0.062, 0.11, (0.45, 0.30, 0.50, 0.20)),
    ("Bank Loans",                     0.055, 0.08, (0.40, -0.20, 0.65, 0.10)),
    ("Securitised Credit",             0.050, 0.06, (0.15, 0.55, 0.40, 0.05)),
    ("Core Real Estate",               0.058, 0.11, (0.35, 0.10, 0.25, 0.35)),
    ("Listed Real Estate",             0.066, 0.19, (0.65, 0.20, 0.30, 0.20)),
    ("Infrastructure",                 0.063, 0.13, (0.50, 0.25, 0.20, 0.30)),
    ("Commodities",                    0.045, 0.18, (0.25, -0.20, 0.10, 0.70)),
    ("Timberland",                     0.055, 0.12, (0.20, 0.00, 0.10, 0.45)),
    ("Private Equity Buyout",          0.095, 0.24, (0.70, -0.10, 0.30, 0.10)),
    ("Venture Capital",                0.110, 0.32, (0.60, -0.10, 0.15, 0.05)),
    ("Private Credit",                 0.072, 0.11, (0.35, 0.00, 0.60, 0.10)),
    ("Hedge Funds",                    0.055, 0.08, (0.55, 0.00, 0.30, 0.10)),
    ("Cash",                           0.030, 0.008, (0.00, 0.20, 0.00, 0.10)),
    ("Short-Term Bills",               0.032, 0.012, (0.00, 0.35, 0.00, 0.10)),
]

names = [a[0] for a in ASSETS]
mu = np.array([a[1] for a in ASSETS])
vol = np.array([a[2] for a in ASSETS])
load = np.array([a[3] for a in ASSETS])
corr = load @ load.T
np.fill_diagonal(corr, 1.0)
assert np.linalg.eigvalsh(corr).min() > 0.01
cov = corr * np.outer(vol, vol)

HEADER = ("# as_of: 2025-06-30\n"
          "# scenario: Wrenfield University Endowment (fictional), invented illustrative assumptions, "
          "not market data\n")
with open("expected_returns.csv", "w") as f:
    f.write(HEADER + "asset,expected_return\n")
    for n, m in zip(names, mu):
        f.write(f"{n},{m:.4f}\n")
with open("covariance.csv", "w") as f:
    f.write(HEADER + "asset," + ",".join(names) + "\n")
    for i, n in enumerate(names):
        # formatted from the symmetric product, so the file is exactly symmetric
        f.write(n + "," + ",".join(f"{cov[min(i, j), max(i, j)]:.10g}" for j in range(len(names))) + "\n")
