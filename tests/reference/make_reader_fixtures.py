#!/usr/bin/python3
"""Writes the FITS fixtures of the light-curve reader tests, and what astropy reads back from them.

Run with Debian's Python (astropy 5.2.1, numpy):  /usr/bin/python3 tests/reference/make_reader_fixtures.py

Outputs, in tests/fixtures/readers/:
  lightcurve-basic.fits    primary HDU without data (OBJECT), then a BINTABLE 'LIGHTCURVE' with
                           D, E, J, L, A and repeat-2 D columns, NaN fluxes and the time keywords
  lightcurve-scaled.fits   primary HDU with an int16 image and the time keywords (BJDREF), an IMAGE
                           extension 'APERTURE', a BINTABLE 'BINNED' with scaled integer columns
                           (TSCAL/TZERO), TNULL, K, I and B columns, and a second BINTABLE 'RAW'
  astropy-readback.json    per file and table: the columns as astropy.io.fits reads them (physical
                           values; NaN as null), the stored integers of the TNULL column, and the
                           header keywords the reader uses

All values are invented (a synthetic star with a box-shaped dip); nothing comes from a real target.
astropy 5.2.1 cannot write a scaled integer column from physical values (its scale-back fails on
int32), so the scaled table is written with stored integers and its TSCALn/TZEROn/TNULLn cards are
added afterwards in update mode, which rewrites the header and leaves the data bytes as written.
"""

import json
import pathlib

import astropy
import numpy as np
from astropy.io import fits

OUT = pathlib.Path(__file__).resolve().parent.parent / "fixtures" / "readers"
SOURCE = f"astropy {astropy.__version__} astropy.io.fits"


def synthetic_flux(rng, time, depth):
    flux = 1.0 + rng.normal(0.0, 4e-4, time.size)
    flux[(time % 3.1) < 0.12] -= depth  # an invented box-shaped dip every 3.1 days
    return flux


def write_basic(rng):
    rows = 100
    time = 1400.0 + np.arange(rows) * (2.0 / 1440.0) * 30  # one hour apart
    pdcsap = synthetic_flux(rng, time, 0.004).astype(np.float32)
    pdcsap[[5, 17, 63]] = np.nan
    sap = (pdcsap * 12000.0 + rng.normal(0, 3, rows)).astype(np.float32)
    err = np.full(rows, 4e-4, dtype=np.float32)
    quality = np.zeros(rows, dtype=np.int32)
    quality[[5, 17, 40]] = [128, 1024, 32]
    centroid = np.stack([100.0 + rng.normal(0, 0.01, rows), 200.0 + rng.normal(0, 0.01, rows)], axis=1)
    flagged = quality != 0
    label = np.array([f"orbit-{1 + i // 50}" for i in range(rows)])

    primary = fits.PrimaryHDU()
    primary.header["OBJECT"] = "Invented Star 1"
    primary.header["ORIGIN"] = "Dipdeck reader fixtures: " + "a long string that astropy continues " * 2
    primary.header["HISTORY"] = "written by tests/reference/make_reader_fixtures.py"
    columns = [
        fits.Column(name="TIME", format="D", unit="BJD - 2457000, days", array=time),
        fits.Column(name="SAP_FLUX", format="E", unit="e-/s", array=sap),
        fits.Column(name="PDCSAP_FLUX", format="E", unit="e-/s", array=pdcsap),
        fits.Column(name="PDCSAP_FLUX_ERR", format="E", unit="e-/s", array=err),
        fits.Column(name="QUALITY", format="J", array=quality),
        fits.Column(name="CENTROID", format="2D", unit="pix", array=centroid),
        fits.Column(name="FLAGGED", format="L", array=flagged),
        fits.Column(name="LABEL", format="8A", array=label),
    ]
    table = fits.BinTableHDU.from_columns(columns, name="LIGHTCURVE")
    for keyword, value in [
        ("TIMESYS", "TDB"),
        ("TIMEREF", "SOLARSYSTEM"),
        ("TIMEUNIT", "d"),
        ("BJDREFI", 2457000),
        ("BJDREFF", 0.0),
    ]:
        table.header[keyword] = value
    path = OUT / "lightcurve-basic.fits"
    fits.HDUList([primary, table]).writeto(path, overwrite=True)
    return path, {}


