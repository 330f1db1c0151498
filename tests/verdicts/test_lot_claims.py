"""Claims on a lot: reading the TOML file (every bad file refused with its line) and the verdicts.

The expected verdicts follow from invented lots built for them (direct counts and NumPy);
ANSI C78.377-2017 centres as in shared/REFERENCE_VALUES.md; no other source is involved.
"""

import numpy as np
import pytest

from lampcalc.errors import InputError
from lampcalc.verdicts.lot import lot_statistics
from lampcalc.verdicts.lot_claims import STEPS_NOTES, check_lot_claims, read_lot_claims

ANSI_3000 = (0.4339, 0.4033)  # REFERENCE_VALUES.md, ANSI C78.377-2017 3000 K centre

GOOD = """# a supplier's statements
lampcalc_lot_claims = 1
product = "QF-TEST"
nominal_cct_K = 3000

[[claim]]
text = "95 % within 3 steps"
within_steps = 3
share_at_least_percent = 95

[[claim]]
quantity = "ra_mean"
at_least = 90

[[claim]]
quantity = "ra_min"
at_least = 80

[[claim]]
quantity = "max_pairwise_delta_uv_prime"
at_most = 0.004

[[claim]]
inside_nominal_cct_K = 3000
share_at_least_percent = 100
"""


def _lot(invent, xy, nominal=3000, **columns):
    return lot_statistics(invent(np.asarray(xy, dtype=float), **columns), nominal_cct_K=nominal)


def test_reads_a_good_file(write):
    claims = read_lot_claims(write("claims.toml", GOOD))
    assert claims.product == "QF-TEST" and claims.nominal_cct_K == 3000
    assert [c.kind for c in claims.claims] == ["within_steps", "quantity", "quantity", "quantity", "inside_quadrangle"]
    assert [c.line for c in claims.claims] == [6, 11, 15, 19, 23]


def test_verdicts_against_direct_counts(invent, write):
    # Ten samples at the 3000 K centre and two 5 steps away along x (F3000 metric, from memory: 39e4·dx² = 25).
    dx = 5.0 / np.sqrt(39e4)
    xy = np.array([ANSI_3000] * 10 + [(ANSI_3000[0] + dx, ANSI_3000[1])] * 2)
    ra = np.array([92.0] * 11 + [79.0])
    lot = _lot(invent, xy, ra=ra)
    verdicts = check_lot_claims(read_lot_claims(write("claims.toml", GOOD)), lot)
    share, mean, low, pairwise, inside = verdicts.checks
    assert share["measured"] == pytest.approx(100 * 10 / 12) and share["pass"] is False  # 10 of 12 within 3 steps
    assert share["margin"] == pytest.approx(100 * 10 / 12 - 95)
    assert "10 of 12 samples within 3 steps" in share["note"] and STEPS_NOTES["ellipse"] in share["note"]
    assert mean["measured"] == pytest.approx(np.mean(ra)) and mean["pass"] is bool(np.mean(ra) >= 90)
    assert low["measured"] == 79.0 and low["margin"] == -1.0 and low["pass"] is False
    import colour

    apart = np.hypot(*(colour.xy_to_Luv_uv(xy[0]) - colour.xy_to_Luv_uv(xy[-1])))  # colour-science
    assert pairwise["measured"] == pytest.approx(apart, rel=1e-9) and apart > 0.004 and pairwise["pass"] is False
    assert pairwise["margin"] == pytest.approx(0.004 - apart)
    # x + 0.008 at the centre's y stays inside the 3000 K quadrangle (its corners span x 0.415-0.456, REFERENCE_VALUES.md)
    assert inside["measured"] == pytest.approx(100.0) and inside["pass"] is True
    assert not verdicts.all_hold
    assert verdicts.summary() == "5 lot claims: 2 met, 3 not met, 0 not evaluated"  # the shared verdict words


def test_doubtful_or_missing_values_decide_nothing(invent, write):
    xy = [ANSI_3000] * 4
    path = write("claims.toml", "lampcalc_lot_claims = 1\n[[claim]]\nquantity = 'ra_mean'\nat_least = 10\n"
                 "[[claim]]\nquantity = 'rf_mean'\nat_least = 10\n")
    flags = ((), ("cri_outside_validity",), (), ())
    lot = _lot(invent, xy, nominal=None, flags=flags, rf=np.array([80.0, np.nan, 81.0, 82.0]))
    ra, rf = check_lot_claims(read_lot_claims(path), lot).checks
    assert ra["pass"] is None and "outside the method's validity" in ra["note"]
    assert rf["pass"] is None and "missing for some samples" in rf["note"]


