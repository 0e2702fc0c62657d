"""The likely fix when one dimension was expected and another arrived.

A dimension mismatch is rarely random: an area load where a line load
belongs means a missing tributary width, a force where a moment belongs a
missing lever arm. Each known slip has a name (listed in docs/diagnostics.md
under the general code it arrives with) and a hint that says what to
multiply or divide by; the diagnostic code itself stays the general one.
"""
from __future__ import annotations

from . import units as U
from .errors import CalcError
from .plausibility import AREA, DENSITY, FORCE, LENGTH, LENGTH3, LENGTH4, LINE_LOAD, MOMENT, PRESSURE, UNIT_WEIGHT

FORCE_PER_VOLUME = UNIT_WEIGHT  # M/I has force/length³ too

# (wanted, got) -> (slip name or None, hint)
_SLIPS: dict[tuple, tuple[str | None, str]] = {
    (LINE_LOAD, PRESSURE): ("area load as line load",
                            "{got_name} is an area load (pressure); a line load is pressure × length — "
                            "did you forget the tributary width? e.g. w = q * s with s the spacing"),
    (PRESSURE, LINE_LOAD): (None, "{got_name} is a line load; an area load or stress is a line load divided by "
                                  "the width it spreads over"),
    (MOMENT, FORCE): ("moment without lever arm",
                      "{got_name} is a force; a moment is a force × a lever arm — did you leave out a distance? "
                      "e.g. M = P*L/4 for a central point load"),
    (FORCE, MOMENT): (None, "{got_name} is a moment; divide by a lever arm to get a force"),
    (MOMENT, LINE_LOAD): ("moment without lever arm",
                          "{got_name} is a line load; a moment from a line load needs a span squared, "
                          "e.g. M = w*L^2/8"),
    (PRESSURE, MOMENT): ("stress without section modulus",
                         "{got_name} is a moment; a bending stress is the moment divided by a section modulus: "
                         "sigma = M/S (or M*y/I)"),
    (PRESSURE, FORCE_PER_VOLUME): ("stress without section modulus",
                                   "{got_name} is force/length³, which is what M/I gives; a bending stress needs the "
                                   "distance to the fibre: sigma = M*y/I, or M/S with S = I/y"),
    (PRESSURE, FORCE): (None, "{got_name} is a force; a stress is a force divided by the area it acts on"),
    (FORCE, PRESSURE): (None, "{got_name} is a pressure; multiply by the area it acts on to get a force"),
    (FORCE, LINE_LOAD): (None, "{got_name} is a line load; multiply by the length it acts over to get a force"),
    (LINE_LOAD, FORCE): (None, "{got_name} is a force; a point load is not a line load — divide by the length it "
                               "spreads over, or pass it as a point load"),
    (DENSITY, UNIT_WEIGHT): ("unit weight as density",
                             "{got_name} is a unit weight (gamma = rho*g); a density is mass per volume — "
                             "78.5 kN/m^3 of steel is about 7850 kg/m^3"),
    (UNIT_WEIGHT, DENSITY): (None, "{got_name} is a density; a unit weight is density × g (9.81 m/s^2)"),
    (LENGTH4, LENGTH3): (None, "{got_name} has length³ (a section modulus, S = I/y); a second moment of area has "
                               "length⁴"),
    (LENGTH3, LENGTH4): (None, "{got_name} has length⁴ (a second moment of area); a section modulus is S = I/y"),
    (AREA, LENGTH): (None, "{got_name} is a length; an area is a length × a length"),
}


def likely_fix(want, got, got_name: str = "the value") -> tuple[str | None, str] | None:
    """(slip name or None, hint) for a known slip from ``want`` to ``got``."""
    hit = _SLIPS.get((U.without_angle(want), U.without_angle(got)))
    if hit is None:
        return None
    slip, hint = hit
    return slip, hint.format(got_name=got_name)


def specialise(exc: CalcError, want, got, got_name: str = "the value") -> bool:
    """Put the likely fix of a known slip first in the error's hint; True if one was found."""
    found = likely_fix(want, got, got_name)
    if found is None:
        return False
    _, hint = found
    rest = [p for p in (exc.hint or "").split("; ") if p and not p.startswith(f"{got_name} is ")]
    exc.hint = "; ".join([hint] + rest)
    exc.slip = found[0]
    return True
