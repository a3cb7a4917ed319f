#!/usr/bin/env python3
"""Arrow IPC fixtures written by pyarrow, with the values Strata should read.

Run with: Python 3.11.7, pyarrow 26.0.1, numpy 2.4.6 (for float16; zoneinfo
from the system tz database).
    /work/venv/bin/python tests/reference/gen/arrow_fixtures.py

Writes to tests/reference/fixtures/arrow/:
  types.arrow          IPC file format, 7 rows in 3 record batches
  types.arrows         the same table, IPC stream format
  empty.arrows         stream with a schema and no batches
  delta.arrows         stream whose dictionary grows by delta batches
                       (expected values under "delta" in types.json)
  compressed_lz4.arrow file format with LZ4 body compression (Strata's
                       reader is built without codecs: a clean error expected)
  types.json           per column: the Arrow type pyarrow wrote, the type
                       Strata normalises it to, and the expected values
                       (dates as days since 1970-01-01, timestamps as
                       milliseconds since the epoch in UTC, floored; a null is
                       null; "dropped" for columns Strata leaves out).
Expected timestamps come from Python's datetime.timestamp() of the aware
datetimes the column was built from, not from pyarrow.
"""
import datetime as dt
import decimal
import json
import os
import platform
from zoneinfo import ZoneInfo

import numpy as np
import pyarrow as pa
import pyarrow.ipc as ipc

OUT = os.path.join(os.path.dirname(__file__), "..", "fixtures", "arrow")
UTC = dt.timezone.utc
NY = ZoneInfo("America/New_York")
EPOCH = dt.date(1970, 1, 1)
KEYS, DICT = [1, 0, None, 1, 1, 0, 1], [2.5, -1.0]


def ms(t):
    # Exact: microsecond datetimes, integer arithmetic.
    delta = t - dt.datetime(1970, 1, 1, tzinfo=UTC)
    return (delta.days * 86_400_000_000 + delta.seconds * 1_000_000 + delta.microseconds) // 1000


