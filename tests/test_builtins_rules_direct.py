"""The rules builtins.py shares between the checker and the evaluator, called directly at their edges.

A sheet reaches a rule only in the shapes the parser and the checker let through; a plugin's formulas and the
evaluator's own calls reach it with any operand unknown (None: the checker could not tell), on either side.
Each case is a fact of dimensional analysis or of arithmetic (common practice): a sum needs one dimension, a
°C/°F temperature is not a quantity you can add to (only a difference of two is), both outcomes of if() have
one kind, element-by-element arithmetic pairs lists of one length, a negative number has no real fractional
power and zero no negative one.
"""
import dataclasses

import pytest

from calcsheet import builtins as B
from calcsheet import units as U
from calcsheet.errors import (
    DimensionError,
    DivisionByZeroError,
    NumericError,
    OffsetTemperatureError,
    TypeMismatchError,
)
from calcsheet.evaluator import Evaluator
from calcsheet.parser import parse_expression

LENGTH = B.Arg(U.parse_dimension("[length]"))
TEMP = B.Arg(U.parse_dimension("[temperature]"))
CELSIUS = B.Arg(TEMP.dim, offset=True)


def ev(text):
    return Evaluator().eval(parse_expression(text), {})


# ---------------------------------------------------------------- sums and °C/°F temperatures

OFFSET_PAIRS = [(CELSIUS, TEMP), (TEMP, CELSIUS), (CELSIUS, None), (None, CELSIUS)]
OFFSET_IDS = ["°C with K", "K with °C", "°C with unknown", "unknown with °C"]


@pytest.mark.parametrize("a, b", OFFSET_PAIRS, ids=OFFSET_IDS)
@pytest.mark.parametrize("op", ["+", "-"])
def test_a_temperature_on_an_offset_scale_takes_no_sum_with_anything_but_its_own_kind(op, a, b):
    # 20 °C + 5 K is not 25 °C in general (the scale's zero is arbitrary): the sheet must say which it means
    node = parse_expression("T_1 + T_2")
    with pytest.raises(OffsetTemperatureError):
        B.rule_add(op, a, b, node)


@pytest.mark.parametrize("a, b", OFFSET_PAIRS, ids=OFFSET_IDS)
def test_a_temperature_on_an_offset_scale_is_never_multiplied_divided_or_raised_to_a_power(a, b):
    # 2 × 20 °C is not 40 °C of anything (on the kelvin scale it is 2 × 293.15 K): refused whichever side
    for op, text in (("*", "T_1 * T_2"), ("/", "T_1 / T_2")):
        with pytest.raises(OffsetTemperatureError):
            B.rule_mul(op, a, b, parse_expression(text))
    with pytest.raises(OffsetTemperatureError):
        B.rule_pow(a, b, parse_expression("T_1 ^ T_2"), None)


def test_the_difference_of_two_offset_temperatures_is_a_temperature_difference():
    node = parse_expression("T_2 - T_1")
    assert B.rule_add("-", CELSIUS, CELSIUS, node) == TEMP  # T₂ − T₁ in K, no longer on the offset scale
    with pytest.raises(OffsetTemperatureError):
        B.rule_add("+", CELSIUS, CELSIUS, node)  # but two of them do not add


def test_a_sum_with_an_unknown_operand_takes_the_known_ones_dimension():
    node = parse_expression("a + b")
    assert B.rule_add("+", None, LENGTH, node) == LENGTH
    assert B.rule_add("+", LENGTH, None, node) == LENGTH
    assert B.rule_add("+", None, None, node) is None


@pytest.mark.parametrize("text, hint", [
    # the right operand is the likely slip when the table knows one for (left wanted, right got) ...
    ("2 kN + 1 MPa", "1 MPa is a pressure; multiply by the area it acts on to get a force"),
    ("1 MPa + 2 kN", "2 kN is a force; a stress is a force divided by the area it acts on"),
    # ... and the left one when only the other way round is a known slip: a bending stress is M/S
    ("1 kN*m + 1 MPa", "1 kN*m is a moment; a bending stress is the moment divided by a section modulus"),
])
def test_the_hint_of_a_mismatched_sum_names_one_likely_slip_first(text, hint):
    with pytest.raises(DimensionError) as info:
        ev(text)
    assert info.value.hint.startswith(hint), info.value.hint


