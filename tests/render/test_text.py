"""The text printer reads like a hand calculation."""
import textwrap

import calcsheet
from calcsheet.render.text import TextDocument


def lines(text):
    r = calcsheet.run(textwrap.dedent(text).lstrip())
    assert r.ok, r.format_diagnostics()
    return TextDocument(sigfigs=r.policy.sigfigs).items(r.items).strip().splitlines()


def test_symbol_formula_substitution_result():
    out = lines("""
        w = 5.2 kN/m
        L = 6.0 m
        M [kN*m] = w*L^2/8
    """)
    assert out == [
        "w = 5.2 kN/m",
        "L = 6.0 m",
        "M = w·L²/8 = 5.2 kN/m · (6.0 m)² / 8 = 23.4 kN·m",  # inputs as written; hand: 5.2 × 36 / 8 = 23.4
    ]


def test_greek_subscripts_and_fields_and_functions():
    out = lines("""
        sigma_b = 120 MPa
        tau = 40 MPa
        sigma_v [MPa] = sqrt(sigma_b^2 + 3*tau^2)
    """)
    # von Mises: sqrt(120² + 3·40²) = sqrt(14400 + 4800) = 138.6 MPa
    assert out[-1] == ("σ_v = √(σ_b² + 3·τ²) = √((120 MPa)² + 3 · (40 MPa)²) = 139 MPa")


def test_negative_values_are_bracketed_when_substituted():
    out = lines("a = -2 kN\nb = 3 kN\nc = b - a\n")
    assert out[-1] == "c = b − a = 3 kN − (−2 kN) = 5.00 kN"


def test_check_line():
    out = lines("s = 123 MPa\nf = 150 MPa\ncheck s <= 0.6*f -- allowable\n")
    assert out[-1] == "check s ≤ 0.6·f:  123 MPa ≤ 0.6 · 150 MPa  →  NG  ratio 1.37   -- allowable"


def test_large_numbers_use_powers_of_ten():
    out = lines("I = 2.5e8 mm^4\nS [mm^3] = I / 125 mm\n")
    assert out[0] == "I = 2.5×10⁸ mm⁴"
    assert out[1] == "S = I/(125 mm) = 2.5×10⁸ mm⁴ / (125 mm) = 2.00×10⁶ mm³"  # a divisor with a unit is bracketed


def test_sigfigs_from_front_matter():
    out = lines("---\nsigfigs: 5\n---\nL = 2 m\nx = L/3\n")
    assert out[-1] == "x = L/3 = 2 m / 3 = 666.67 mm"  # the input as written; the result at 5 figures


def test_a_calculated_value_carries_the_figures_the_next_step_needs():
    out = lines("d = 168.3 mm\nt_w = 6.3 mm\nd_i = d - 2*t_w\nA = pi*(d^2 - d_i^2)/4\n")
    assert out[2] == "d_i = d − 2·t_w = 168.3 mm − 2 · 6.3 mm = 156 mm"
    # with 156 mm the step gives π/4·(168.3² − 156²) = 3132 mm²; with 155.7 mm it gives 3206 -> 3210
    assert out[3] == "A = π·(d² − d_i²)/4 = π · ((168.3 mm)² − (155.7 mm)²) / 4 = 3210 mm²"


def test_a_conditional_prints_both_outcomes_with_values():
    out = lines("h = 220 mm\nx = if(h > 100 mm, h, 2*h)\n")
    assert out[-1] == "x = (h if h > 100 mm, else 2·h) = (220 mm if 220 mm > 100 mm, else 2 · 220 mm) = 220 mm"


def test_a_quantity_raised_to_a_power_keeps_its_brackets():
    # found by the round-trip property test: (150 mm)² must not print as 150 mm²
    out = lines("A = (150 mm)^2\nB = 2*(3 m)^3 / 4 m\n")
    assert out == ["A = (150 mm)² = 22500 mm²", "B = 2·(3 m)³/(4 m) = 13.5 m²"]
