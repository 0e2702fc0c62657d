"""Each generated combination set against the text of its standard (clause beside each expectation).

ASCE/SEI 7-22 2.3.1, 2.3.6, 2.4.1, 2.4.5 and EN 1990:2002+A1:2005 6.4.3.2 (6.10), (6.10a), (6.10b),
6.5.3 (6.14b), (6.15b), (6.16b), Table A1.1 (psi) and Table A1.2(B) (gamma, xi). Expected factor sets are
written out by hand from those expressions, not read from the data file.
"""
import pytest

from calcsheet_plugins.loads.generate import CombinationError, generate, parse_cases


def sets(set_name, cases):
    return [(cb.factors, cb.clause) for cb in generate(set_name, parse_cases(cases, set_name))]


def factor_sets(set_name, cases):
    return [{k: pytest.approx(v, rel=1e-12) for k, v in f.items()} for f, _ in sets(set_name, cases)]


def has(found, want):
    return any(f == {k: pytest.approx(v, rel=1e-12) for k, v in want.items()} for f, _ in found)


def test_asce_lrfd_dead_and_live():
    found = sets("ASCE 7-22 LRFD", "D, L")
    assert has(found, {"D": 1.4})  # 2.3.1 (1): 1.4D
    assert has(found, {"D": 1.2, "L": 1.6})  # 2.3.1 (2): 1.2D + 1.6L
    assert has(found, {"D": 1.2, "L": 1.0})  # 2.3.1 (3): 1.2D + (L or 0.5W)
    assert has(found, {"D": 0.9})  # 2.3.1 (5): 0.9D + 1.0W, W absent
    assert len(found) == 4  # the others repeat these when W, E, Lr, S, R are absent
    clauses = {tuple(sorted(f)): c for f, c in found}
    assert clauses[("D",)] in ("ASCE/SEI 7-22 2.3.1 (1)", "ASCE/SEI 7-22 2.3.1 (5)")


def test_asce_lrfd_with_snow_and_wind():
    found = sets("ASCE 7-22 LRFD", "D, L, S, W")
    assert has(found, {"D": 1.2, "L": 1.6, "S": 0.15})  # 2.3.1 (2): 0.5(0.3S)
    assert has(found, {"D": 1.2, "S": 1.0, "L": 1.0})  # 2.3.1 (3), 7-22: 1.0S principal, + L
    assert has(found, {"D": 1.2, "S": 1.0, "W": 0.5})  # ... or + 0.5W
    assert has(found, {"D": 1.2, "L": 1.0, "S": 0.15, "W": 1.0})  # 2.3.1 (4): 1.2D + 1.0W + L + 0.5(0.3S)
    assert has(found, {"D": 0.9, "W": 1.0})  # 2.3.1 (5)


def test_asce_lrfd_roof_live_or_rain_alternatives_each_give_a_combination():
    found = sets("ASCE 7-22 LRFD", "D, L, Lr, R")
    assert has(found, {"D": 1.2, "L": 1.6, "Lr": 0.5})  # 2.3.1 (2) with Lr
    assert has(found, {"D": 1.2, "L": 1.6, "R": 0.5})  # ... or with R
    assert has(found, {"D": 1.2, "Lr": 1.6, "L": 1.0})  # 2.3.1 (3)
    assert has(found, {"D": 1.2, "R": 1.6, "L": 1.0})


def test_asce_seismic_strength_and_asd():
    assert has(sets("ASCE 7-22 LRFD", "D, L, E"), {"D": 1.2, "L": 1.0, "E": 1.0})  # 2.3.6 (6)
    assert has(sets("ASCE 7-22 LRFD", "D, L, E"), {"D": 0.9, "E": 1.0})  # 2.3.6 (7)
    assert has(sets("ASCE 7-22 ASD", "D, E"), {"D": 0.6, "E": 0.7})  # 2.4.5 (10)


def test_asce_asd():
    found = sets("ASCE 7-22 ASD", "D, L, S, W")
    assert has(found, {"D": 1.0, "L": 1.0})  # 2.4.1 (2): D + L
    assert has(found, {"D": 1.0, "S": 0.7})  # 2.4.1 (3), 7-22: D + 0.7S
    assert has(found, {"D": 1.0, "L": 0.75, "S": 0.525})  # 2.4.1 (4): D + 0.75L + 0.75(0.7S)
    assert has(found, {"D": 1.0, "W": 0.6})  # 2.4.1 (5): D + 0.6W
    assert has(found, {"D": 1.0, "L": 0.75, "W": 0.45, "S": 0.525})  # 2.4.1 (6): + 0.75(0.6W) + 0.75(0.7S)
    assert has(found, {"D": 0.6, "W": 0.6})  # 2.4.1 (7): 0.6D + 0.6W


def test_en_6_10_each_variable_action_leads_in_turn_with_g_unfavourable_and_favourable():
    found = sets("EN 1990 6.10", "G, Q: imposed B, W: wind")
    # (6.10) with Table A1.2(B): γG,sup 1.35 / γG,inf 1.00, γQ 1.5; ψ0: category B 0.7, wind 0.6 (Table A1.1)
    assert has(found, {"G": 1.35, "Q": 1.5, "W": 1.5 * 0.6})  # Q leading
    assert has(found, {"G": 1.35, "W": 1.5, "Q": 1.5 * 0.7})  # W leading
    assert has(found, {"G": 1.0, "W": 1.5, "Q": 1.5 * 0.7})  # G favourable
    assert has(found, {"G": 1.0, "W": 1.5})  # G favourable, Q favourable (γQ = 0)
    assert has(found, {"G": 1.35, "Q": 1.5})
    assert all(c == "EN 1990:2002+A1:2005 6.4.3.2 (6.10)" for _, c in found)
    assert len(found) == 8  # 2 leading × 2 permanent × accompanying present/absent