# ---------------------------------------------------------------- if(): one kind, one dimension

def test_if_takes_the_known_outcomes_type_when_the_other_is_unknown():
    node = parse_expression("if(a <= b, x, y)")
    assert B.rule_if(None, LENGTH, node) == LENGTH
    assert B.rule_if(LENGTH, None, node) == LENGTH
    assert B.rule_if(None, None, node) is None


def test_if_with_two_outcomes_of_one_kind_gives_that_kind_and_refuses_two_kinds():
    node = parse_expression("if(a <= b, x, y)")
    assert B.rule_if(LENGTH, LENGTH, node) == LENGTH
    assert B.rule_if("text", "text", node) == "text"
    assert B.rule_if("section.tee record", "section.tee record", node) == "section.tee record"
    for x, y in [("text", "section.tee record"), ("text", LENGTH), (LENGTH, TEMP)]:
        with pytest.raises(DimensionError, match="the two values of if"):
            B.rule_if(x, y, node)
    with pytest.raises(OffsetTemperatureError):
        B.rule_if(CELSIUS, TEMP, node)


def test_a_sheet_function_with_an_untyped_parameter_may_return_it_from_either_outcome():
    import calcsheet

    r = calcsheet.run("f(x) = if(x <= 1 m, x, 2 m)\ny = f(3 m)\nz = f(0.5 m)\n")
    assert r.ok, r.diagnostics
    assert r.values["y"].m_as("m") == 2.0 and r.values["z"].m_as("m") == 0.5


# ---------------------------------------------------------------- lists

def test_lists_combined_element_by_element_have_one_length():
    nodes = [parse_expression(t) for t in ("[1, 2]", "3", "[4, 5, 6]")]
    node = parse_expression("a + b")
    with pytest.raises(TypeMismatchError, match="lists of different lengths: 2 and 3"):
        B.rule_lengths([2, None, 3], nodes, node)
    B.rule_lengths([2, None, 2], nodes, node)  # a single value goes with every element
    B.rule_lengths([None, None, None], nodes, node)
    with pytest.raises(TypeMismatchError, match="lists of different lengths"):
        ev("[2 m, 3 m] + [1 m, 2 m, 3 m]")


@pytest.mark.parametrize("text, expected", [
    ("[-2, 3]^2", [4.0, 9.0]),        # a negative base to a whole power is real
    ("[0.25, 4]^0.5", [0.5, 2.0]),    # a fractional power of bases between 0 and 1
    ("[1, 4]^(-1)", [1.0, 0.25]),     # a negative power of 1 (not of zero)
    ("[0.5, 4]^(-1)", [2.0, 0.25]),
    ("[0, 4]^0.5", [0.0, 2.0]),       # zero to a positive power, whole or not, is zero
    ("[0, 4]^2", [0.0, 16.0]),
])
def test_a_plain_list_to_a_power_is_each_element_to_that_power(text, expected):
    assert list(ev(text).m_as("")) == pytest.approx(expected)


@pytest.mark.parametrize("text, error", [
    ("[-1, 4]^0.5", NumericError),          # (−1)^½ is not real
    ("[0, 4]^(-1)", DivisionByZeroError),   # 0^−1
])
def test_a_plain_list_to_a_power_refuses_what_one_element_cannot_take(text, error):
    with pytest.raises(error):
        ev(text)


# ---------------------------------------------------------------- constants

@pytest.mark.parametrize("table", ["OPERATORS", "FUNCTIONS", "CONSTANTS"])
def test_the_built_in_operators_functions_and_constants_cannot_be_changed_by_code_that_runs(table):
    # g, π and the rules of +, sqrt(), lookup() are the same for every sheet of a session: one sheet's plugin
    # cannot redefine them for the next (an entry is replaced only by writing the table itself)
    for entry in getattr(B, table).values():
        field = dataclasses.fields(entry)[0].name
        with pytest.raises(dataclasses.FrozenInstanceError):
            setattr(entry, field, getattr(entry, field))


