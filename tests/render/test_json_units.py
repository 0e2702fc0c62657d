"""Every unit string in the JSON parses with a stock pint registry and means the same quantity."""
from pathlib import Path

import pint
import pytest

import calcsheet
from calcsheet import units as U

SHEETS = sorted((Path(__file__).parents[2] / "sheets").glob("*.calc"))
STOCK = pint.UnitRegistry()  # a consumer's registry: none of our trade units


def quantities(node):
    if isinstance(node, dict):
        if "value" in node and "unit" in node and isinstance(node["value"], float):
            yield node
        for v in node.values():
            yield from quantities(v)
    elif isinstance(node, list):
        for v in node:
            yield from quantities(v)


def same_quantity(entry):
    ours = U.registry().Quantity(entry["value"], U.registry().parse_units(entry.get("display_unit", entry["unit"])))
    theirs = STOCK.Quantity(entry["value"], entry["unit"])
    return theirs.to_base_units().magnitude == pytest.approx(ours.to_base_units().magnitude, rel=1e-12)


def test_trade_units_are_written_in_stock_units():
    r = calcsheet.run("---\nunits: US\n---\nq [psf] = 40 psf\nw [klf] = 1.2 klf\nk [pcf] = 150 pcf\n")
    values = r.to_json()["values"]
    assert values["q"]["unit"] == "lbf / ft ** 2" and values["q"]["display_unit"] == "psf"
    assert values["w"]["unit"] == "kip / ft" and values["w"]["display_unit"] == "klf"
    for name in "qwk":
        assert same_quantity(values[name])


@pytest.mark.parametrize("sheet", SHEETS, ids=lambda p: p.stem)
def test_every_unit_in_a_demo_json_parses_with_stock_pint(sheet):
    found = list(quantities(calcsheet.run(sheet).to_json()))
    assert found
    for entry in found:
        if entry["unit"]:
            assert same_quantity(entry), entry
