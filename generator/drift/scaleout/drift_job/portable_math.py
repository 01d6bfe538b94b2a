"""Sine, cosine and arcsine from +, -, *, / and square roots only, step for step as
generator/drift/portable-math.ts (see there for the method and its sources: Cody and Waite 1980
reduction with fdlibm's split of pi/2, Taylor series; Abramowitz and Stegun 1964, 4.4.40 and
4.4.32), so that this job and the built-in reader get the same bits from the same inputs."""
import math

import numpy as np

PIO2_HI = 1.5707963267341256
PIO2_LO = 6.077100506506192e-11
TWO_OVER_PI = 2 / math.pi
HALF_PI = math.pi / 2

_INVERSE_FACTORIAL = []
_f = 1.0
for _n in range(19):
    if _n > 0:
        _f *= _n
    _INVERSE_FACTORIAL.append(1 / _f)

_ASIN = []
_b = 1.0
for _n in range(1, 31):
    _b = (_b * (2 * _n - 1)) / (2 * _n)
    _ASIN.append(_b / (2 * _n + 1))


def _fact(n):
    return _INVERSE_FACTORIAL[n]


def _sin_series(r):
    z = r * r
    p = _fact(17)
    p = -_fact(15) + z * p
    p = _fact(13) + z * p
    p = -_fact(11) + z * p
    p = _fact(9) + z * p
    p = -_fact(7) + z * p
    p = _fact(5) + z * p
    p = -_fact(3) + z * p
    return r + r * (z * p)


def _cos_series(r):
    z = r * r
    p = -_fact(18)
    p = _fact(16) + z * p
    p = -_fact(14) + z * p
    p = _fact(12) + z * p
    p = -_fact(10) + z * p
    p = _fact(8) + z * p
    p = -_fact(6) + z * p
    p = _fact(4) + z * p
    p = -_fact(2) + z * p
    return 1 + z * p


def _reduce(x):
    k = np.floor(x * TWO_OVER_PI + 0.5)
    r = x - k * PIO2_HI - k * PIO2_LO
    return r, np.mod(k, 4)


def sin_cos(x):
    """Sine and cosine of the same angles: one reduction and one pair of series for both."""
    r, q = _reduce(np.asarray(x, dtype=np.float64))
    s, c = _sin_series(r), _cos_series(r)
    sine = np.where(q == 0, s, np.where(q == 1, c, np.where(q == 2, -s, -c)))
    cosine = np.where(q == 0, c, np.where(q == 1, -s, np.where(q == 2, -c, s)))
    return sine, cosine


def sin(x):
    return sin_cos(x)[0]


def cos(x):
    return sin_cos(x)[1]


def _asin_series(t):
    z = t * t
    p = _ASIN[29] + 0 * z
    for n in range(28, -1, -1):
        p = _ASIN[n] + z * p
    return t + t * (z * p)


def asin(x):
    """Each series only on the values that take it (element by element the same steps)."""
    x = np.asarray(x, dtype=np.float64)
    t = np.abs(x)
    value = np.full(t.shape, np.nan)
    small = t <= 0.5
    large = (t > 0.5) & (t <= 1)
    value[small] = _asin_series(t[small])
    value[large] = HALF_PI - 2 * _asin_series(np.sqrt((1 - t[large]) / 2))
    return np.where(x < 0, -value, value)
