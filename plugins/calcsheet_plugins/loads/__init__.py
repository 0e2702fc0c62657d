"""loads: standard load combinations generated from the sheet's named load cases.

Sheet syntax::

    uls = loads.combinations(set="EN 1990 6.10", cases="G, Q: imposed B, W: wind")
    sls = loads.combinations(set="EN 1990 characteristic", cases="G, Q: imposed B, W: wind")
    b = beam.solve(..., combinations=[uls, sls], deflection="EN 1990 characteristic")

The sets, their factors and clauses are data (sets.toml, actions.toml) with
their standards and editions; see docs/plugins/loads.md.
"""
from calcsheet.plugin import Namespace

namespace = Namespace(
    "loads",
    version="0.1.0",
    doc="Load combinations of ASCE/SEI 7-22 (2.3.1, 2.3.6, 2.4.1, 2.4.5) and EN 1990:2002+A1:2005 "
        "(6.10, 6.10a/b, 6.14b, 6.15b, 6.16b; Tables A1.1, A1.2(B)) generated from named load cases",
    standards=("ASCE/SEI 7-22 (load combinations, 2.3 and 2.4)", "EN 1990:2002+A1:2005 (6.4.3, 6.5.3, Annex A1)"),
)

from . import functions as _functions  # noqa: E402,F401  (registers loads.combinations)