def test_a_tables_shape_cannot_be_changed_once_read():
    # what the checker learnt of a table (its keys, each column's dimension) is what the evaluator reads
    from calcsheet import nodes as N
    from calcsheet.parser import parse_sheet

    sheet, diagnostics = parse_sheet("t =\n| x | y |\n| m | kN |\n| 1 | 2 |\n| 2 | 3 |\n")
    assert not diagnostics
    (td,) = [s for s in sheet.body if isinstance(s, N.TableDef)]
    info = B.table_info(td)
    assert [c for c, _ in info.columns] == ["x", "y"]
    with pytest.raises(dataclasses.FrozenInstanceError):
        info.name = "other"


# ---------------------------------------------------------------- limits hold at exactly their size

def _errors(text):
    import calcsheet

    r = calcsheet.run(text)
    return [d.code for d in r.errors], r


def test_a_statement_may_call_the_sheets_functions_exactly_the_limits_number_of_times(monkeypatch):
    # "more than MAX_FUNCTION_CALLS times" is refused: the limit itself is allowed (checked and evaluated)
    monkeypatch.setattr(B, "MAX_FUNCTION_CALLS", 5)
    codes, r = _errors("f(x) = x\ny = f(1) + f(1) + f(1) + f(1) + f(1)\n")
    assert codes == [] and r.values["y"].m_as("") == 5
    codes, _ = _errors("f(x) = x\ny = f(1) + f(1) + f(1) + f(1) + f(1) + f(1)\n")
    assert codes and set(codes) == {"too-complex"}, codes


def test_a_list_may_hold_exactly_the_limits_number_of_elements(monkeypatch):
    monkeypatch.setattr(B, "MAX_LIST_ITEMS", 3)
    codes, r = _errors("L = [1 m, 2 m, 3 m]\n")
    assert codes == [] and list(r.values["L"].m_as("m")) == [1, 2, 3]
    codes, _ = _errors("L = [1 m, 2 m, 3 m, 4 m]\n")
    assert codes and set(codes) == {"too-complex"}, codes


# ---------------------------------------------------------------- an error inside a sheet function's body

def _function_and_call():
    from calcsheet import nodes as N
    from calcsheet.parser import parse_sheet

    sheet, diagnostics = parse_sheet("f(x) = sqrt(x)\ny = f(-1)\n")
    assert not diagnostics
    fd = next(s for s in sheet.body if isinstance(s, N.FunctionDef))
    call = next(n for s in sheet.body if not isinstance(s, N.FunctionDef) for n in N.walk(s.expr)
                if isinstance(n, N.Call))
    return fd, call


def test_an_error_inside_a_functions_body_is_reported_at_the_call_naming_the_function():
    from calcsheet.errors import Span

    fd, call = _function_and_call()
    for span in (Span(1, 8, 1, 15), None):  # in the body (line 1), or nowhere yet
        exc = B.at_call(NumericError("sqrt of a negative number", span), fd, call)
        assert exc.message.startswith("in this call of f") and exc.message.endswith("sqrt of a negative number")
        assert exc.span == call.span


def test_an_error_already_located_outside_the_body_stays_where_it_is():
    from calcsheet.errors import Span

    fd, call = _function_and_call()
    for span in (Span(5, 1, 5, 4), Span(1, 8, 1, 15, path="other.calc")):  # another line; another file
        exc = B.at_call(NumericError("a table's unit is unknown", span), fd, call)
        assert exc.message == "a table's unit is unknown" and exc.span == span


# ---------------------------------------------------------------- words of an offset-temperature error

