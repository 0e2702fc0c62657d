"""material: common structural materials with sourced properties, and a sheet's own.

Sheet syntax::

    mat = material.steel(grade="S355")            -- also "S275", "A992", "A36"
    al  = material.aluminium(alloy="6061-T6")
    tim = material.timber(grade="C24")            -- also "GL24h" (glulam)
    con = material.concrete(f_c=30 MPa, rule="EN 1992-1-1")   -- or rule="ACI 318"
    own = material.custom(name="bespoke alloy", E=70 GPa, nu=0.33, f_y=200 MPa, rho=2700 kg/m^3)

Every record has E, G, nu, f_y (yield, or the characteristic strength for
timber and concrete), f_u, rho and name. Values live in materials.toml beside
this file, each with its source; recalled values say "from memory — verify
against your standard". See docs/plugins/material.md.
"""
from calcsheet.plugin import Namespace

namespace = Namespace("material", version="0.1.0", doc="Structural materials: E, G, ν, strengths, density, sourced")

from . import functions as _functions  # noqa: E402,F401  (registers the functions)