def test_en_6_10a_and_6_10b():
    found = sets("EN 1990 6.10a/b", "G, Q: imposed B, W: wind")
    assert has(found, {"G": 1.35, "Q": 1.5 * 0.7, "W": 1.5 * 0.6})  # (6.10a): γG G + γQ ψ0 Q for all Q
    assert has(found, {"G": 0.85 * 1.35, "Q": 1.5, "W": 1.5 * 0.6})  # (6.10b): ξ γG,sup G + γQ Q1 + ...
    assert has(found, {"G": 0.85 * 1.35, "W": 1.5, "Q": 1.5 * 0.7})
    assert has(found, {"G": 1.0, "Q": 1.5, "W": 1.5 * 0.6})  # (6.10b), γG,inf: ξ applies to unfavourable only


def test_en_serviceability_sets():
    cases = "G, Q: imposed B, W: wind"
    # (6.14b) characteristic: G + Q_k,1 + Σ ψ0,i Q_k,i
    assert has(sets("EN 1990 characteristic", cases), {"G": 1.0, "Q": 1.0, "W": 0.6})
    assert has(sets("EN 1990 characteristic", cases), {"G": 1.0, "W": 1.0, "Q": 0.7})
    # (6.15b) frequent: G + ψ1,1 Q_k,1 + Σ ψ2,i Q_k,i; category B ψ1 0.5 ψ2 0.3, wind ψ1 0.2 ψ2 0
    assert has(sets("EN 1990 frequent", cases), {"G": 1.0, "Q": 0.5})
    assert has(sets("EN 1990 frequent", cases), {"G": 1.0, "W": 0.2, "Q": 0.3})
    # (6.16b) quasi-permanent: G + Σ ψ2,i Q_k,i
    assert factor_sets("EN 1990 quasi-permanent", cases) == [{"G": 1.0, "Q": pytest.approx(0.3)}]


@pytest.mark.parametrize("kind, psi", [
    ("imposed A", (0.7, 0.5, 0.3)), ("imposed C", (0.7, 0.7, 0.6)), ("imposed E", (1.0, 0.9, 0.8)),
    ("imposed H", (0.0, 0.0, 0.0)), ("snow", (0.5, 0.2, 0.0)), ("snow high", (0.7, 0.5, 0.2)),
    ("wind", (0.6, 0.2, 0.0)), ("temperature", (0.6, 0.5, 0.0)),
])
def test_psi_values_are_table_a1_1(kind, psi):
    # EN 1990 Table A1.1; read back through the quasi-permanent and frequent sets (ψ2, ψ1) and 6.14b (ψ0)
    cases = f"G, Q: {kind}, P: imposed B"
    quasi = sets("EN 1990 quasi-permanent", cases)[0][0]
    assert quasi.get("Q", 0.0) == pytest.approx(psi[2])
    assert has(sets("EN 1990 frequent", cases), {k: v for k, v in {"G": 1.0, "Q": psi[1], "P": 0.3}.items() if v})
    assert has(sets("EN 1990 characteristic", cases), {k: v for k, v in {"G": 1.0, "P": 1.0, "Q": psi[0]}.items()
                                                       if v})


def test_each_combination_names_its_leading_action_and_the_shortest_duration():
    combos = generate("EN 1990 6.10", parse_cases("G, Q: imposed E, S: snow", "EN 1990 6.10"))
    lead_q = next(c for c in combos if c.factors == {"G": 1.35, "Q": 1.5, "S": 0.75})
    assert lead_q.leading == "Q" and lead_q.leading_kind == "imposed E"
    # EN 1995-1-1 Table 2.2 (from memory): storage long-term, snow short-term; the shortest present governs
    assert lead_q.duration == "short-term"
    alone = next(c for c in combos if c.factors == {"G": 1.35, "Q": 1.5})
    assert alone.duration == "long-term"
    asce = generate("ASCE 7-22 ASD", parse_cases("D, L, W", "ASCE 7-22 ASD"))
    assert next(c for c in asce if c.factors == {"D": 1.0, "W": 0.6}).duration == "ten minutes"  # NDS C_D 1.6
    assert next(c for c in asce if c.factors == {"D": 1.0, "L": 1.0}).duration == "ten years"  # NDS C_D 1.0


def test_bad_case_lists_say_what_to_write():
    with pytest.raises(CombinationError, match="give its kind"):
        parse_cases("G, Q", "EN 1990 6.10")
    assert parse_cases("G, Q: imposed  b", "EN 1990 6.10")[1].kind == "imposed B"  # spacing and case
    with pytest.raises(CombinationError, match="did you mean \"imposed B\""):
        parse_cases("G, Q: imposd B", "EN 1990 6.10")
    with pytest.raises(CombinationError, match="belongs to ASCE 7"):
        parse_cases("G, Q: L", "EN 1990 6.10")
    with pytest.raises(CombinationError, match="ASCE 7 symbol"):
        parse_cases("D, Q", "ASCE 7-22 LRFD")
    with pytest.raises(CombinationError, match="listed twice"):
        parse_cases("D, D", "ASCE 7-22 LRFD")
    with pytest.raises(CombinationError, match="unknown combination set"):
        generate("EN 1990 6.11", [])