@pytest.mark.parametrize("text, ending", [
    ("20 degC * 2", "it cannot be multiplied"),
    ("20 degC / 2", "it cannot be divided"),
    ("20 degC ^ 2", "it cannot be raised to a power"),
    ("20 degC + 5 K", "it cannot be added to another value"),
])
def test_an_offset_temperature_error_says_what_cannot_be_done_with_it(text, ending):
    with pytest.raises(OffsetTemperatureError) as info:
        ev(text)
    assert str(info.value).endswith(ending), str(info.value)


# ---------------------------------------------------------------- a table's value

def test_two_tables_are_equal_when_their_shape_units_and_rows_are():
    # what the incremental rebuild compares to know whether a table changed
    from calcsheet import nodes as N
    from calcsheet.parser import parse_sheet

    def table(text):
        sheet, diagnostics = parse_sheet(text)
        assert not diagnostics
        (td,) = [s for s in sheet.body if isinstance(s, N.TableDef)]
        return B.make_table(td)

    base = "t =\n| x | y |\n| m | kN |\n| 1 | 2 |\n| 2 | 3 |\n"
    assert table(base) == table(base)
    assert table(base) != table(base.replace("| 2 | 3 |", "| 2 | 4 |"))    # a row differs
    assert table(base) != table(base.replace("| m | kN |", "| mm | kN |"))  # a unit differs
    assert table(base) != table(base.replace("| x | y |", "| x | z |"))    # a column's name differs


def test_a_definition_whose_value_is_not_of_its_declared_unit_is_refused_at_the_unit():
    # the evaluator itself (no checker in front): M [kN*m] = 2 kN is a force where a moment is declared; the
    # error points at the declared unit "[kN*m]", the place to change
    from calcsheet.errors import CalcError
    from calcsheet.parser import parse_statement

    stmt = parse_statement("M [kN*m] = 2 kN")
    with pytest.raises(CalcError) as info:
        Evaluator().evaluate_definition(stmt, {}, {})
    assert "declared [kN*m]" in str(info.value)
    assert info.value.span == stmt.unit_span and stmt.unit_span != stmt.span


# ---------------------------------------------------------------- unknown operands in min/max and lists

def test_min_and_max_take_the_dimension_of_their_known_arguments():
    nodes = [parse_expression(t) for t in ("a", "b", "c")]
    assert B._same_dims("min", [LENGTH, LENGTH, LENGTH], nodes) == LENGTH
    assert B._same_dims("max", [None, LENGTH, None], nodes) == LENGTH
    assert B._same_dims("max", [LENGTH, None], nodes[:2]) == LENGTH
    assert B._same_dims("min", [None, None], nodes[:2]) is None
    with pytest.raises(DimensionError):
        B._same_dims("min", [LENGTH, TEMP], nodes[:2])


def test_a_list_with_unknown_elements_takes_its_known_elements_dimension():
    node = parse_expression("[a, b, c]")
    assert B.rule_list_items([LENGTH, None, LENGTH], [False] * 3, node) == LENGTH
    assert B.rule_list_items([None, LENGTH, None], [False] * 3, node) == LENGTH
    with pytest.raises(DimensionError, match="element 3 of the list"):
        B.rule_list_items([LENGTH, None, TEMP], [False] * 3, node)


def test_zero_with_units_to_a_fractional_power_is_zero():
    # √(0 m²) = 0 m: zero is not negative (common practice)
    assert ev("(0 m^2)^0.5").m_as("m") == 0.0
    assert list(ev("[0 m^2, 4 m^2]^0.5").m_as("m")) == [0.0, 2.0]


def test_a_check_with_no_demand_holds_with_a_utilisation_of_zero():
    # utilisation = demand / capacity = 0 / 10 kN = 0 (common practice): a zero demand is no sign error
    from calcsheet.parser import parse_statement

    env = {"V_Ed": U.Quantity(0.0, "kN"), "V_Rd": U.Quantity(10.0, "kN")}
    for text in ("check V_Ed <= V_Rd", "check V_Rd >= V_Ed"):
        c = Evaluator().evaluate_check(parse_statement(text), env)
        assert c.ok and c.ratio == 0.0, (text, c)
