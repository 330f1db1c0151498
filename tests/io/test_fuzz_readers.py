"""Fuzzing the readers: malformed variants of valid files give a batch or one InputError, fast.

Each example starts from a valid file (text tables in several forms, lampcalc JSON, a
workbook, a claims file) and mutates it: truncation, byte flips, deletions, repeats,
insertions (numbers beyond float range, huge integers, long lines and cells, deep nesting,
quotes, separators, zero bytes) and re-encoding (UTF-16). The only exception allowed out of
a reader is lampcalc's InputError, with a one-line message naming the file; each call must
finish well within a second. Internal robustness checks: no published source is involved.
"""

import io
import json
import time

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from lampcalc.errors import InputError
from lampcalc.io.spectrum_files import read_spectra
from lampcalc.spectra.batch import SpectralBatch
from lampcalc.verdicts.claims import read_claims

WL = list(range(380, 781, 20))
ROWS = [(w, 1 + w / 1000, 2 - w / 1000) for w in WL]
TEXT_SEEDS = [
    ("nm,QF-A,QF-B\n" + "\n".join(f"{w},{a:.4f},{b:.4f}" for w, a, b in ROWS) + "\n").encode(),
    ("# quantity: flux\nunit: mW/nm\nWavelength [nm];QF-A;QF-B@30deg\n"
     + "\n".join(f"{w};{a:.4f};{b:.4f}".replace(".", ",") for w, a, b in ROWS) + "\nTotal;1;2\n").encode(),
    ("lamp," + ",".join(map(str, WL)) + "\nQF-A," + ",".join(f'"{a:.3f}"'.replace(".", ",") for _, a, _ in ROWS)
     + "\n").encode(),
    ("\n".join(f"{w}\t{a:.4f}" for w, a, _ in ROWS) + "\n").encode("utf-16"),
]
JSON_SEED = json.dumps(
    {"lampcalc_spectra": 1, "quantity": "flux", "wavelength_nm": WL,
     "lamps": [{"name": "QF-A", "values": [a for _, a, _ in ROWS], "electrical_W": 9.5, "angle_deg": 30}]}
).encode()
CLAIMS_SEEDS = [
    b"lamp,nominal_cct_K,max_sdcm_steps,min_ra,min_r9\nQF-A,3000,6,80,-10\nQF-B,4000,,90,\n",
    "lamp;min_ra;electrical_W\nqf-a;80,5;9,5\n".encode("utf-16"),
]
TOKENS = [
    b"1e999", b"-1e400", b"9" * 400, b"9" * 5000, b"nan", b"inf", b"-", b'"', b"'", b"\n", b"\r", b";", b",",
    b"\t", b" ", b"\x00", b"\xff\xfe", "µ".encode(), b"\xb5", b"[" * 3000, b"{" * 3000, b" " * 100_000 + b"x",
    b"A" * 200_000, b"@30deg", b"[mW/nm]", b"(W/(sr nm))", b"1,5", b"null", b"{}", b"[]", b"true", b"#",
    b"quantity: lumens\n", b"electrical_W: 0\n", b"angle_deg: 1 2 3\n", b"1_000", b"0x10", "\u0663".encode(),
]


@st.composite
def mutated(draw, seeds):
    raw = draw(st.sampled_from(seeds))
    for _ in range(draw(st.integers(1, 3))):
        i = draw(st.integers(0, len(raw)))
        j = draw(st.integers(i, min(len(raw), i + 200)))
        kind = draw(st.sampled_from(["truncate", "flip", "delete", "repeat", "insert", "insert", "utf16"]))
        if kind == "truncate":
            raw = raw[:i]
        elif kind == "flip" and i < len(raw):
            raw = raw[:i] + bytes([draw(st.integers(0, 255))]) + raw[i + 1 :]
        elif kind == "delete":
            raw = raw[:i] + raw[j:]
        elif kind == "repeat":
            raw = raw[:j] + raw[i:j] * draw(st.integers(1, 50)) + raw[j:]
        elif kind == "insert":
            raw = raw[:i] + draw(st.sampled_from(TOKENS)) + raw[i:]
        elif kind == "utf16":
            raw = raw.decode("latin-1").encode(draw(st.sampled_from(["utf-16", "utf-16-le", "utf-16-be"])))
    return raw


def _read_within(reader, path, limit_s=1.0):
    start = time.perf_counter()
    try:
        result = reader(path)
    except InputError as err:
        message = str(err)
        assert message.startswith(str(path)) and "\n" not in message, message
        result = None
    elapsed = time.perf_counter() - start
    assert elapsed < limit_s, f"{elapsed:.2f} s"
    return result


def fuzz(examples):
    return settings(max_examples=examples, deadline=None, suppress_health_check=[
        HealthCheck.too_slow, HealthCheck.data_too_large, HealthCheck.function_scoped_fixture])


@fuzz(1200)
@given(raw=mutated(TEXT_SEEDS), suffix=st.sampled_from([".csv", ".txt", ".tsv"]))
def test_text_reader(tmp_path, raw, suffix):
    path = tmp_path / f"fuzz{suffix}"
    path.write_bytes(raw)
    batch = _read_within(read_spectra, path)
    assert batch is None or isinstance(batch, SpectralBatch)


@fuzz(700)
@given(raw=mutated([JSON_SEED]))
def test_json_reader(tmp_path, raw):
    path = tmp_path / "fuzz.json"
    path.write_bytes(raw)
    batch = _read_within(read_spectra, path)
    assert batch is None or isinstance(batch, SpectralBatch)


@fuzz(700)
@given(raw=mutated(CLAIMS_SEEDS))
def test_claims_reader(tmp_path, raw):
    path = tmp_path / "claims.csv"
    path.write_bytes(raw)
    claims = _read_within(read_claims, path)
    assert claims is None or all(c.lamp for c in claims.values())


def _workbook(rows):
    import openpyxl

    book = openpyxl.Workbook()
    for row in rows:
        book.active.append(row)
    buffer = io.BytesIO()
    book.save(buffer)
    return buffer.getvalue()


CELLS = st.one_of(
    st.floats(allow_nan=True, allow_infinity=True), st.integers(-(10**20), 10**20), st.none(),
    st.sampled_from(["", "nm", "QF-A", "QF-B [mW/nm]", "quantity", "flux", "1,5", "abc", "@0deg", "=1+1", "1e999"]),
)


@fuzz(120)
@given(
    edits=st.lists(st.tuples(st.integers(0, len(WL)), st.integers(0, 3), CELLS), max_size=4),
    cut=st.one_of(st.none(), st.integers(0, 6000)),
)
def test_xlsx_reader(tmp_path, edits, cut):
    rows = [["quantity", "flux"], ["nm", "QF-A [mW/nm]", "QF-B"], *([w, a, b] for w, a, b in ROWS)]
    for r, c, value in edits:
        row = rows[min(r, len(rows) - 1)]
        row[min(c, len(row) - 1)] = value
    raw = _workbook(rows)
    path = tmp_path / "fuzz.xlsx"
    path.write_bytes(raw if cut is None else raw[:cut])
    batch = _read_within(read_spectra, path, limit_s=2.0)
    assert batch is None or isinstance(batch, SpectralBatch)


@pytest.mark.parametrize("seed", TEXT_SEEDS + [JSON_SEED])
def test_seeds_are_valid(tmp_path, seed):
    # The fuzz starts from files that read: otherwise it would only test the first refusal.
    path = tmp_path / ("seed.json" if seed is JSON_SEED else "seed.csv")
    path.write_bytes(seed)
    assert read_spectra(path).n_lamps >= 1
