"""Helpers for the steel tests: run one plugin call in a sheet and read its record."""
import textwrap

import pytest

import calcsheet

# Published properties (AISC Steel Construction Manual, 15th ed., Table 1-1, as printed in the AISC Design
# Examples v16.0 — from memory). Inputs only: the tests do not depend on any catalogue.
W18X50 = ('name="W18X50", form="I", A=14.7 in^2, d=18.0 in, b_f=7.50 in, t_f=0.570 in, t_w=0.355 in, '
          'k_des=0.972 in, I_x=800 in^4, I_y=40.1 in^4, S_x=88.9 in^3, Z_x=101 in^3, S_y=10.7 in^3, Z_y=16.6 in^3, '
          'r_x=7.38 in, r_y=1.65 in, J=1.24 in^4, C_w=3040 in^6, h_o=17.4 in, r_ts=1.98 in')
W14X132 = ('name="W14X132", form="I", A=38.8 in^2, d=14.7 in, b_f=14.7 in, t_f=1.03 in, t_w=0.645 in, '
           'k_des=1.63 in, I_x=1530 in^4, I_y=548 in^4, S_x=209 in^3, Z_x=234 in^3, S_y=74.5 in^3, Z_y=113 in^3, '
           'r_x=6.28 in, r_y=3.76 in, J=12.3 in^4, C_w=25500 in^6')
W14X99 = ('name="W14X99", form="I", A=29.1 in^2, d=14.2 in, b_f=14.6 in, t_f=0.780 in, t_w=0.485 in, '
          'k_des=1.38 in, I_x=1110 in^4, I_y=402 in^4, S_x=157 in^3, Z_x=173 in^3, S_y=55.2 in^3, Z_y=83.6 in^3, '
          'r_x=6.17 in, r_y=3.71 in, J=4.85 in^4, C_w=18000 in^6, h_o=13.4 in')
W24X62 = ('name="W24X62", form="I", A=18.2 in^2, d=23.7 in, b_f=7.04 in, t_f=0.590 in, t_w=0.430 in, '
          'k_des=1.09 in, I_x=1550 in^4, I_y=34.5 in^4, S_x=131 in^3, Z_x=153 in^3, S_y=9.80 in^3, Z_y=15.7 in^3, '
          'r_x=9.23 in, r_y=1.38 in, J=1.71 in^4, C_w=4620 in^6')
# European sections (ArcelorMittal / EN 10365 published properties — from memory)
IPE300 = ('name="IPE 300", form="I", A=5381 mm^2, d=300 mm, b_f=150 mm, t_f=10.7 mm, t_w=7.1 mm, r=15 mm, '
          'I_x=8356e4 mm^4, I_y=603.8e4 mm^4, S_x=557.1e3 mm^3, Z_x=628.4e3 mm^3, S_y=80.5e3 mm^3, Z_y=125.2e3 mm^3, '
          'J=20.12e4 mm^4, C_w=125.9e9 mm^6')
HEB200 = ('name="HE 200 B", form="I", A=7808 mm^2, d=200 mm, b_f=200 mm, t_f=15 mm, t_w=9 mm, r=18 mm, '
          'I_x=5696e4 mm^4, I_y=2003e4 mm^4, S_x=569.6e3 mm^3, Z_x=642.5e3 mm^3, S_y=200.3e3 mm^3, Z_y=305.8e3 mm^3, '
          'J=59.28e4 mm^4, C_w=171.1e9 mm^6')


def run(body, units="US"):
    r = calcsheet.run(f"---\nproject: steel tests\nunits: {units}\n---\n" + textwrap.dedent(body))
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert not errs, [d.message for d in errs]
    return r


def errors(body, units="US"):
    r = calcsheet.run(f"---\nproject: steel tests\nunits: {units}\n---\n" + textwrap.dedent(body))
    return [d for d in r.diagnostics if d.severity == "error"]


def call(section, fn, args, units="US"):
    """Run ``steel.<fn>(section=s, <args>)`` on a steel_design.shape(<section>) and return its record's fields."""
    r = run(f"s = steel_design.shape({section})\nout = steel_design.{fn}(section=s, {args})\n", units)
    return r.values["out"].fields


def f(q, unit=""):
    return float(q.m_as(unit))


@pytest.fixture
def shapes():
    return {"W18X50": W18X50, "W14X132": W14X132, "W14X99": W14X99, "W24X62": W24X62, "IPE300": IPE300,
            "HEB200": HEB200}
