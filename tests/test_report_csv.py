"""The beam and diff CSV tables: unit suffixes, unit conversion, outcomes."""

from __future__ import annotations

import io
import re

import pandas as pd
import pytest
import result_fixtures as rf

from ifccheck.report.csv_out import (
    BEAM_COLUMNS,
    DIFF_COLUMNS,
    beams_csv,
    diff_csv,
    write_beams_csv,
    write_diff_csv,
)
from ifccheck.report.json_out import results_document

# NIST SP 811 conversion factors
FT = 0.3048  # m
KIP = 4448.2216152605  # N
KSI = 6.894757293168e6  # Pa
KIP_FT = KIP * FT / 1000  # kN·m per kip-ft
IN = 0.0254  # m


def _frame(result, units: str) -> pd.DataFrame:
    return pd.read_csv(io.StringIO(beams_csv(result, units)), keep_default_na=False, na_values=[""])


@pytest.mark.parametrize(
    ("units", "expected"),
    [
        ("si", ["fy_MPa", "span_m", "lb_m", "moment_demand_kN_m", "moment_capacity_kN_m",
                "shear_demand_kN", "deflection_live_mm", "brace_stations_m"]),
        ("imperial", ["fy_ksi", "span_ft", "lb_ft", "moment_demand_kip_ft",
                      "moment_capacity_kip_ft", "shear_demand_kip", "deflection_live_in",
                      "brace_stations_ft"]),
    ],
)  # fmt: skip
def test_dimensional_columns_carry_unit_suffix(units, expected):
    df = _frame(rf.check_result(), units)
    for col in expected:
        assert col in df.columns
    suffix = {
        "si": r"_(m|mm|kN|kN_m|MPa|kN_per_m)$",
        "imperial": r"_(ft|in|kip|kip_ft|ksi|kip_per_ft)$",
    }
    dimensional = [name for name, kind, _ in BEAM_COLUMNS if kind]
    named = {c for c in df.columns if re.search(suffix[units], c)}
    assert len(named) == len(dimensional)
    for plain in ("guid", "name", "storey", "profile", "grade", "cb", "limit_state",
                  "load_combination", "flexure_utilisation", "shear_utilisation",
                  "deflection_utilisation", "strength_utilisation", "utilisation",
                  "controlling_limit", "outcome", "reason", "notes"):  # fmt: skip
        assert plain in df.columns


def test_si_and_imperial_agree():
    result = rf.check_result()
    si, imp = _frame(result, "si"), _frame(result, "imperial")
    checked = si["outcome"] != "not_checked"
    pairs = [
        ("lb_m", "lb_ft", FT), ("span_m", "span_ft", FT),
        ("moment_demand_kN_m", "moment_demand_kip_ft", KIP_FT),
        ("moment_capacity_kN_m", "moment_capacity_kip_ft", KIP_FT),
        ("shear_demand_kN", "shear_demand_kip", KIP / 1000),
        ("deflection_live_mm", "deflection_live_in", IN * 1000),
    ]  # fmt: skip
    for si_col, imp_col, factor in pairs:
        a = si.loc[checked, si_col].astype(float).to_numpy()
        b = imp.loc[checked, imp_col].astype(float).to_numpy() * factor
        assert a == pytest.approx(b, rel=2e-5), si_col  # 6 significant digits written
    # stresses with the trade's digits: 50 ksi (ASTM A992) is written 345 MPa, not 344.738
    assert set(si.loc[checked, "fy_MPa"]) == {345} and set(imp.loc[checked, "fy_ksi"]) == {50}
    # utilisations and Cb carry no unit and are the same in both
    pd.testing.assert_series_equal(si["utilisation"], imp["utilisation"])
    pd.testing.assert_series_equal(si["cb"], imp["cb"])


def test_values_in_display_units():
    df = _frame(rf.check_result(), "imperial").set_index("name")
    assert df.loc["B-2", "lb_ft"] == pytest.approx(15.0)  # the 7.5–22.5 ft segment
    assert df.loc["B-2", "fy_ksi"] == pytest.approx(50.0)  # ASTM A992
    assert (
        df.loc["B-2", "brace_stations_ft"] == "0 7.5 22.5 30"
    )  # the strut at 15 ft does not count
    assert df.loc["B-2", "limit_state"] == "elastic_ltb"
    assert df.loc["B-4", "lb_ft"] == 0.0  # slab braces it throughout


def test_outcomes_match_json_and_not_checked_is_blank():
    result = rf.check_result()
    df = _frame(result, "si")
    json_outcome = {b["guid"]: b["outcome"] for b in results_document(result)["beams"]}
    assert dict(zip(df["guid"], df["outcome"], strict=True)) == json_outcome
    row = df[df["outcome"] == "not_checked"].iloc[0]
    assert pd.isna(row["utilisation"]) and pd.isna(row["lb_m"])
    assert "shape table" in row["reason"]
    assert row["reason_code"] == "profile_not_in_table"


def test_write_files(tmp_path):
    p = write_beams_csv(rf.check_result(), tmp_path / "m.beams.csv", "si")
    assert p.read_text(encoding="utf-8").startswith("guid,name,storey")
    d = write_diff_csv(rf.diff_result(), tmp_path / "diff.csv", "imperial")
    df = pd.read_csv(d, keep_default_na=False, na_values=[""])
    assert df["change"].tolist()[0] == "weakened"
    assert df.loc[0, "lost_brace_points_ft"] == pytest.approx(15.0)
    assert (df.loc[0, "lb_before_ft"], df.loc[0, "lb_after_ft"]) == pytest.approx((7.5, 15.0))
    names = [n for n, k, _ in DIFF_COLUMNS if k]
    assert all(any(c.startswith(n + "_ft") for c in df.columns) for n in names)


def test_diff_csv_si_matches_imperial():
    diff = rf.diff_result()
    si = pd.read_csv(io.StringIO(diff_csv(diff, "si")), keep_default_na=False, na_values=[""])
    imp = pd.read_csv(
        io.StringIO(diff_csv(diff, "imperial")), keep_default_na=False, na_values=[""]
    )
    assert si.loc[0, "lb_after_m"] == pytest.approx(imp.loc[0, "lb_after_ft"] * FT, rel=1e-5)


def test_bad_units_rejected():
    with pytest.raises(ValueError):
        beams_csv(rf.check_result(), "furlongs")