def test_a_lot_with_no_centre_cannot_show_a_steps_claim(invent, write):
    path = write("claims.toml", "lampcalc_lot_claims = 1\n[[claim]]\nwithin_steps = 3\nshare_at_least_percent = 50\n")
    lot = _lot(invent, [[0.30, 0.60], [0.31, 0.61], [0.30, 0.62]], nominal=None)
    (check,) = check_lot_claims(read_lot_claims(path), lot).checks
    assert check["pass"] is None and "no centre" in check["note"]


def test_centre_of_the_claims_and_of_the_lot_must_agree(invent, write):
    lot = _lot(invent, [ANSI_3000] * 3, nominal=3500)
    with pytest.raises(InputError, match="nominal 3000 K, but the lot's steps count from 3500 K"):
        check_lot_claims(read_lot_claims(write("claims.toml", GOOD)), lot)


BAD = {
    "not_toml": ("lampcalc_lot_claims = 1\n[[claim]\n", "not a valid TOML lot claims file"),
    "no_format": ("[[claim]]\nquantity = 'ra_mean'\nat_least = 80\n", "not a lampcalc lot claims file"),
    "version_2": ("lampcalc_lot_claims = 2\n[[claim]]\nquantity = 'ra_mean'\nat_least = 80\n", "not a lampcalc lot claims"),
    "unknown_setting": ("lampcalc_lot_claims = 1\nsupplier = 'x'\n", "unknown setting 'supplier'"),
    "no_claim": ("lampcalc_lot_claims = 1\nproduct = 'x'\n", "no claim: add at least one [[claim]]"),
    "two_kinds": ("lampcalc_lot_claims = 1\n[[claim]]\nquantity = 'ra_mean'\nwithin_steps = 3\n",
                  "line 2 (claim 1): a claim needs exactly one of"),
    "unknown_key": ("lampcalc_lot_claims = 1\n\n[[claim]]\nquantity = 'ra_mean'\natleast = 80\n",
                    "line 3 (claim 1): unknown key 'atleast' in a quantity claim"),
    "misspelt": ("lampcalc_lot_claims = 1\n[[claim]]\nquantity = 'ra_maen'\nat_least = 80\n", "did you mean 'ra_mean'"),
    "both_bounds": ("lampcalc_lot_claims = 1\n[[claim]]\nquantity = 'ra_mean'\nat_least = 80\nat_most = 99\n",
                    "give exactly one of at_least, at_most"),
    "no_bound": ("lampcalc_lot_claims = 1\n[[claim]]\nquantity = 'ra_mean'\n", "give exactly one of at_least, at_most"),
    "no_share": ("lampcalc_lot_claims = 1\n[[claim]]\nwithin_steps = 3\n", "has no 'share_at_least_percent'"),
    "boolean": ("lampcalc_lot_claims = 1\n[[claim]]\nquantity = 'ra_mean'\nat_least = true\n", "must be a finite number"),
    "nan": ("lampcalc_lot_claims = 1\n[[claim]]\nquantity = 'ra_mean'\nat_least = nan\n", "must be a finite number"),
    "share_over_100": ("lampcalc_lot_claims = 1\n[[claim]]\nwithin_steps = 3\nshare_at_least_percent = 120\n",
                       "share_at_least_percent = 120 is outside 0–100"),
    "nominal_1800": ("lampcalc_lot_claims = 1\nnominal_cct_K = 1800\n[[claim]]\nquantity = 'ra_mean'\nat_least = 80\n",
                     "nominal_cct_K: nominal CCT 1800 K"),
    "inside_9000": ("lampcalc_lot_claims = 1\n[[claim]]\ninside_nominal_cct_K = 9000\nshare_at_least_percent = 100\n",
                    "line 2 (claim 1): nominal CCT 9000 K"),
    "text_number": ("lampcalc_lot_claims = 1\n[[claim]]\ntext = 3\nquantity = 'ra_mean'\nat_least = 80\n",
                    "text must be a string"),
    "claim_not_table": ("lampcalc_lot_claims = 1\nclaim = [1, 2]\n", "claim 1: a claim must be a table"),
}


@pytest.mark.parametrize("case", sorted(BAD))
def test_bad_files_are_refused_with_their_line(write, case):
    text, message = BAD[case]
    path = write("claims.toml", text)
    with pytest.raises(InputError) as err:
        read_lot_claims(path)
    assert str(err.value).startswith(str(path)) and message in str(err.value)
    assert "\n" not in str(err.value)


def test_unreadable_files(write, tmp_path):
    with pytest.raises(InputError, match="cannot be read"):
        read_lot_claims(write("claims.toml", b"\xff\xfe\x00bad", mode="wb"))
    with pytest.raises(InputError, match="cannot be read"):
        read_lot_claims(tmp_path / "missing.toml")
