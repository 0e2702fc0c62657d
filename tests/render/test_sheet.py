"""Round trip: parse, print as sheet syntax, parse again — the same tree."""
from hypothesis import given, settings
from hypothesis import strategies as st

from calcsheet import nodes as N
from calcsheet.parser import parse_expression
from calcsheet.render.sheet import SheetPrinter

names = st.sampled_from(["L", "w", "sigma_b", "F_y", "E_0", "b", "h"])
numbers = st.builds(lambda v, u: N.Number(value=float(v), text=str(v), unit=(), unit_text=u),
                    st.integers(0, 999), st.sampled_from([""]))
units = st.sampled_from(["mm", "kN/m", "N/mm^2", "kN*m", "MPa", "deg"])


def quantity(v, u):
    return parse_expression(f"{v} {u}")


leaves = st.one_of(
    names.map(lambda n: N.Name(id=n)),
    numbers,
    st.builds(quantity, st.integers(1, 999), units),
)


def trees(children):
    binop = st.sampled_from([N.Add, N.Sub, N.Mul, N.Div])
    return st.one_of(
        st.builds(lambda cls, a, b: cls(left=a, right=b), binop, children, children),
        st.builds(lambda a: N.Pow(left=a, right=N.Number(value=2.0, text="2")), children),
        st.builds(lambda a: N.Neg(operand=a), children),
        st.builds(lambda a: N.Call(func="sqrt", args=(a,)), children),
        st.builds(lambda a, b: N.Call(func="max", args=(a, b)), children, children),
        st.builds(lambda a: N.FieldAccess(obj=N.Name(id="sec"), field_name="S_x") if a else a, st.just(True)),
    )


expressions = st.recursive(leaves, trees, max_leaves=12)


def strip(node):
    """The tree without the parentheses the printer had to add."""
    if isinstance(node, N.Paren):
        return strip(node.inner)
    if isinstance(node, N.BinOp):
        return type(node)(left=strip(node.left), right=strip(node.right))
    if isinstance(node, N.Neg):
        return N.Neg(operand=strip(node.operand))
    if isinstance(node, N.Call):
        return N.Call(func=node.func, args=tuple(strip(a) for a in node.args))
    return node


@settings(max_examples=300, deadline=None)
@given(expressions)
def test_print_then_parse_gives_the_same_tree(tree):
    text = SheetPrinter().expr(tree)
    assert strip(parse_expression(text)) == strip(tree), text


def test_sheet_text_round_trips():
    for text in ["w*L^2/8", "-a^2 + b*(c - d)/e", "sqrt(S/L) + max(a, b)", "section.tee(b=150 mm, h=sec.A)",
                 "if(h <= 150 mm, 1, (150 mm / h)^0.2)", "a - (b - c)", "a/(b*c)", "2^3^2"]:
        tree = parse_expression(text)
        assert strip(parse_expression(SheetPrinter().expr(tree))) == strip(tree), text
