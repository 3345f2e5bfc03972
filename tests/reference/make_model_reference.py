#!/usr/bin/python3
"""Reference values for the science model tests, computed with astropy.constants.

Run with Debian's Python (astropy 5.2.1, IAU 2015 nominal values, CODATA 2018):
    /usr/bin/python3 tests/reference/make_model_reference.py
It writes tests/fixtures/model/astropy-reference.json: the constants as astropy has them, and the issue's
table of derived values recomputed from them at full precision (circular orbits, planet mass neglected).
It also recomputes the limb-darkened fractions of light lost for k = 0.1, u1 = 0.4, u2 = 0.26 by a dense
midpoint sum over the occulted area, independent of the TypeScript reference in the tests.
"""
import json
import math
import os

import astropy
import astropy.constants as c
import numpy as np

R_SUN = c.R_sun.value
R_EARTH = c.R_earth.value
R_JUP = c.R_jup.value
GM_SUN = c.GM_sun.value
G = c.G.value
AU = c.au.value
DAY = 86400.0


def kepler_a(period_days, mass_msun):
    return (GM_SUN * mass_msun * (period_days * DAY) ** 2 / (4 * math.pi ** 2)) ** (1 / 3)


def durations_hours(period_days, k, a_over_r, b):
    sin_i = math.sqrt(1 - (b / a_over_r) ** 2)
    t14 = period_days / math.pi * math.asin(math.sqrt((1 + k) ** 2 - b ** 2) / (a_over_r * sin_i)) * 24
    t23 = period_days / math.pi * math.asin(math.sqrt((1 - k) ** 2 - b ** 2) / (a_over_r * sin_i)) * 24
    return t14, t23


def light_lost(z, k, u1, u2, n=2_000_000):
    lo, hi = max(0.0, z - k), min(1.0, z + k)
    r = lo + (np.arange(n) + 0.5) * (hi - lo) / n
    mu = np.sqrt(np.clip(1 - r * r, 0, None))
    intensity = 1 - u1 * (1 - mu) - u2 * (1 - mu) ** 2
    if z == 0:
        arc = 2 * np.pi * r
    else:
        arc = 2 * np.arccos(np.clip((r * r + z * z - k * k) / (2 * r * z), -1, 1)) * r
    return float(np.sum(arc * intensity) * (hi - lo) / n / (np.pi * (1 - u1 / 3 - u2 / 6)))


earth_a = kepler_a(365.2564, 1.0)
earth_t14, earth_t23 = durations_hours(365.2564, R_EARTH / R_SUN, earth_a / R_SUN, 0.0)
hd_p, hd_k, hd_ar, hd_i = 3.52474859, 0.12086, 8.76, math.radians(86.71)
hd_b = hd_ar * math.cos(hd_i)
hd_t14, _ = durations_hours(hd_p, hd_k, hd_ar, hd_b)

reference = {
    "source": f"astropy {astropy.__version__} astropy.constants (IAU 2015 nominal values, CODATA 2018)",
    "constants": {
        "R_sun_m": R_SUN,
        "R_earth_m": R_EARTH,
        "R_jup_m": R_JUP,
        "GM_sun_m3_s2": GM_SUN,
        "GM_earth_m3_s2": c.GM_earth.value,
        "GM_jup_m3_s2": c.GM_jup.value,
        "M_sun_kg": c.M_sun.value,
        "G_si": G,
        "au_m": AU,
        "L_sun_w": c.L_sun.value,
        "sigma_sb_si": c.sigma_sb.value,
    },
    "derived": {
        "earthSunTransitProbability": (R_SUN + R_EARTH) / AU,
        "sunRadiusOverAu": R_SUN / AU,
        "earthSunDepthPpm": (R_EARTH / R_SUN) ** 2 * 1e6,
        "earthSemiMajorAxisAu": earth_a / AU,
        "earthT14Hours": earth_t14,
        "earthT23Hours": earth_t23,
        "jupiterSunDepth": (R_JUP / R_SUN) ** 2,
        "mercurySemiMajorAxisAu": kepler_a(87.9691, 1.0) / AU,
        "redDwarfRstarOverA": 0.35 * R_SUN / (0.1 * AU),
        "redDwarfPeriodDays": 2 * math.pi * math.sqrt((0.1 * AU) ** 3 / (GM_SUN * 0.35)) / DAY,
        "hd209458Impact": hd_b,
        "hd209458T14Hours": hd_t14,
        "hd209458DensityGcm3": 3 * math.pi * hd_ar ** 3 / (G * (hd_p * DAY) ** 2) / 1000,
        "hd209458RadiusJupiter": hd_k * 1.155 * R_SUN / R_JUP,
        "hd209458TransitProbability": (1 + hd_k) / hd_ar,
    },
    "limbDarkenedLightLost": {
        "radiusRatio": 0.1,
        "u1": 0.4,
        "u2": 0.26,
        "byZ": {str(z): light_lost(z, 0.1, 0.4, 0.26) for z in (0.0, 0.9, 1.0)},
    },
}

out = os.path.join(os.path.dirname(__file__), "..", "fixtures", "model", "astropy-reference.json")
with open(out, "w") as handle:
    json.dump(reference, handle, indent=2)
    handle.write("\n")
print(json.dumps(reference, indent=2))
