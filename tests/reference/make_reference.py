#!/usr/bin/python3
"""Make Dipdeck's reference light curves and astropy's BLS answers for them.

Run with Debian's Python (astropy 5.2.1, numpy 1.24), from the repository root:

    /usr/bin/python3 tests/reference/make_reference.py

It writes, for each invented light curve <name>, into tests/fixtures/reference/:
  <name>.csv   time,flux,flux_err (every row of the FITS table, same values)
  <name>.fits  primary HDU (+ an IMAGE HDU before the table in some), one BINTABLE
  <name>.json  how the data were made, the FITS layout, the BLS inputs (period grid definition,
               durations) and astropy's BoxLeastSquares answers (objective='likelihood',
               compute_stats at the best period).

All data are invented and seeded: running it again gives the same files. The period grid is always
explicit (astropy 5.2's autoperiod takes baseline / (minimum_n_transit - 1) as its longest period,
not what its docstring says), built as in Dipdeck's periodGrid: frequencies spaced by
df = shortest_duration / (oversample * baseline**2) from 1/max_period up to 1/min_period.
"""

import json
import os
import sys

import astropy
import numpy as np
from astropy.io import fits
from astropy.timeseries import BoxLeastSquares

OUT_DIR = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "fixtures", "reference")
INT32_NULL = -2147483648


def box(t, period, t0, duration):
    """True where t lies inside a box of the given duration centred on t0 + k * period."""
    half_period = 0.5 * period
    return np.abs((t - t0 + half_period) % period - half_period) < 0.5 * duration


