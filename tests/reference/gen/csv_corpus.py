#!/usr/bin/env python3
"""Awkward CSV corpus, with the cells Python's `csv` module reads from each.

Run with: Python 3.11.7, standard library `csv` (no third-party packages).
    /work/venv/bin/python tests/reference/gen/csv_corpus.py

For every case this writes `tests/reference/fixtures/csv/<name>.csv` (the
exact input bytes) and `<name>.json`:
    {"python": "3.11.7", "delimiter": ",", "rows": [[...], ...]}
or, where Python's strict reader stops with "unexpected end of data" (a
quoted field never closed), {"error": "unexpected end of data", ...}.

Python reads with open(newline='', encoding='utf-8-sig') and
csv.reader(delimiter=d) (the default dialect: quotechar '"', doublequote on).
Python yields an empty list for a blank line; the file keeps those as []
and the Rust test skips them, because Strata (like csv-core) skips blank
lines. Some cases also carry "typed": per column, the type a reader should
infer and the values Python computes for it (int(), float(),
date.fromisoformat, datetime.fromisoformat), dates as days since
1970-01-01 and date-times as milliseconds since the epoch, UTC.
"""
import csv
import datetime as dt
import json
import os
import platform
import random

OUT = os.path.join(os.path.dirname(__file__), "..", "fixtures", "csv")

CASES = {}


def case(name, data, delimiter=",", typed=None):
    CASES[name] = (data if isinstance(data, bytes) else data.encode("utf-8"), delimiter, typed)


# RFC 4180 (Shafranovich 2005), section 2, the examples of rules 1-7.
case("rfc4180_rule1_crlf", "aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n")
case("rfc4180_rule2_no_final_break", "aaa,bbb,ccc\r\nzzz,yyy,xxx")
case("rfc4180_rule3_header", "field_name,field_name,field_name\r\naaa,bbb,ccc\r\nzzz,yyy,xxx\r\n")
case("rfc4180_rule5_quoted", '"aaa","bbb","ccc"\r\nzzz,yyy,xxx')
case("rfc4180_rule6_breaks_in_quotes", '"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx')
case("rfc4180_rule7_doubled_quotes", '"aaa","b""bb","ccc"')
# Line endings.
case("lf_only", "a,b\n1,2\n3,4\n")
case("lone_cr", "a,b\r1,2\r3,4\r")
case("mixed_endings", "a,b\r\n1,2\n3,4\r5,6")
case("no_final_newline", "a,b\n1,2")
case("blank_lines_between", "a,b\n\n1,2\n\n\n3,4\n\n")
case("crlf_blank_lines", "a,b\r\n\r\n1,2\r\n\r\n")
# Quoting.
case("quoted_delimiters", 'name,note\n"Smith, J","a,b,c"\n"x",","\n')
case("quoted_newlines_lf", 'id,text\n1,"line one\nline two"\n2,"x"\n')
case("quoted_lone_cr", 'id,text\r\n1,"a\rb"\r\n')
case("quoted_empty", 'a,b\n"",""\n"",x\n')
case("only_doubled_quote", 'a\n""""\n"""x"""\n')
case("quote_inside_unquoted", 'a,b\nfive"inch,x\nab",y\n')
case("text_after_closing_quote", 'a,b\n"ab"cd,e\n"x"" y"z,w\n')
case("space_before_quote", 'a,b\n "q",r\n')
case("quoted_header", '"first name","last, name"\nAda,Lovelace\n')
case("quoted_crlf_mix", '"a\r\nb","c\nd"\r\n"e",f\n')
# Empty fields.
case("empty_fields", "a,b,c\n,,\n1,,3\n,2,\n")
case("trailing_delimiter", "a,b,\n1,2,\n3,4,\n")
case("header_only", "a,b,c\n")
case("whitespace_cells", "a,b\n  1 , x \n\t2\t,y\n")
# Encoding.
case("utf8_bom", "\ufeffa,b\n1,2\n")
case("multibyte", "city,note\nZürich,naïve café\n東京,\U0001F600 smile\nΑθήνα,\"Ελλάδα, ναι\"\n")
case("nul_byte", b"a,b\nx\x00y,z\n")
# Other delimiters.
case("semicolon", 'a;b;c\n1;"2;5";3\n4;5;6\n', delimiter=";")
case("tab", 'a\tb\n"x\ty"\t2\n3\t4\n', delimiter="\t")
case("pipe", "a|b\n1|2\n\"3|4\"|5\n", delimiter="|")
# Size.
random.seed(20261201)
long_text = "".join(random.choice("abc ,\"\n") for _ in range(20000))
case("long_field", "a,b\n1," + '"' + long_text.replace('"', '""') + '"\n2,short\n')
case("many_columns", ",".join(f"c{i}" for i in range(300)) + "\n" + ",".join(str(i) for i in range(300)) + "\n")
case("many_rows", "i,sq\n" + "".join(f"{i},{i*i}\n" for i in range(3000)), typed={"i": "int64", "sq": "int64"})
# Unterminated quote: Python's strict reader reports it; Strata too.
case("unterminated_quote", 'a,b\n1,"never closed\n2,3\n')
case("unterminated_quote_last", 'a,b\n1,"x')
# Typed values.
case(
    "typed_numbers",
    "i,f,neg,exp\n1,1.5,-3,1e3\n007,-.25,+4,2.5E-3\n,0.1,NA,-1e-300\n9223372036854775807,3,0,12\n",
    typed={"i": "int64", "f": "float64", "neg": "int64", "exp": "float64"},
)
case(
    "typed_dates",
    "d,t,flag\n2024-02-29,2024-05-06T07:08:09Z,true\n1969-12-31,2024-05-06 09:08:09.250+02:00,False\n,2000-01-01T00:00,\n1900-03-01,1999-12-31T23:59:59-05:30,TRUE\n",
    typed={"d": "date32", "t": "timestamp_ms_utc", "flag": "bool"},
)
case(
    "typed_semicolon_text",
    'name;value\n"a;b";1\nN/A;2\n-;3\nnull;4\n',
    delimiter=";",
    typed={"name": "utf8", "value": "int64"},
)

