"""What every printer shares: settings, dispatch, precedence, names.

Dispatch walks the node's class hierarchy for ``_print_<Class>``, so a new
node needs one method per printer and a new format needs one new class.
"""
from __future__ import annotations

import pint

from .. import nodes as N

# Binding strength of each construct; a child binding more loosely than its
# context is parenthesised.
PRECEDENCE = {
    N.Add: 10, N.Sub: 10,
    N.Mul: 20, N.Div: 20,
    N.Neg: 25,
    N.Pow: 30,
}
ATOM = 100
QUANTITY = 20  # a substituted "6.00 m" binds like a product

GREEK = {
    "alpha": "α", "beta": "β", "gamma": "γ", "delta": "δ", "epsilon": "ε", "zeta": "ζ", "eta": "η",
    "theta": "θ", "iota": "ι", "kappa": "κ", "lambda": "λ", "lam": "λ", "mu": "μ", "nu": "ν", "xi": "ξ",
    "pi": "π", "rho": "ρ", "sigma": "σ", "tau": "τ", "upsilon": "υ", "phi": "φ", "chi": "χ", "psi": "ψ",
    "omega": "ω",
    "Gamma": "Γ", "Delta": "Δ", "Theta": "Θ", "Lambda": "Λ", "Xi": "Ξ", "Pi": "Π", "Sigma": "Σ",
    "Phi": "Φ", "Psi": "Ψ", "Omega": "Ω",
}


def greek(word: str) -> str:
    return GREEK.get(word, word)


def split_name(name: str) -> tuple[str, list[str]]:
    """'S_x_bot' -> ('S', ['x', 'bot']); Greek words become letters."""
    head, *subs = name.split("_")
    if not head:  # a name starting with '_'
        return name, []
    return greek(head), [greek(s) for s in subs if s]


class Printer:
    """Base printer: a settings table with defaults; unknown keys are refused."""

    default_settings: dict = {"sigfigs": 3}

    def __init__(self, **settings):
        unknown = set(settings) - set(self.default_settings)
        if unknown:
            raise TypeError(f"{type(self).__name__}: unknown setting(s) {sorted(unknown)}")
        self.settings = {**self.default_settings, **settings}

    def _print(self, node, *args, **kwargs):
        for cls in type(node).__mro__:
            method = getattr(self, "_print_" + cls.__name__, None)
            if method is not None:
                return method(node, *args, **kwargs)
        return self.empty_printer(node)

    def empty_printer(self, node):
        return str(node)


def precedence(node) -> int:
    if isinstance(node, N.Number) and node.unit:
        return QUANTITY  # "(150 mm)²" is not "150 mm²"
    for cls in type(node).__mro__:
        if cls in PRECEDENCE:
            return PRECEDENCE[cls]
    return ATOM


def value_precedence(value) -> int:
    """How tightly a substituted value binds: '-3.00', '6.00 m' need brackets in a power."""
    if isinstance(value, pint.Quantity):
        try:
            neg = float(value.magnitude) < 0
        except TypeError:
            neg = False
        if neg:
            return 5  # "−2.00 kN" is bracketed inside any operation
        if str(value.units) not in ("", "dimensionless"):
            return QUANTITY
    return ATOM