def write_scaled(rng):
    rows = 60
    time = 300.0 + np.arange(rows) * (1.0 / 48.0)  # half an hour apart
    flux = synthetic_flux(rng, time, 0.006)
    # FLUX: J, physical = 1.0 + 1e-6 × stored, TNULL -2147483648 on three rows.
    flux_stored = np.round((flux - 1.0) / 1e-6).astype(">i4")
    flux_stored[[2, 30, 59]] = -2147483648
    # FLUX_ERR: I, physical = 5e-4 + 1e-6 × stored.
    err_stored = rng.integers(-300, 300, rows).astype(">i2")
    # COUNTS: K, unscaled (astropy 5.2.1 fails to read a K column with a TZERO other than 2**63);
    # BACKGROUND: B (unsigned byte) with TSCAL only and TNULL 255.
    counts = (rng.integers(1_000_000, 2_000_000, rows) * 1000).astype(">i8")
    background = rng.integers(0, 255, rows).astype(np.uint8)
    background[[7, 8]] = 255
    quality = np.zeros(rows, dtype=">i2")
    quality[[2, 3]] = [4, 8]

    primary = fits.PrimaryHDU(data=(np.arange(20, dtype=np.int16).reshape(4, 5) - 10))
    primary.header["OBJECT"] = "Invented Star 2"
    primary.header["TIMESYS"] = "TDB"
    primary.header["TIMEREF"] = "SOLARSYSTEM"
    primary.header["BJDREF"] = 2454833.0
    primary.header["TIMEUNIT"] = "d"
    aperture = fits.ImageHDU(data=rng.normal(0, 1, (6, 7)).astype(np.float32), name="APERTURE")
    binned = fits.BinTableHDU.from_columns(
        [
            fits.Column(name="TIME", format="D", unit="d", array=time),
            fits.Column(name="FLUX", format="J", array=flux_stored),
            fits.Column(name="FLUX_ERR", format="I", array=err_stored),
            fits.Column(name="COUNTS", format="K", array=counts),
            fits.Column(name="BACKGROUND", format="B", array=background),
            fits.Column(name="QUALITY", format="I", array=quality),
        ],
        name="BINNED",
    )
    raw_time = 300.0 + np.arange(20) * (1.0 / 24.0)
    raw = fits.BinTableHDU.from_columns(
        [
            fits.Column(name="TIME", format="D", unit="d", array=raw_time),
            fits.Column(name="SAP_FLUX", format="E", array=synthetic_flux(rng, raw_time, 0.006).astype(np.float32)),
        ],
        name="RAW",
    )
    path = OUT / "lightcurve-scaled.fits"
    fits.HDUList([primary, aperture, binned, raw]).writeto(path, overwrite=True)
    with fits.open(path, mode="update") as hdus:
        header = hdus["BINNED"].header
        header.insert("TFORM2", ("TSCAL2", 1e-6), after=True)
        header.insert("TSCAL2", ("TZERO2", 1.0), after=True)
        header.insert("TZERO2", ("TNULL2", -2147483648), after=True)
        header.insert("TFORM3", ("TSCAL3", 1e-6), after=True)
        header.insert("TSCAL3", ("TZERO3", 5e-4), after=True)
        header.insert("TFORM5", ("TSCAL5", 0.5), after=True)
        header.insert("TSCAL5", ("TNULL5", 255), after=True)
    stored = {"BINNED": {"FLUX": flux_stored.tolist(), "BACKGROUND": background.tolist()}}
    return path, stored


def plain(value):
    """A JSON-ready value: NaN → None, numpy scalars → Python numbers."""
    if isinstance(value, (np.bool_, bool)):
        return bool(value)
    if isinstance(value, (np.floating, float)):
        return None if np.isnan(value) else float(value)
    if isinstance(value, (np.integer, int)):
        return int(value)
    if isinstance(value, (bytes, np.bytes_)):
        return value.decode("ascii")
    if isinstance(value, (str, np.str_)):
        return str(value)
    if isinstance(value, np.ndarray):
        return [plain(item) for item in value]
    raise TypeError(f"no JSON form for {type(value)}")


def read_back(path, stored):
    keywords = ["OBJECT", "TIMESYS", "TIMEREF", "TIMEUNIT", "BJDREFI", "BJDREFF", "BJDREF", "EXTNAME"]
    result = {"hdus": [], "tables": {}}
    with fits.open(path) as hdus:
        for index, hdu in enumerate(hdus):
            header = {key: plain(hdu.header[key]) for key in keywords if key in hdu.header}
            result["hdus"].append({"number": index + 1, "kind": type(hdu).__name__, "header": header})
            if isinstance(hdu, fits.BinTableHDU):
                columns = {}
                for column in hdu.columns:
                    values = hdu.data[column.name]
                    if values.ndim > 1:
                        values = values[:, 0]  # the first element, as our reader gives it
                    columns[column.name] = {
                        "format": column.format,
                        "unit": column.unit,
                        "tscal": plain(column.bscale) if column.bscale is not None else None,
                        "tzero": plain(column.bzero) if column.bzero is not None else None,
                        "tnull": plain(column.null) if column.null is not None else None,
                        "values": [plain(item) for item in values],
                    }
                result["tables"][hdu.name] = {
                    "number": index + 1,
                    "rows": int(hdu.header["NAXIS2"]),
                    "columns": columns,
                    "stored": stored.get(hdu.name, {}),
                }
    return result


def main():
    OUT.mkdir(parents=True, exist_ok=True)
    rng = np.random.default_rng(20240611)
    readback = {"source": SOURCE, "files": {}}
    for writer in (write_basic, write_scaled):
        path, stored = writer(rng)
        readback["files"][path.name] = read_back(path, stored)
    (OUT / "astropy-readback.json").write_text(json.dumps(readback, indent=1) + "\n")
    total = sum(p.stat().st_size for p in OUT.iterdir())
    print(f"wrote {len(list(OUT.iterdir()))} files, {total} bytes, with {SOURCE}")


if __name__ == "__main__":
    main()