NULLS = {"", "NA", "N/A", "null", "NULL", "-"}
EPOCH = dt.date(1970, 1, 1)


def typed_value(kind, cell):
    cell = cell.strip(" \t")
    if cell in NULLS:
        return None
    if kind == "int64":
        return int(cell)
    if kind == "float64":
        return float(cell)
    if kind == "bool":
        return {"true": True, "false": False}[cell.lower()]
    if kind == "date32":
        return (dt.date.fromisoformat(cell) - EPOCH).days
    if kind == "timestamp_ms_utc":
        t = dt.datetime.fromisoformat(cell)
        if t.tzinfo is None:
            t = t.replace(tzinfo=dt.timezone.utc)
        return round(t.timestamp() * 1000)
    if kind == "utf8":
        return cell
    raise ValueError(kind)


def main():
    os.makedirs(OUT, exist_ok=True)
    version = platform.python_version()
    for name, (data, delimiter, typed) in CASES.items():
        path = os.path.join(OUT, name + ".csv")
        with open(path, "wb") as f:
            f.write(data)
        expected = {"python": version, "module": "csv", "delimiter": delimiter}
        try:
            with open(path, newline="", encoding="utf-8-sig") as f:
                list(csv.reader(f, delimiter=delimiter, strict=True))
            strict_error = None
        except csv.Error as e:
            strict_error = str(e)
        if strict_error == "unexpected end of data":
            expected["error"] = strict_error
        else:
            with open(path, newline="", encoding="utf-8-sig") as f:
                rows = list(csv.reader(f, delimiter=delimiter))
            expected["rows"] = rows
            if typed:
                header = rows[0]
                body = [r for r in rows[1:] if r]
                expected["typed"] = {
                    col: {"type": kind, "values": [typed_value(kind, r[header.index(col)]) for r in body]}
                    for col, kind in typed.items()
                }
        with open(os.path.join(OUT, name + ".json"), "w", encoding="utf-8") as f:
            json.dump(expected, f, ensure_ascii=False, indent=None)
            f.write("\n")
    print(f"wrote {len(CASES)} cases with Python {version}")


if __name__ == "__main__":
    main()