def main():
    ny = [
        dt.datetime(2024, 3, 10, 1, 59, 59, tzinfo=NY),
        dt.datetime(2024, 3, 10, 3, 0, 0, tzinfo=NY),
        None,
        dt.datetime(1969, 7, 20, 20, 17, 40, tzinfo=NY),
        dt.datetime(2024, 11, 3, 1, 30, 0, tzinfo=NY),
        dt.datetime(2000, 1, 1, tzinfo=NY),
        dt.datetime(1900, 1, 1, 12, tzinfo=NY),
    ]
    utc_us = [
        dt.datetime(2024, 5, 6, 7, 8, 9, 123456, tzinfo=UTC),
        None,
        dt.datetime(1969, 12, 31, 23, 59, 59, 999999, tzinfo=UTC),
        dt.datetime(1970, 1, 1, tzinfo=UTC),
        dt.datetime(2038, 1, 19, 3, 14, 8, tzinfo=UTC),
        dt.datetime(1600, 2, 29, 12, tzinfo=UTC),
        dt.datetime(9999, 12, 31, 23, 59, 59, 999000, tzinfo=UTC),
    ]
    # Naive nanosecond values, some before the epoch (floor to ms).
    ns_raw = [1_714_979_289_123_456_789, -1, -1_000_001, None, 0, 999_999, -86_400_000_000_001]
    dates = [dt.date(2024, 2, 29), dt.date(1969, 12, 31), None, dt.date(1, 1, 1), dt.date(9999, 12, 31), EPOCH, dt.date(1900, 3, 1)]
    words = ["north", None, "Zürich", "東京", "", "north", "\U0001F600"]
    cols = {
        "i32": pa.array([1, None, -2_147_483_648, 2_147_483_647, 0, 5, -5], pa.int32()),
        "i64": pa.array([9_223_372_036_854_775_807, -9_223_372_036_854_775_808, None, 1, 2, 3, 4], pa.int64()),
        "u8": pa.array([0, 255, None, 1, 2, 3, 4], pa.uint8()),
        "u64_big": pa.array([0, 18_446_744_073_709_551_615, None, 9_223_372_036_854_775_808, 1, 2, 3], pa.uint64()),
        "f32": pa.array([1.5, -0.25, None, 3.0, 1e-3, float("inf"), 16777217.0], pa.float32()),
        "f64": pa.array([0.1, None, -1e300, 5e-324, 2.5, -0.0, 1.0], pa.float64()),
        "flag": pa.array([True, False, None, True, True, False, None], pa.bool_()),
        "text": pa.array(words, pa.string()),
        "large_text": pa.array(words, pa.large_string()),
        "view_text": pa.array(words, pa.string_view()),
        "dict_text": pa.array(words, pa.string()).dictionary_encode(),
        "dict_int16": pa.DictionaryArray.from_arrays(pa.array([0, 1, None, 1, 0, 2, 2], pa.int16()), pa.array(["a", "b", "c"])),
        "day": pa.array(dates, pa.date32()),
        "day64": pa.array(dates, pa.date64()),
        "ts_s_new_york": pa.array(ny, pa.timestamp("s", tz="America/New_York")),
        "ts_us_utc": pa.array(utc_us, pa.timestamp("us", tz="UTC")),
        "ts_ns_naive": pa.array(ns_raw, pa.timestamp("ns")),
        "ts_ms_offset": pa.array(utc_us, pa.timestamp("ms", tz="+05:30")),
        "price": pa.array([decimal.Decimal("12.34"), decimal.Decimal("-0.01"), None, decimal.Decimal("99999999.99"), decimal.Decimal("0"), decimal.Decimal("1.5"), decimal.Decimal("-7")], pa.decimal128(10, 2)),
        "blob": pa.array([b"\x00", b"x", None, b"", b"yz", b"1", b"2"], pa.binary()),
        "nothing": pa.nulls(7),
        # Narrow integers widen; float16 widens exactly.
        "i8": pa.array([-128, 127, None, 0, 1, -1, 5], pa.int8()),
        "i16": pa.array([-32768, 32767, None, 0, 1, -1, 5], pa.int16()),
        "u16": pa.array([0, 65535, None, 1, 2, 3, 4], pa.uint16()),
        "u32": pa.array([0, 4_294_967_295, None, 1, 2, 3, 4], pa.uint32()),
        "u64_small": pa.array([0, 9_223_372_036_854_775_807, None, 1, 2, 3, 4], pa.uint64()),
        "f16": pa.array(np.array([1.5, -2.0, 0, 65504.0, 0.000061035156, 2.0**-24, 0.1], dtype=np.float16), pa.float16(),
                        mask=np.array([False, False, True, False, False, False, False])),
        "dict_u8_numbers": pa.DictionaryArray.from_arrays(pa.array(KEYS, pa.uint8()), pa.array(DICT)),
        # Types left out, of every buffer layout, between columns that are
        # read (each one must be stepped over exactly).
        "clock": pa.array([1, 2, None, 4, 5, 6, 7], pa.time32("s")),
        "list": pa.array([[1], None, [], [2, 3], [4], [5, 6, 7], []], pa.list_(pa.int32())),
        "wait": pa.array([1, 2, None, 4, 5, 6, 7], pa.duration("ms")),
        "big_decimal": pa.array([decimal.Decimal("1.5")] * 7, pa.decimal256(40, 1)),
        "large_blob": pa.array([b"a", None, b"", b"b", b"c", b"d", b"e"], pa.large_binary()),
        "view_blob": pa.array([b"short", None, b"a value longer than twelve bytes", b"", b"x", b"y", b"z"], pa.binary_view()),
        "pair": pa.array([{"a": 1, "b": "x"}, None, {"a": 2, "b": None}, {"a": 3, "b": "y"}, {"a": 4, "b": "z"}, {"a": 5, "b": ""}, {"a": 6, "b": "w"}]),
        "after_skips": pa.array(["a value longer than twelve bytes", "b", None, "short", "", "long enough to sit in a data buffer", "z"], pa.string_view()),
    }
    table = pa.table(cols)

    def text_values():
        return words

    f32 = [None if v is None else float(v) for v in cols["f32"].to_pylist()]
    expected = {
        "pyarrow": pa.__version__,
        "python": platform.python_version(),
        "rows": 7,
        "columns": {
            "i32": {"type": "int64", "values": cols["i32"].to_pylist()},
            "i64": {"type": "int64", "values": cols["i64"].to_pylist()},
            "u8": {"type": "int64", "values": cols["u8"].to_pylist()},
            "u64_big": {"type": "float64", "values": [None if v is None else float(v) for v in cols["u64_big"].to_pylist()]},
            "f32": {"type": "float64", "values": ["inf" if v == float("inf") else v for v in f32]},
            "f64": {"type": "float64", "values": cols["f64"].to_pylist()},
            "flag": {"type": "bool", "values": cols["flag"].to_pylist()},
            "text": {"type": "utf8", "values": text_values()},
            "large_text": {"type": "utf8", "values": text_values()},
            "view_text": {"type": "utf8", "values": text_values()},
            "dict_text": {"type": "utf8", "values": text_values()},
            "dict_int16": {"type": "utf8", "values": ["a", "b", None, "b", "a", "c", "c"]},
            "day": {"type": "date32", "values": [None if d is None else (d - EPOCH).days for d in dates]},
            "day64": {"type": "date32", "values": [None if d is None else (d - EPOCH).days for d in dates]},
            "ts_s_new_york": {"type": "timestamp_ms_utc", "values": [None if t is None else ms(t) for t in ny]},
            "ts_us_utc": {"type": "timestamp_ms_utc", "values": [None if t is None else ms(t) for t in utc_us]},
            "ts_ns_naive": {"type": "timestamp_ms_utc", "values": [None if v is None else v // 1_000_000 for v in ns_raw]},
            "ts_ms_offset": {"type": "timestamp_ms_utc", "values": [None if t is None else ms(t) for t in utc_us]},
            "price": {"type": "float64", "values": [None if v is None else float(v) for v in cols["price"].to_pylist()]},
            "blob": {"type": "dropped"},
            "nothing": {"type": "utf8", "values": [None] * 7},
            "i8": {"type": "int64", "values": cols["i8"].to_pylist()},
            "i16": {"type": "int64", "values": cols["i16"].to_pylist()},
            "u16": {"type": "int64", "values": cols["u16"].to_pylist()},
            "u32": {"type": "int64", "values": cols["u32"].to_pylist()},
            "u64_small": {"type": "int64", "values": cols["u64_small"].to_pylist()},
            "f16": {"type": "float64", "values": [None if v is None else float(v) for v in cols["f16"].to_pylist()]},
            "dict_u8_numbers": {"type": "float64", "values": [None if k is None else DICT[k] for k in KEYS]},
            "clock": {"type": "dropped"},
            "list": {"type": "dropped"},
            "wait": {"type": "dropped"},
            "big_decimal": {"type": "dropped"},
            "large_blob": {"type": "dropped"},
            "view_blob": {"type": "dropped"},
            "pair": {"type": "dropped"},
            "after_skips": {"type": "utf8", "values": cols["after_skips"].to_pylist()},
        },
    }

    os.makedirs(OUT, exist_ok=True)
    batches = table.combine_chunks().to_batches(max_chunksize=3)
    assert len(batches) == 3
    with ipc.new_file(os.path.join(OUT, "types.arrow"), table.schema) as w:
        for b in batches:
            w.write_batch(b)
    with ipc.new_stream(os.path.join(OUT, "types.arrows"), table.schema) as w:
        for b in batches:
            w.write_batch(b)
    with ipc.new_stream(os.path.join(OUT, "empty.arrows"), pa.schema([("x", pa.float64()), ("label", pa.string())])) as w:
        pass
    # A dictionary sent in parts: the second batch's dictionary adds values
    # as a delta (pyarrow's emit_dictionary_deltas).
    first = pa.array(["north", "south", None]).dictionary_encode()
    second = pa.DictionaryArray.from_arrays(pa.array([2, 0, None, 3], pa.int32()), pa.array(["north", "south", "east", "west"]))
    dschema = pa.schema([("place", first.type)])
    with ipc.new_stream(os.path.join(OUT, "delta.arrows"), dschema, options=ipc.IpcWriteOptions(emit_dictionary_deltas=True)) as w:
        w.write_batch(pa.record_batch([first], schema=dschema))
        w.write_batch(pa.record_batch([second], schema=dschema))
    back = ipc.open_stream(os.path.join(OUT, "delta.arrows")).read_all()
    expected["delta"] = {"place": back.column("place").to_pylist()}
    assert expected["delta"]["place"] == ["north", "south", None, "east", "north", None, "west"], expected["delta"]
    small = pa.table({"x": pa.array([1.0, 2.0, 3.0])})
    with ipc.new_file(os.path.join(OUT, "compressed_lz4.arrow"), small.schema, options=ipc.IpcWriteOptions(compression="lz4")) as w:
        w.write_table(small)
    # Round trip through pyarrow itself, as a check on the fixture.
    back = ipc.open_file(os.path.join(OUT, "types.arrow")).read_all()
    assert back.equals(table), "pyarrow round trip"
    with open(os.path.join(OUT, "types.json"), "w", encoding="utf-8") as f:
        json.dump(expected, f, ensure_ascii=False, indent=1)
        f.write("\n")
    print("wrote arrow fixtures with pyarrow", pa.__version__)


if __name__ == "__main__":
    main()
