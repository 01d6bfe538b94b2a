"""Problems found in drift input, worded as the built-in reader words them (generator/errors.ts):
"<file> row <n>, column <name>: <what is wrong>; expected <what was expected>"."""
import math
from dataclasses import dataclass


class JobError(Exception):
    """A problem that stops the job (the built-in build stops on the same problems)."""


@dataclass
class Issue:
    code: str
    file: str
    row: int | None
    column: str | None
    value: str | None
    expected: str
    message: str
    severity: str = "warning"


def quote_value(value):
    if value is None:
        return "(nothing)"
    visible = "".join(f"\\u{ord(c):04x}" if ord(c) < 0x20 or ord(c) == 0x7F else c for c in value)
    short = visible[:77] + "..." if len(visible) > 80 else visible
    return f'"{short}"'


def js_number(x):
    """A number as JavaScript's String(x) writes it (shortest round trip)."""
    x = float(x)
    if math.isnan(x):
        return "NaN"
    if math.isinf(x):
        return "Infinity" if x > 0 else "-Infinity"
    if x == int(x) and abs(x) < 1e21:
        return str(int(x))
    text = repr(x)
    if "e" in text and -7 < int(text.split("e")[1]) < 21:
        import numpy as np
        return np.format_float_positional(x, unique=True, trim="-")
    if "e" in text:
        mantissa, exponent = text.split("e")
        sign = "-" if exponent.startswith("-") else "+"
        return f"{mantissa}e{sign}{int(exponent.lstrip('+-'))}"
    return text


def value_missing(file, row, column):
    return Issue("ValueMissing", file, row, column, "", "a value", f"{file} row {row}, column {column}: the value is missing; a value is required")


def value_wrong_type(file, row, column, value, expected):
    return Issue("ValueWrongType", file, row, column, value, expected, f"{file} row {row}, column {column}: {quote_value(value)} is not {expected}")


def value_not_finite(file, row, column, value, expected):
    return Issue("ValueNotFinite", file, row, column, value, expected, f"{file} row {row}, column {column}: {quote_value(value)} is not a finite number; expected a measured value")


def value_not_allowed(file, row, column, value, allowed):
    return Issue("ValueNotAllowed", file, row, column, value, f"one of {', '.join(allowed)}", f"{file} row {row}, column {column}: {quote_value(value)} is not allowed; expected one of {', '.join(allowed)}")


def row_wrong_length(file, row, found, expected, value):
    return Issue("RowWrongLength", file, row, None, value, f"{expected} cells", f"{file} row {row}, column (all): the row has {found} cells; expected {expected}")


def row_truncated(file, row, found, expected, value):
    return Issue("RowTruncated", file, row, None, value, f"{expected} cells", f"{file} row {row}, column (all): the last line is cut short ({found} of {expected} cells, no line end); the record was left out")


def duplicate_key(file, row, column, value, first_row):
    return Issue("DuplicateKey", file, row, column, value, "one position per particle and time", f"{file} row {row}, column {column}: {quote_value(value)} was already used on row {first_row}; expected a unique id")


def header_missing_column(file, column, header):
    return Issue("HeaderMissingColumn", file, 1, column, header, f"a column named {column}", f"{file} row 1, column {column}: the header has no column {quote_value(column)}; found {quote_value(header)}", "error")


def csv_unreadable(file, row, reason):
    return Issue("CsvUnreadable", file, row, None, None, "a complete, readable (gzip) CSV file", f"{file} row {row}, column (all): the CSV cannot be read further ({reason})", "error")


def file_empty(file):
    return Issue("FileEmpty", file, 1, None, None, "a header row and data rows", f"{file} row 1: the file is empty; expected a header row and data rows", "error")


def netcdf_unreadable(file, reason):
    return Issue("NetcdfUnreadable", file, None, None, None, "a complete NetCDF-3 or NetCDF-4 file", f"{file} row (none), column (all): not a readable NetCDF file ({reason}); it may be truncated or corrupt", "error")


def netcdf_not_trajectory(file, column, reason):
    return Issue("NetcdfNotTrajectory", file, None, column, None, 'a CF trajectory file (featureType = "trajectory", longitude, latitude, time)', f"{file} row (none), column {column}: {reason}", "error")


def netcdf_value_invalid(file, row, trajectory, observation, column, value, expected):
    return Issue("NetcdfValueInvalid", file, row, column, value, expected, f"{file} row {row} (trajectory {trajectory}, observation {observation}), column {column}: {quote_value(value)} is not allowed; expected {expected}")


def positions_outside_seasons(file, count):
    return Issue("PositionsOutsideSeasons", file, None, "time", str(count), "times inside the seasons of scenario.json", f"{file} row (several), column time: {count} position(s) fall in months no season of scenario.json covers; they were left out")
