#!/usr/bin/env python3
"""Case mapping of the scripts Strata maps itself, from CPython's str.lower() and str.upper().

Run with: /work/venv/bin/python tests/reference/gen/case_mapping.py
Generated with CPython 3.11.7, whose unicodedata is Unicode 14.0.0 (the
script refuses another version, so the committed files say which one made
them). str.lower() and str.upper() apply Unicode's full case mappings
(UnicodeData.txt plus the unconditional SpecialCasing.txt entries) and, in
lower(), the Final_Sigma rule of Unicode 3.13 (Table 3-17).

Writes:
- tests/reference/fixtures/text/case.json: every code point (decimal keys) in the covered
  ranges whose lower or upper case is not itself, with that mapping, a few
  strings (final sigma, Turkish dotted capital I, sharp s, Vietnamese), and
  the spans the final-sigma rule is exact in with their unassigned code points;
- crates/strata/src/text/case_table.rs: the same mappings packed as runs
  (first code point, count, step, delta) plus the multi-character ones, and
  the Case_Ignorable code points of the ranges the final-sigma rule looks
  at (general categories Mn, Me, Cf, Lm, Sk, and Word_Break MidLetter,
  MidNumLet and Single_Quote, listed below from WordBreakProperty.txt since
  unicodedata has no word-break property).
"""
import json
import os
import sys
import unicodedata

if sys.version_info[:3] != (3, 11, 7) or unicodedata.unidata_version != "14.0.0":
    sys.exit(f"made with CPython 3.11.7 / Unicode 14.0.0; this is {sys.version.split()[0]} / {unicodedata.unidata_version}")

HERE = os.path.dirname(__file__)
FIXTURE = os.path.join(HERE, "..", "fixtures", "text", "case.json")
TABLE = os.path.join(HERE, "..", "..", "..", "crates", "strata", "src", "text", "case_table.rs")

# The covered blocks: Basic Latin, Latin-1 Supplement, Latin Extended-A and
# -B; Greek and Coptic; Cyrillic and Cyrillic Supplement; Armenian; Latin
# Extended Additional; Halfwidth and Fullwidth Forms.
COVERED = [(0x0000, 0x024F), (0x0370, 0x03FF), (0x0400, 0x052F), (0x0530, 0x058F), (0x1E00, 0x1EFF), (0xFF00, 0xFFEF)]
# Where the final-sigma rule's Case_Ignorable test is exact: the covered
# blocks with the combining marks, spacing modifiers, general punctuation
# and variation selectors around them.
IGNORABLE_SPAN = [(0x0000, 0x058F), (0x1AB0, 0x1AFF), (0x1DC0, 0x1EFF), (0x2000, 0x206F), (0x20D0, 0x20FF), (0xFE00, 0xFE2F), (0xFF00, 0xFFEF)]
# WordBreakProperty.txt (Unicode 14.0.0): MidLetter, MidNumLet, Single_Quote.
WORD_BREAK_MID = {0x003A, 0x00B7, 0x0387, 0x055F, 0x05F4, 0x2027, 0xFE13, 0xFE55, 0xFF1A,
                  0x002E, 0x2018, 0x2019, 0x2024, 0xFE52, 0xFF07, 0xFF0E, 0x0027}


def covered():
    for lo, hi in COVERED:
        yield from range(lo, hi + 1)


def ignorable(cp):
    return unicodedata.category(chr(cp)) in ("Mn", "Me", "Cf", "Lm", "Sk") or cp in WORD_BREAK_MID


def runs(mapping):
    """Pack single-character mappings {cp: target} into (first, count, step, delta) runs."""
    cps = sorted(mapping)
    out = []
    i = 0
    while i < len(cps):
        first = cps[i]
        delta = mapping[first] - first
        count = 1
        step = 1
        if i + 1 < len(cps) and cps[i + 1] - first in (1, 2) and mapping[cps[i + 1]] - cps[i + 1] == delta:
            step = cps[i + 1] - first
            while i + count < len(cps) and count < 255 and cps[i + count] == first + count * step and mapping[cps[i + count]] - cps[i + count] == delta:
                count += 1
        out.append((first, count, step, delta))
        i += count
    return out


