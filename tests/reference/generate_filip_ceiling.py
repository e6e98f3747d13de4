#!/usr/bin/python3
"""What double precision can reach on NIST StRD Filip with the inputs our tests build.

    /usr/bin/python3 tests/reference/generate_filip_ceiling.py [path/to/Filip.dat]

The StRD ceilings (tests/data/nist-strd/README.md) assume correctly rounded powers x², …, x¹⁰; the
tests build them by repeated binary64 multiplication, as a sheet would. This solves least squares
on exactly those inputs in exact rational arithmetic (normal equations over Fractions: exact, so
their conditioning does not matter), rounds the answer to binary64 and prints the LRE of each
figure against the certified values: the ceiling for our inputs. Takes about a minute.
"""
import math
import os
import sys
from fractions import Fraction as F

HERE = os.path.dirname(os.path.abspath(__file__))
path = sys.argv[1] if len(sys.argv) > 1 else os.path.join(HERE, "..", "data", "nist-strd", "linreg", "Filip.dat")
lines = open(path).read().splitlines()
certified, sds = [], []
for line in lines[:60]:
    w = line.split()
    if len(w) == 3 and w[0].startswith("B") and w[0][1:].isdigit():
        certified.append(float(w[1]))
        sds.append(float(w[2]))
    if len(w) == 3 and w[0] == "Standard" and w[1] == "Deviation":
        residual_sd = float(w[2])
    if len(w) == 2 and w[0] == "R-Squared":
        r_squared = float(w[1])
rows = [list(map(float, line.split())) for line in lines[60:] if line.split()]
y = [F(r[0]) for r in rows]
X = []
for r in rows:
    power, row = 1.0, [F(1)]
    for _ in range(10):
        power *= r[1]  # binary64, as the tests build them
        row.append(F(power))
    X.append(row)
n, k = len(rows), 11
# (XᵀX | I | Xᵀy) reduced exactly: the inverse gives the standard deviations.
A = [[sum(X[i][a] * X[i][b] for i in range(n)) for b in range(k)] +
     [F(int(a == b)) for b in range(k)] + [sum(X[i][a] * y[i] for i in range(n))] for a in range(k)]
for c in range(k):
    pivot = next(r for r in range(c, k) if A[r][c] != 0)
    A[c], A[pivot] = A[pivot], A[c]
    A[c] = [v / A[c][c] for v in A[c]]
    for r in range(k):
        if r != c and A[r][c] != 0:
            f = A[r][c]
            A[r] = [A[r][j] - f * A[c][j] for j in range(2 * k + 1)]
beta = [A[i][2 * k] for i in range(k)]
rss = sum((y[i] - sum(X[i][j] * beta[j] for j in range(k))) ** 2 for i in range(n))
mean = sum(y) / n
tss = sum((v - mean) ** 2 for v in y)
s2 = rss / (n - k)


def lre(computed, cert):
    return min(15.0, -math.log10(abs(computed - cert) / abs(cert)))


coef = min(lre(float(beta[j]), certified[j]) for j in range(k))
sd = min(lre(math.sqrt(float(s2 * A[j][k + j])), sds[j]) for j in range(k))
print("Filip, exact least squares on the built inputs, rounded to binary64: LRE")
print("coefficients %.2f  SDs %.2f  residual SD %.2f  R² %.2f" %
      (coef, sd, lre(math.sqrt(float(s2)), residual_sd), lre(float(1 - rss / tss), r_squared)))
