"""JSON printer: every value, check and diagnostic, in the documented shape.

Units are written the way pint parses them back (``pint.Quantity(v, unit)``).
"""
from __future__ import annotations

import hashlib
import json

import pint

from .. import collector
from ..builtins import TableValue
from ..display import pint_unit_string, portable_unit_string, shown
from ..plugin import Record
from .base import Printer


def dumps(data) -> str:
    """Strict JSON text: NaN and infinities are refused (``allow_nan=False``), never written as the
    ``NaN``/``Infinity`` that strict parsers reject. Every JSON calcsheet writes goes through here."""
    return json.dumps(data, indent=2, ensure_ascii=False, allow_nan=False)


class JsonPrinter(Printer):
    default_settings = {"sigfigs": None}

    def value(self, value, unit=None) -> dict:
        if isinstance(value, pint.Quantity):
            value = shown(value, unit)
            mag = value.magnitude
            try:
                mag = float(mag)
            except TypeError:
                mag = [float(x) for x in mag]
            if not value.units._units:
                return {"value": mag, "unit": ""}
            # "unit" parses with a stock pint registry; where the package shows the value in a trade unit
            # a stock registry lacks (psf, klf), "display_unit" names it
            out = {"value": mag, "unit": portable_unit_string(value.units)}
            if pint_unit_string(value.units) != out["unit"]:
                out["display_unit"] = pint_unit_string(value.units)
            return out
        if isinstance(value, str):
            return {"text": value}
        if isinstance(value, Record):
            return {"record": value.source, "fields": {k: self.value(v) for k, v in value.fields.items()
                                                       if isinstance(v, (pint.Quantity, str))}}
        if isinstance(value, tuple):
            return {"list": [self.value(v) for v in value]}
        if isinstance(value, TableValue):  # a sheet's table
            return {"table": self.table(value)}
        return {"text": str(value)}

    @staticmethod
    def table(tv) -> dict:
        """A sheet's table: its columns (a two-way table: row key, column key), each column's unit, its rows
        (a two-way table: the row key then the values) and, for a two-way table, the column keys."""
        out = {"columns": [c for c, _ in tv.info.columns], "units": [portable_unit_string(u) for u in tv.units],
               "rows": [[float(x) for x in row] for row in tv.data]}
        if tv.info.two_way:
            out["column_keys"] = [float(x) for x in tv.col_keys]
        return out

    @collector.run_pause()  # a walk of the result that makes no cycles: as a run, no collection meanwhile
    def result(self, result) -> dict:
        values = {}
        for name, step in result.steps.items():
            entry = self.value(step.value, step.display_unit)
            entry["line"] = step.span.line if step.span else None
            if step.description:
                entry["description"] = step.description
            entry["input"] = step.is_input
            entry["reads"] = list(result.precedents.get(name, []))
            if step.overridden is not None:
                entry["overridden_from"] = self.value(step.overridden, step.display_unit)
            values[name] = entry
        checks = []
        for c in result.checks:
            checks.append({
                "line": c.span.line if c.span else None,
                "text": c.text,
                "ok": bool(c.ok),
                "ratio": c.ratio,
                "demand": self.value(c.demand),
                "capacity": self.value(c.capacity, c.demand.units if isinstance(c.demand, pint.Quantity) else None),
                "description": c.description,
                **({"governing": c.governing} if c.governing is not None else {}),  # a check over a list
            })
        return {
            "meta": {k: v for k, v in result.meta.items()},
            "values": values,
            "checks": checks,
            "diagnostics": [d.to_json() for d in result.diagnostics],
            "source": {"path": result.path, "sha256": result.sha256,
                       "includes": [{"path": p, "sha256": hashlib.sha256(t.encode("utf-8")).hexdigest()}
                                    for p, t in result.includes]},
            "versions": {"calcsheet": result.engine_version, "plugins": dict(result.plugin_versions)},
        }