def cadence_times(rng, span_days, cadence_min, gaps, start=0.0):
    """Regular cadence with a little timing jitter removed (exact grid), minus the gap windows."""
    step = cadence_min / 1440.0
    t = start + np.arange(0.0, span_days, step)
    keep = np.ones(t.size, dtype=bool)
    for lo, hi in gaps:
        keep &= ~((t >= start + lo) & (t < start + hi))
    # A few single missing cadences as well, like dropped frames.
    drop = rng.choice(t.size, size=t.size // 200, replace=False)
    keep[drop] = False
    return t[keep]


def hot_jupiter(rng):
    t = cadence_times(rng, 27.0, 10.0, gaps=[(13.1, 14.3)], start=1.3)
    truth = {"period_days": 3.2125, "t0_days": 2.41, "duration_days": 0.12, "depth": 0.0085}
    flux_err = np.full(t.size, 0.0012)
    flux = 1.0 + rng.normal(0.0, 0.0012, t.size)
    flux[box(t, truth["period_days"], truth["t0_days"], truth["duration_days"])] -= truth["depth"]
    return t, flux, flux_err, truth


def shallow_transit(rng):
    t = cadence_times(rng, 26.5, 6.0, gaps=[(12.6, 13.9), (20.05, 20.4)], start=0.7)
    truth = {"period_days": 7.9031, "t0_days": 3.87, "duration_days": 0.2, "depth": 0.001}
    # Errors vary a little from point to point, so the weighting matters.
    flux_err = np.round(rng.uniform(0.0007, 0.0011, t.size), 6)
    flux = 1.0 + rng.normal(0.0, 1.0, t.size) * flux_err
    flux[box(t, truth["period_days"], truth["t0_days"], truth["duration_days"])] -= truth["depth"]
    return t, flux, flux_err, truth


def eclipsing_binary(rng):
    t = cadence_times(rng, 21.0, 10.0, gaps=[(10.2, 11.0)], start=0.2)
    truth = {
        "period_days": 2.4687,
        "t0_days": 1.05,
        "duration_days": 0.16,
        "depth_odd": 0.05,
        "depth_even": 0.038,
        "secondary_depth": 0.006,
    }
    period, t0, duration = truth["period_days"], truth["t0_days"], truth["duration_days"]
    flux_err = np.full(t.size, 0.0015)
    flux = 1.0 + rng.normal(0.0, 0.0015, t.size)
    cycle = np.round((t - t0) / period).astype(int)
    primary = box(t, period, t0, duration)
    # Odd and even counted as astropy's compute_stats does: cycle 0 (the reference) is "even".
    flux[primary & (cycle % 2 != 0)] -= truth["depth_odd"]
    flux[primary & (cycle % 2 == 0)] -= truth["depth_even"]
    flux[box(t, period, t0 + 0.5 * period, duration)] -= truth["secondary_depth"]
    return t, flux, flux_err, truth


CURVES = [
    {
        "name": "hot-jupiter",
        "make": hot_jupiter,
        "object": "DPD-0417-3021",
        "description": "Box transit of a hot Jupiter-like companion, white noise, one mid-series gap.",
        "flux_format": "E",
        "image_hdu": False,
        "bjdrefi": 2457000,
        "bjdreff": 0.0,
        "durations_days": [0.05, 0.08, 0.12, 0.16, 0.2],
        "min_period_days": 0.6,
        "max_period_days": 12.0,
        "grid_oversample": 1,
    },
    {
        "name": "shallow-transit",
        "make": shallow_transit,
        "object": "DPD-1188-0754",
        "description": "Shallow 1000 ppm box transit at 7.9 d, per-point errors, two gaps.",
        "flux_format": "D",
        "image_hdu": True,
        "bjdrefi": 2459000,
        "bjdreff": 0.5,
        "durations_days": [0.08, 0.12, 0.16, 0.2, 0.25],
        "min_period_days": 1.0,
        "max_period_days": 12.5,
        "grid_oversample": 2,
    },
    {
        "name": "eclipsing-binary",
        "make": eclipsing_binary,
        "object": "DPD-2203-1560",
        "description": "Eclipsing binary-like: alternating primary depths, secondary eclipse at phase 0.5.",
        "flux_format": "D",
        "image_hdu": True,
        "bjdrefi": 2458500,
        "bjdreff": 0.0,
        "durations_days": [0.06, 0.1, 0.16, 0.22],
        "min_period_days": 0.8,
        "max_period_days": 9.0,
        "grid_oversample": 1,
    },
]

BLS_OVERSAMPLE = 10  # astropy BoxLeastSquares.power's default phase bins per shortest duration


def period_grid(baseline, min_period, max_period, shortest_duration, oversample):
    # Frequency step of astropy's autoperiod, df = frequency_factor * min_duration / baseline**2,
    # with frequency_factor = 1 / oversample.
    df = shortest_duration / (oversample * baseline**2)
    f_min, f_max = 1.0 / max_period, 1.0 / min_period
    n = 1 + int(np.round((f_max - f_min) / df))
    return 1.0 / (f_max - df * np.arange(n)), df, n


def quality_flags(rng, t):
    """Invented QUALITY bits: 1 on a few scattered cadences, 4096 on the 0.2 d after each gap."""
    quality = np.zeros(t.size, dtype=np.int32)
    quality[rng.choice(t.size, size=12, replace=False)] |= 1
    after_gap = np.concatenate([[False], np.diff(t) > 0.1])
    for start in np.flatnonzero(after_gap):
        quality[(t >= t[start]) & (t < t[start] + 0.2)] |= 4096
    return quality


def write_fits(path, spec, t, flux, flux_err, quality, null_rows):
    tscal, tzero = 1.0e-7, 1.0
    raw_scaled = np.round((flux - tzero) / tscal).astype(np.int32)
    raw_scaled[null_rows] = INT32_NULL
    cadence = (np.round((t - t[0]) * 1440.0 / 2.0)).astype(np.int32) + 100000
    flux_col = flux.astype(np.float32) if spec["flux_format"] == "E" else flux
    columns = [
        fits.Column(name="TIME", format="D", unit="d", array=t),
        fits.Column(name="FLUX", format=spec["flux_format"], unit="relative", array=flux_col),
        fits.Column(name="FLUX_ERR", format="E", unit="relative", array=flux_err.astype(np.float32)),
        fits.Column(name="FLUX_SCALED", format="J", array=raw_scaled),
        fits.Column(name="QUALITY", format="J", array=quality),
        fits.Column(name="CADENCENO", format="J", array=cadence),
    ]
    table = fits.BinTableHDU.from_columns(columns, name="LIGHTCURVE")
    # Scaling and null keywords are set on the header of raw integer data: astropy writes the raw
    # integers unchanged, and a reader must apply TSCAL/TZERO and TNULL itself.
    scaled_index = 4
    table.header.set(f"TSCAL{scaled_index}", tscal, "physical = raw * TSCAL + TZERO", after=f"TFORM{scaled_index}")
    table.header.set(f"TZERO{scaled_index}", tzero, after=f"TSCAL{scaled_index}")
    table.header.set(f"TNULL{scaled_index}", INT32_NULL, "raw value of a missing entry", after=f"TZERO{scaled_index}")
    table.header["TIMESYS"] = ("TDB", "time system of TIME")
    table.header["TIMEREF"] = ("SOLARSYSTEM", "barycentric times")
    table.header["TIMEUNIT"] = ("d", "unit of TIME")
    table.header["BJDREFI"] = (spec["bjdrefi"], "integer part of BJD reference")
    table.header["BJDREFF"] = (spec["bjdreff"], "fraction of BJD reference")
    table.header["OBJECT"] = (spec["object"], "invented target designation")

    primary = fits.PrimaryHDU()
    primary.header["OBJECT"] = spec["object"]
    primary.header["ORIGIN"] = "Dipdeck tests/reference/make_reference.py"
    hdus = [primary]
    if spec["image_hdu"]:
        image = fits.ImageHDU(data=np.arange(64, dtype=np.int16).reshape(8, 8), name="APERTURE")
        hdus.append(image)
    hdus.append(table)
    fits.HDUList(hdus).writeto(path, overwrite=True, output_verify="exception")
    table_index = len(hdus) - 1

    # Read back: the physical values come out as written, and the nulls sit where they should.
    with fits.open(path) as check:
        data = check[table_index].data
        assert np.array_equal(data["TIME"], t)
        assert np.array_equal(np.asarray(data["FLUX"], dtype=np.float64), flux_col.astype(np.float64))
        assert check[table_index].header[f"TNULL{scaled_index}"] == INT32_NULL
        physical = np.asarray(data["FLUX_SCALED"], dtype=np.float64)
        good = np.ones(t.size, dtype=bool)
        good[null_rows] = False
        assert np.allclose(physical[good], flux[good], atol=1.0e-7)
    return {
        "table_hdu_index": table_index,
        "table_extname": "LIGHTCURVE",
        "hdus": ["PRIMARY"] + (["APERTURE (IMAGE, int16 8x8)"] if spec["image_hdu"] else []) + ["LIGHTCURVE (BINTABLE)"],
        "columns": {
            "TIME": "D, d",
            "FLUX": spec["flux_format"] + ", relative",
            "FLUX_ERR": "E, relative",
            "FLUX_SCALED": f"J, TSCAL={tscal}, TZERO={tzero}, TNULL={INT32_NULL}",
            "QUALITY": "J, bit flags (1, 4096)",
            "CADENCENO": "J",
        },
        "flux_scaled_null_rows": [int(i) for i in null_rows],
        "quality_nonzero_count": int(np.count_nonzero(quality)),
        "keywords": {
            "TIMESYS": "TDB",
            "TIMEREF": "SOLARSYSTEM",
            "TIMEUNIT": "d",
            "BJDREFI": spec["bjdrefi"],
            "BJDREFF": spec["bjdreff"],
            "OBJECT": spec["object"],
        },
    }


def fmt(x):
    return repr(float(x))


def write_csv(path, t, flux, flux_err):
    with open(path, "w", encoding="ascii", newline="\n") as out:
        out.write("time,flux,flux_err\n")
        for a, b, c in zip(t, flux, flux_err):
            out.write(f"{fmt(a)},{fmt(b)},{fmt(c)}\n")


def pair(value):
    return [float(value[0]), float(value[1])]


def run_bls(spec, t, flux, flux_err):
    baseline = float(t.max() - t.min())
    shortest = min(spec["durations_days"])
    periods, df, n = period_grid(
        baseline, spec["min_period_days"], spec["max_period_days"], shortest, spec["grid_oversample"]
    )
    model = BoxLeastSquares(t, flux, dy=flux_err)
    result = model.power(
        periods, spec["durations_days"], objective="likelihood", oversample=BLS_OVERSAMPLE
    )
    best = int(np.argmax(result.power))
    period = float(result.period[best])
    duration = float(result.duration[best])
    t0 = float(result.transit_time[best])
    stats = model.compute_stats(period, duration, t0)
    return {
        "inputs": {
            "objective": "likelihood",
            "oversample": BLS_OVERSAMPLE,
            "durations_days": spec["durations_days"],
            "period_grid": {
                "baseline_days": baseline,
                "min_period_days": spec["min_period_days"],
                "max_period_days": spec["max_period_days"],
                "shortest_duration_days": shortest,
                "oversample": spec["grid_oversample"],
                "frequency_step_per_day": df,
                "count": n,
                "first_period_days": float(periods[0]),
                "last_period_days": float(periods[-1]),
            },
        },
        "best": {
            "index": best,
            "period_days": period,
            "transit_time_days": t0,
            "duration_days": duration,
            "depth": float(result.depth[best]),
            "depth_err": float(result.depth_err[best]),
            "depth_snr": float(result.depth_snr[best]),
            "log_likelihood": float(result.log_likelihood[best]),
            "power": float(result.power[best]),
        },
        "compute_stats": {
            "depth": pair(stats["depth"]),
            "depth_odd": pair(stats["depth_odd"]),
            "depth_even": pair(stats["depth_even"]),
            "depth_half": pair(stats["depth_half"]),
            "depth_phased": pair(stats["depth_phased"]),
            "harmonic_amplitude": float(stats["harmonic_amplitude"]),
            "harmonic_delta_log_likelihood": float(stats["harmonic_delta_log_likelihood"]),
            "per_transit_count": [int(c) for c in stats["per_transit_count"]],
            "per_transit_log_likelihood": [float(v) for v in stats["per_transit_log_likelihood"]],
            "transit_times": [float(v) for v in stats["transit_times"]],
        },
    }


def main():
    if astropy.__version__ != "5.2.1":
        print(f"warning: made for astropy 5.2.1, running {astropy.__version__}", file=sys.stderr)
    os.makedirs(OUT_DIR, exist_ok=True)
    for index, spec in enumerate(CURVES):
        rng = np.random.default_rng(20240417 + index)
        t, flux, flux_err, truth = spec["make"](rng)
        # The FITS table and the CSV hold the same numbers: round-trip through the column types.
        flux = np.round(flux, 7)
        if spec["flux_format"] == "E":
            flux = flux.astype(np.float32).astype(np.float64)
        flux_err = flux_err.astype(np.float32).astype(np.float64)
        t = np.round(t, 8)
        quality = quality_flags(rng, t)
        null_rows = np.sort(rng.choice(t.size, size=7, replace=False))

        base = os.path.join(OUT_DIR, spec["name"])
        fits_layout = write_fits(base + ".fits", spec, t, flux, flux_err, quality, null_rows)
        write_csv(base + ".csv", t, flux, flux_err)
        reference = {
            "name": spec["name"],
            "description": spec["description"],
            "made_by": "tests/reference/make_reference.py",
            "source": f"astropy {astropy.__version__} BoxLeastSquares, numpy {np.__version__}",
            "seed": 20240417 + index,
            "points": int(t.size),
            "time_range_days": [float(t.min()), float(t.max())],
            "truth": truth,
            "fits": fits_layout,
            "bls_rows": "every row (QUALITY flags are informative only; flux is unaffected)",
            "bls": run_bls(spec, t, flux, flux_err),
        }
        with open(base + ".json", "w", encoding="utf-8") as out:
            json.dump(reference, out, indent=2)
            out.write("\n")
        best = reference["bls"]["best"]
        print(f"{spec['name']}: {t.size} points, P={best['period_days']:.5f} d, "
              f"t0={best['transit_time_days']:.4f}, depth={best['depth']:.5f}, dur={best['duration_days']}")


if __name__ == "__main__":
    main()
