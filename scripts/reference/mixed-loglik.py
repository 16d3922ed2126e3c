#!/usr/bin/env python3
"""Reference values for the mixed psychometric model (lib/psychometrics/mixed.ts).

Computes, independently of the engine, the marginal log-likelihood of a small set of
shoppers under the model of Moscatelli, Mezzetti & Lacquaniti (2012) as the engine states it:
shopper s has ln threshold alpha_b + u_s, u_s ~ Normal(0, sigma^2), and answers a trial at
base b and discount d with probability
    P = gamma_b + (1 - gamma_b - lapse) / (1 + exp(-beta * (ln d - alpha_b - u_s))).
Each shopper's likelihood (binomial terms with their coefficients) is integrated over u_s
with scipy.integrate.quad (adaptive Gauss-Kronrod, relative tolerance 1e-13) on the log
scale shifted by the integrand's maximum; no Gauss-Hermite rule is used here. Also writes
numpy's Gauss-Hermite rules (numpy.polynomial.hermite.hermgauss) for the quadrature test.

Run: python3 scripts/reference/mixed-loglik.py > tests/fixtures/psychometrics/mixed-loglik.json
(python3 with numpy and scipy; the data are drawn from a seeded generator, invented).
"""
import json
import math

import numpy as np
from scipy import integrate, special

rng = np.random.default_rng(20261202)
BASES = [2.49, 12.9, 49.0]
RUNGS = [0.02, 0.04, 0.07, 0.12, 0.2, 0.3]


def simulate(shoppers, reps, guess, sigma):
    rows = []
    for s in range(shoppers):
        u = sigma * rng.standard_normal()
        for b in BASES:
            for d in RUNGS:
                f = 1 / (1 + math.exp(-4 * (math.log(d) - math.log(0.08) - u)))
                p = guess + (1 - guess - 0.02) * f
                rows.append({"respondent": f"r{s + 1}", "basePrice": b, "discount": d, "n": reps, "k": int(rng.binomial(reps, p))})
    # two edge shoppers: nobody-notices and notices-everything
    for rid, k in (("none", 0), ("all", reps)):
        for b in BASES:
            for d in RUNGS:
                rows.append({"respondent": rid, "basePrice": b, "discount": d, "n": reps, "k": k})
    return rows


def alphas_for(model, params):
    if model == "free":
        return list(params["alphas"])
    if model == "weber":
        return [params["alpha"]] * len(BASES)
    if model == "constantAmount":
        return [params["lnAmount"] - math.log(b) for b in BASES]
    if model == "power":
        return [params["a"] + (params["b"] - 1) * math.log(b) for b in BASES]
    raise ValueError(model)


def shopper_loglik(cells, alphas, gammas, beta, lapse, sigma):
    """cells: list of (base index, discount, n, k)."""
    logc = sum(special.gammaln(n + 1) - special.gammaln(k + 1) - special.gammaln(n - k + 1) for _, _, n, k in cells)

    def log_lik(z):
        total = 0.0
        for j, d, n, k in cells:
            t = beta * (math.log(d) - alphas[j] - sigma * z)
            # P and 1 - P each from its own logistic tail, so neither cancels to 0
            p = gammas[j] + (1 - gammas[j] - lapse) * special.expit(t)
            q = lapse + (1 - gammas[j] - lapse) * special.expit(-t)
            total += k * math.log(p) + (n - k) * math.log(q)
        return total

    if sigma == 0:
        return logc + log_lik(0.0)
    grid = np.linspace(-12, 12, 2401)
    vals = [log_lik(z) - 0.5 * z * z for z in grid]
    m = max(vals)
    zm = grid[int(np.argmax(vals))]
    f = lambda z: math.exp(log_lik(z) - 0.5 * z * z - m)
    val, _ = integrate.quad(f, -12, 12, points=[zm], epsabs=0, epsrel=1e-13, limit=500)
    return logc + m + math.log(val) - 0.5 * math.log(2 * math.pi)


def total_loglik(rows, model, params, gammas, beta, lapse, sigma):
    by = {}
    for r in rows:
        by.setdefault(r["respondent"], []).append((BASES.index(r["basePrice"]), r["discount"], r["n"], r["k"]))
    alphas = alphas_for(model, params)
    return sum(shopper_loglik(c, alphas, gammas, beta, lapse, sigma) for c in by.values())


def main():
    pick_rows = simulate(30, 2, 0.5, 0.5)
    spot_rows = simulate(25, 3, 0.1, 0.3)
    cases = []
    specs = [
        ("pick, weber", pick_rows, "weber", {"alpha": math.log(0.08)}, [0.5] * 3, 4.0, 0.02, 0.5),
        ("pick, weber, sigma 0", pick_rows, "weber", {"alpha": math.log(0.08)}, [0.5] * 3, 4.0, 0.02, 0.0),
        ("pick, weber, wide spread", pick_rows, "weber", {"alpha": math.log(0.1)}, [0.5] * 3, 3.0, 0.0, 1.2),
        ("pick, free", pick_rows, "free", {"alphas": [math.log(0.07), math.log(0.09), math.log(0.1)]}, [0.5] * 3, 5.0, 0.04, 0.4),
        ("pick, power", pick_rows, "power", {"a": math.log(0.08) + 0.1, "b": 0.95}, [0.5] * 3, 4.5, 0.01, 0.6),
        ("pick, constant amount", pick_rows, "constantAmount", {"lnAmount": math.log(0.08 * 12.9)}, [0.5] * 3, 2.5, 0.03, 0.8),
        ("spot, free, guess per base", spot_rows, "free", {"alphas": [math.log(0.06), math.log(0.08), math.log(0.11)]}, [0.08, 0.12, 0.1], 4.0, 0.02, 0.3),
        ("spot, weber, steep", spot_rows, "weber", {"alpha": math.log(0.08)}, [0.08, 0.12, 0.1], 12.0, 0.05, 0.35),
    ]
    for label, rows, model, params, gammas, beta, lapse, sigma in specs:
        ll = total_loglik(rows, model, params, gammas, beta, lapse, sigma)
        cases.append({
            "label": label, "data": "pick" if rows is pick_rows else "spot", "model": model, "params": params,
            "guess": gammas, "beta": beta, "lapse": lapse, "sigma": sigma, "logLik": ll,
        })
    rules = {}
    for n in (3, 9, 20, 40):
        x, w = np.polynomial.hermite.hermgauss(n)
        rules[str(n)] = {"nodes": x.tolist(), "weights": w.tolist()}
    out = {
        "source": "scripts/reference/mixed-loglik.py (scipy %s, numpy %s): scipy.integrate.quad per shopper; numpy hermgauss rules" % (
            __import__("scipy").__version__, np.__version__),
        "bases": BASES, "rungs": RUNGS,
        "rows": {"pick": pick_rows, "spot": spot_rows},
        "cases": cases,
        "gaussHermite": rules,
    }
    print(json.dumps(out, indent=1))


if __name__ == "__main__":
    main()
