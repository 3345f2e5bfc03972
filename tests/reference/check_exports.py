#!/usr/bin/python3
"""Reads Dipdeck's exports back with astropy, for tests/unit/server/formats/*.test.ts.

Run with Debian's Python (astropy 5.2.1), from the repository root:

    /usr/bin/python3 tests/reference/check_exports.py path/to/export.vot path/to/export.csv

It prints one JSON object on stdout:
  astropy  the astropy version.
  votable  astropy.io.votable.parse(path, verify='warn') with every Python warning recorded (a VOTable
           warning W01–W55, E-codes raised as errors, astropy.units' UnitsWarning for a unit VOUnit
           does not know): the warnings, the RESOURCE's INFOs, and per FIELD its datatype, unit (as
           astropy parsed it), ucd, whether check_ucd accepts the ucd against the UCD1+ controlled
           vocabulary, and the column's values (masked cells as null).
  csv      astropy.io.ascii.read(path, format='csv', comment='#'): the warnings, the comment lines
           astropy collected in meta['comments'], and per column its values (masked cells as null).
           Plain format='csv' has no comment lines (its CsvHeader.comment is None, as RFC 4180 has
           none), hence comment='#'.
"""

import json
import math
import sys
import warnings

import astropy
import numpy as np
from astropy.io import ascii
from astropy.io.votable import parse
from astropy.io.votable.ucd import check_ucd


def plain(value):
    if value is np.ma.masked:
        return None
    if isinstance(value, np.generic):
        value = value.item()
    if isinstance(value, float) and math.isnan(value):
        return None
    return value


def column_values(column):
    return [plain(v) for v in column]


def read_votable(path):
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        votable = parse(path, verify="warn")
        table = votable.get_first_table()
        columns = []
        for field in table.fields:
            columns.append({
                "name": field.name,
                "datatype": field.datatype,
                "unit": None if field.unit is None else str(field.unit),
                "ucd": field.ucd,
                "ucdValid": None if field.ucd is None else check_ucd(
                    field.ucd, check_controlled_vocabulary=True, has_colon=False),
                "values": column_values(table.array[field.ID or field.name]),
            })
    return {
        "warnings": [f"{w.category.__name__}: {w.message}" for w in caught],
        "version": votable.version,
        "infos": {info.name: info.value for info in votable.resources[0].infos},
        "columns": columns,
    }


def read_csv(path):
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        table = ascii.read(path, format="csv", comment="#")
    return {
        "warnings": [f"{w.category.__name__}: {w.message}" for w in caught],
        "comments": table.meta.get("comments", []),
        "columns": [{"name": name, "values": column_values(table[name])} for name in table.colnames],
    }


if __name__ == "__main__":
    votable_path, csv_path = sys.argv[1], sys.argv[2]
    print(json.dumps({
        "astropy": astropy.__version__,
        "votable": read_votable(votable_path),
        "csv": read_csv(csv_path),
    }))
