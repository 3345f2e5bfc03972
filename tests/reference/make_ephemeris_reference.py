#!/usr/bin/python3
"""Reference values for the ephemeris tests, computed with astropy.time and astropy.coordinates.

Run with Debian's Python (astropy 5.2.1, numpy 1.24), from the repository root:

    /usr/bin/python3 tests/reference/make_ephemeris_reference.py

It writes tests/fixtures/reference/ephemeris.json:
  checks       for a site (EarthLocation.from_geodetic, WGS 84), UTC instants and ICRS targets:
               the target's and the Sun's altitude (SkyCoord.transform_to(AltAz), no refraction:
               pressure 0, astropy's default), the Sun's geocentric separation from the target
               (get_sun(t).separation(target)), and BJD_TDB = Time(utc).tdb + light_travel_time(target,
               kind='barycentric', location=site) (the Rømer delay; astropy's builtin ERFA epv00 Earth).
  leapSeconds  TT - UTC in seconds (astropy/ERFA's leap-second table + 32.184 s) two days before and
               just after each step since 1972, to check Dipdeck's table. Not the day before: ERFA
               spreads a leap second over its 86401-s day in JD fractions, so noon then reads x.5 s.
  tdbMinusTt   TDB - TT in seconds (ERFA dtdb, via Time.tdb) at a few TT dates.

Offline: IERS-A is not downloaded (iers.conf.auto_download = False), so UT1 - UTC is taken as 0 and
polar motion as its mean for times past the bundled IERS-B table; astropy warns. That moves altitudes
by at most ~0.9 s of Earth rotation (< 0.004 deg) and does not touch BJD_TDB. The script is
deterministic: running it again gives the same file.
"""

import json
import os
import warnings

import astropy
import astropy.units as u
import numpy as np
from astropy.coordinates import AltAz, EarthLocation, SkyCoord, get_sun
from astropy.time import Time
from astropy.utils import iers

iers.conf.auto_download = False
iers.conf.iers_degraded_accuracy = "warn"
warnings.simplefilter("ignore")

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "fixtures", "reference", "ephemeris.json")

# Kitt Peak (the site) and the target and instant, then a few more to spread the checks
# over the year, the sky and the hemispheres. Target names are descriptive only.
KITT_PEAK = {"latitudeDeg": 31.9583, "longitudeDeg": -111.5967, "elevationM": 2096.0}
LA_SILLA = {"latitudeDeg": -29.2567, "longitudeDeg": -70.7300, "elevationM": 2400.0}
CASES = [
    ("issue 9 check", KITT_PEAK, "2024-09-01T06:00:00", {"raDeg": 330.79488, "decDeg": 18.88432}),
    ("northern winter, target near the pole", KITT_PEAK, "2025-01-15T03:30:00", {"raDeg": 45.0, "decDeg": 80.0}),
    ("southern site, southern target", LA_SILLA, "2026-05-20T02:00:00", {"raDeg": 210.5, "decDeg": -60.25}),
    ("issue target low in the west, where refraction would show", KITT_PEAK, "2024-09-01T12:20:00", {"raDeg": 330.79488, "decDeg": 18.88432}),
    ("target near the ecliptic pole", LA_SILLA, "2019-03-10T07:15:30", {"raDeg": 90.0, "decDeg": -66.56}),
]

LEAP_DATES = [
    "1972-07-01", "1973-01-01", "1974-01-01", "1975-01-01", "1976-01-01", "1977-01-01", "1978-01-01",
    "1979-01-01", "1980-01-01", "1981-07-01", "1982-07-01", "1983-07-01", "1985-07-01", "1988-01-01",
    "1990-01-01", "1991-01-01", "1992-07-01", "1993-07-01", "1994-07-01", "1996-01-01", "1997-07-01",
    "1999-01-01", "2006-01-01", "2009-01-01", "2012-07-01", "2015-07-01", "2017-01-01",
]
TDB_DATES = ["2000-01-01T12:00:00", "2010-04-01T00:00:00", "2024-09-01T06:00:00", "2026-12-31T18:00:00"]


def location(site):
    return EarthLocation.from_geodetic(
        lon=site["longitudeDeg"] * u.deg, lat=site["latitudeDeg"] * u.deg, height=site["elevationM"] * u.m
    )


def check(name, site, iso, target):
    loc = location(site)
    t = Time(iso, scale="utc", location=loc)
    coord = SkyCoord(ra=target["raDeg"] * u.deg, dec=target["decDeg"] * u.deg, frame="icrs")
    frame = AltAz(obstime=t, location=loc)
    sun = get_sun(t)
    bjd = t.tdb + t.light_travel_time(coord, kind="barycentric", location=loc)
    return {
        "name": name,
        "site": site,
        "utc": iso + "Z",
        "target": target,
        "targetAltitudeDeg": float(coord.transform_to(frame).alt.deg),
        "sunAltitudeDeg": float(sun.transform_to(frame).alt.deg),
        "sunSeparationDeg": float(sun.separation(coord).deg),
        # jd1 + jd2 in float64 keeps ~40 microseconds, as the TypeScript side does.
        "bjdTdb": float(bjd.jd1 + bjd.jd2),
    }


def leap_seconds():
    rows = []
    for day in LEAP_DATES:
        for iso in (str((Time(day) - 2 * u.day).utc.iso)[:10] + "T12:00:00", day + "T00:00:01"):
            t = Time(iso, scale="utc")
            rows.append({"utc": iso + "Z", "ttMinusUtcSeconds": round(float((t.tt.jd1 - t.jd1) + (t.tt.jd2 - t.jd2)) * 86400, 3)})
    return rows


def tdb_minus_tt():
    rows = []
    for iso in TDB_DATES:
        t = Time(iso, scale="tt")
        rows.append({"tt": iso, "jdTt": float(t.jd), "tdbMinusTtSeconds": float(((t.tdb.jd1 - t.jd1) + (t.tdb.jd2 - t.jd2)) * 86400)})
    return rows


def main():
    data = {
        "made_by": "tests/reference/make_ephemeris_reference.py",
        "source": f"astropy {astropy.__version__} (Time, light_travel_time, SkyCoord AltAz, get_sun), numpy {np.__version__}",
        "checks": [check(*case) for case in CASES],
        "leapSeconds": leap_seconds(),
        "tdbMinusTt": tdb_minus_tt(),
    }
    with open(OUT, "w") as f:
        json.dump(data, f, indent=2)
        f.write("\n")


if __name__ == "__main__":
    main()