def main():
    lower, upper = {}, {}
    lower1, upper1, lower_multi, upper_multi = {}, {}, {}, {}
    for cp in covered():
        c = chr(cp)
        for name, got, single, multi in (("lower", c.lower(), lower1, lower_multi), ("upper", c.upper(), upper1, upper_multi)):
            if got == c:
                continue
            (lower if name == "lower" else upper)[str(cp)] = got
            if len(got) == 1:
                single[cp] = ord(got)
            else:
                multi[cp] = got
    strings = ["ΟΔΟΣ", "ΟΔΟΣ ΟΔΟΣ.", "Σ", "ΑΣ'Α", "ΑΣ' ", "İstanbul", "straße", "ŉ ǰ ΐ ΰ և ẖẗẘẙẚ", "Tiếng Việt Nam",
               "ЁЛКА і Ґанок", "Ｆｕｌｌ ｗｉｄｔｈ", "µ ÿ ſ ı ǅ ς", "ΑΣ\u0301", "Α\u0301Σ", "ΑΣ\u200dΒ", "Hello, World"]
    # Code points Unicode 14 leaves unassigned in the final-sigma spans: a
    # later Unicode (Rust's std) may have made them combining marks.
    unassigned = []
    for lo, hi in IGNORABLE_SPAN:
        for cp in range(lo, hi + 1):
            if unicodedata.category(chr(cp)) == "Cn":
                if unassigned and int(unassigned[-1][1]) == cp - 1:
                    unassigned[-1][1] = str(cp)
                else:
                    unassigned.append([str(cp), str(cp)])
    fixture = {
        "source": f"CPython {sys.version.split()[0]} str.lower()/str.upper(), Unicode {unicodedata.unidata_version}",
        "covered": [[str(lo), str(hi)] for lo, hi in COVERED],
        "lower": lower,
        "upper": upper,
        "strings": [[s, s.lower(), s.upper()] for s in strings],
        "sigma_spans": [[str(lo), str(hi)] for lo, hi in IGNORABLE_SPAN],
        "unassigned": unassigned,
    }
    os.makedirs(os.path.dirname(FIXTURE), exist_ok=True)
    with open(FIXTURE, "w", encoding="utf-8") as f:
        json.dump(fixture, f, ensure_ascii=False, indent=0, sort_keys=True)
        f.write("\n")

    def rs_runs(name, mapping):
        lines = [f"pub(super) const {name}: &[(u16, u8, u8, i16)] = &["]
        for first, count, step, delta in runs(mapping):
            assert first <= 0xFFFF and -32768 <= delta <= 32767
            lines.append(f"    (0x{first:04X}, {count}, {step}, {delta}),")
        lines.append("];")
        return lines

    def rs_multi(name, mapping):
        lines = [f"pub(super) const {name}: &[(char, &str)] = &["]
        for cp in sorted(mapping):
            escaped = "".join(f"\\u{{{ord(ch):x}}}" if ord(ch) > 0x7E else ch for ch in mapping[cp])
            lines.append(f"    ('\\u{{{cp:x}}}', \"{escaped}\"),")
        lines.append("];")
        return lines

    ign = []
    for lo, hi in IGNORABLE_SPAN:
        for cp in range(lo, hi + 1):
            if ignorable(cp):
                if ign and ign[-1][1] == cp - 1:
                    ign[-1][1] = cp
                else:
                    ign.append([cp, cp])
    out = [
        f"//! Generated by tests/reference/gen/case_mapping.py from CPython {sys.version.split()[0]}",
        f"//! (Unicode {unicodedata.unidata_version}); do not edit. Runs are (first code point, count,",
        "//! step, delta): code points first, first + step, ... (count of them)",
        "//! map to themselves plus delta.",
        "",
        "/// Single-character lower-case mappings.",
        *rs_runs("LOWER", lower1),
        "",
        "/// Single-character upper-case mappings.",
        *rs_runs("UPPER", upper1),
        "",
        "/// Lower-case mappings to more than one character.",
        *rs_multi("LOWER_MULTI", lower_multi),
        "",
        "/// Upper-case mappings to more than one character.",
        *rs_multi("UPPER_MULTI", upper_multi),
        "",
        "/// Case_Ignorable code points (inclusive ranges) of the spans the final-sigma rule is exact in.",
        "pub(super) const IGNORABLE: &[(u16, u16)] = &[",
        *[f"    (0x{lo:04X}, 0x{hi:04X})," for lo, hi in ign],
        "];",
        "",
    ]
    with open(TABLE, "w", encoding="utf-8") as f:
        f.write("\n".join(out))
    print(f"{len(lower)} lower, {len(upper)} upper mappings; {len(runs(lower1))} + {len(runs(upper1))} runs, {len(ign)} ignorable ranges")


main()
