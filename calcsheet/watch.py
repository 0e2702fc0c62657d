"""Live preview: rebuild the HTML package whenever the sheet is saved, and serve it on loopback.

The sheet's modification time is polled (no new dependency); each save
rebuilds incrementally from the last good run. A good build is written to
disk atomically; a build with errors leaves the last good package on disk
and shows the diagnostics in the browser instead. The server binds
127.0.0.1 only and refuses any peer that is not loopback and any Host header
that is not this server (so a web page elsewhere cannot read it through DNS
rebinding). The page refreshes itself by polling ``/version`` on its own
origin.
"""
from __future__ import annotations

import ipaddress
import json
import operator
import secrets
import threading
import time
import weakref
from http.server import BaseHTTPRequestHandler, ThreadingHTTPServer
from pathlib import Path

from .render.preview import error_page, message_page, refresh_script
from .trace import FunctionStep as _FunctionStep

HOST = "127.0.0.1"
POLL_SECONDS = 0.25


def is_loopback(address: str) -> bool:
    try:
        ip = ipaddress.ip_address(address.split("%", 1)[0])
    except ValueError:
        return False
    if ip.version == 6 and ip.ipv4_mapped is not None:
        ip = ip.ipv4_mapped
    return ip.is_loopback


_PAGE_END = "\n</body></html>"


def with_script(page: str, script: str) -> str:
    """The package page with the preview's refresh script where ``PackageDocument`` puts its
    ``watch_script``: the same page, byte for byte, as rendering it a second time with the script."""
    page = str(page)  # plain text from here: the page and the script are both finished markup
    if not page.endswith(_PAGE_END):
        raise ValueError("not a package page")
    return page[:-len(_PAGE_END)] + str(script) + _PAGE_END


def _value_key(v):
    """A hashable stand-in for a value a formula prints, or None when it cannot be vouched for."""
    import pint

    if isinstance(v, pint.Quantity):
        m = v.magnitude
        return ("q", repr(m), v._units) if isinstance(m, (int, float)) else None
    if isinstance(v, (str, int, float)) or v is None:
        return ("v", type(v).__name__, v)
    return None


def _names(*exprs) -> set[str]:
    """The names a formula prints, each possibly a link: its symbols and its fields (``sec.A``)."""
    from . import nodes as N
    from .names import dotted

    out = set()
    for e in exprs:
        if e is not None:
            for n in N.walk(e):
                if isinstance(n, N.Name):
                    out.add(n.id)
                elif isinstance(n, N.FieldAccess):
                    key = dotted(n)
                    if key:
                        out.add(key)
    return out


class _Expr:
    """A formula as part of a memo key: equal when the formulas are equal, hashed once per formula object.

    A frozen node hashes by walking its whole tree on every call; an unchanged step's formula is the same
    object from one save to the next (the fast rebuild keeps the parsed sheet), so its hash and the names
    it reads are worked out once and kept while a memo key holds them.
    Equality stays structural, so a formula re-parsed by a full run still finds its printed parts.
    """

    __slots__ = ("expr", "names", "_hash", "__weakref__")

    def __init__(self, expr):
        self.expr = expr
        self.names = tuple(sorted(_names(expr)))
        self._hash = hash(expr)

    def __hash__(self):
        return self._hash

    def __eq__(self, other):
        return isinstance(other, _Expr) and (self.expr is other.expr or self.expr == other.expr)


_KNOWN: dict[int, weakref.ref] = {}  # id(formula) -> its _Expr, while a memo key (or a caller) holds that


def _known(expr) -> _Expr | None:
    """The memo-key form of ``expr`` (None stays None), made once per formula object while it is in use.

    The table holds the ``_Expr`` weakly: it lives as long as a memo's key holds it (and it holds its
    formula, so the id cannot pass to another object meanwhile); then its entry goes.
    """
    if expr is None:
        return None
    k = id(expr)
    ref = _KNOWN.get(k)
    if ref is not None:
        hit = ref()
        if hit is not None and hit.expr is expr:
            return hit
    made = _Expr(expr)

    def gone(ref, k=k, known=_KNOWN):  # the dict itself: at interpreter exit the global may be gone
        if known.get(k) is ref:
            del known[k]

    _KNOWN[k] = weakref.ref(made, gone)
    return made


class _Token:
    """A memo key's contents with their hash worked out once; ``names``: the names the record shows."""

    __slots__ = ("key", "names", "_hash")

    def __init__(self, key: tuple, names: tuple):
        self.key = key
        self.names = names
        self._hash = hash(key)

    def __hash__(self):
        return self._hash

    def __eq__(self, other):
        return self is other or (isinstance(other, _Token) and self._hash == other._hash and self.key == other.key)


class PartsMemo:
    """The formula parts of each step and check, remembered from one save to the next.

    The math of a step is most of what a package page costs to render, and after an edit most steps print
    exactly as before. A part is reused only when everything it prints from is equal: the record's formula,
    values, units and substituted values, the literals the substitution shows for inputs, the links of the
    names it shows, and the printer's settings. Records with a plugin's working, or with values other
    than scalars and text, are always printed afresh. Only the parts used by the latest page are kept,
    with the page's lists of blocks beside the records that printed them (see ``PreviewDocument``).
    """

    def __init__(self):
        self.previous: dict = {}
        self.current: dict = {}

    def next_page(self) -> None:
        self.previous, self.current = self.current, {}

    @staticmethod
    def names(*exprs) -> set[str]:
        out: set[str] = set()
        for e in exprs:
            if e is not None:
                out.update(_known(e).names)
        return out

    def get(self, key, make):
        if key is None:
            return make()
        hit = self.current.get(key)
        if hit is None:
            hit = self.previous.get(key)
            if hit is None:
                hit = make()
            self.current[key] = hit
        return hit


class _MemoPrinter:
    """The HTML math printer of a preview page, asking the memo before printing a step's or check's parts."""

    def __init__(self, printer, memo: PartsMemo):
        self._printer = printer
        self._memo = memo
        self._settings = tuple(sorted(printer.settings.items()))
        # the printer's own calls too (a value substituted into a formula is most often a value some step
        # printed as its result): this printer belongs to one page, so its method is shadowed, not changed
        self._value = printer.value
        printer.value = self.value

    def __getattr__(self, name):
        return getattr(self._printer, name)

    def value(self, value, unit=None, sigfigs=None):
        vk = _value_key(value)
        key = None if vk is None else ("value", vk, unit, sigfigs, self._settings)
        return self._memo.get(key, lambda: self._value(value, unit, sigfigs))

    def expr(self, node, values=None, link=None, **kw):
        if values is None and not kw and node is not None:  # a formula as written, no values substituted
            k = _known(node)
            links = None if link is None else tuple([link(n) for n in k.names])
            return self._memo.get(("expr", k, links, self._settings), lambda: self._printer.expr(node, link=link))
        return self._printer.expr(node, values, link, **kw)

    def _content(self, used, exprs, values, unit):
        """The part of a record's key that its values make, as one token hashed once, or None.

        Worked out from the values the first time a record's ``used`` dict, values and formulas are seen;
        an unchanged record of the next save shares those very objects (a rebuild copies the record, not
        its contents), so it finds its token by their identities. The entry holds the objects, so an id is
        never that of a later object.
        """
        objs = (used, unit, *exprs, *values)
        ident = ("content", self._settings, *map(id, objs))
        memo = self._memo
        hit = memo.current.get(ident)
        if hit is None:
            hit = memo.previous.get(ident)
        if hit is None or not all(map(operator.is_, hit[0], objs)):
            hit = (objs, self._make_content(used, exprs, values, unit))
        memo.current[ident] = hit
        return hit[1]

    def _make_content(self, used, exprs, values, unit):
        keys = []
        for v in values:
            vk = _value_key(v)
            if vk is None:
                return None
            keys.append(vk)
        for k in sorted(used):
            v, u = used[k]
            vk = _value_key(v)
            if vk is None:
                return None
            keys.append((k, vk, u))
        names = tuple(sorted(self._memo.names(*exprs).union(used)))
        return _Token((self._settings, unit, tuple(keys), tuple(_known(e) for e in exprs)), names)

    @staticmethod
    def _context(token, link, exact):
        names = token.names
        return (token,
                None if link is None else tuple([link(n) for n in names]),
                None if exact is None else tuple([_known(exact.get(n)) for n in names]))

    def step_key(self, step, link=None, exact=None):
        """What a step's formula parts print from, or None when they cannot be vouched for."""
        if type(step) is _FunctionStep or step.working is not None:
            return None
        token = self._content(step.used, (step.expr, step.shown_expr), (step.value, step.overridden),
                              step.display_unit)
        if token is None:
            return None
        return ("step", step.name, self._context(token, link, exact))

    def check_key(self, check, link=None, exact=None):
        token = self._content(check.used, (check.left, check.right, check.shown_left, check.shown_right), (),
                              check.op)
        if token is None:
            return None
        return ("check", self._context(token, link, exact))

    # On a miss the printer's own method runs with this memo as its ``self``, so the symbolic formula of a
    # step whose values changed (the same formula, the same links) is not printed again either.
    def step_parts(self, step, link=None, exact=None):
        return self._memo.get(self.step_key(step, link, exact),
                              lambda: type(self._printer).step_parts(self, step, link, exact))

    def check_parts(self, check, link=None, exact=None):
        return self._memo.get(self.check_key(check, link, exact),
                              lambda: type(self._printer).check_parts(self, check, link, exact))

    def check_symbol(self, check, link=None):
        return type(self._printer).check_symbol(self, check, link)  # its two formulas are memo entries


_PAGE = ("page",)  # the memo's entry for what every block of a page prints from: settings, links, literals, marks


def _stale_names(previous: tuple, current: tuple) -> set[str] | None:
    """The names whose link, literal or "changed" mark differ between two pages' contexts; None when the
    printer's settings differ (then nothing printed on the previous page may be reused by identity)."""
    if previous is None or previous[0] != current[0]:
        return None
    stale = set(previous[3].symmetric_difference(current[3]))
    for old, new in ((previous[1], current[1]), (previous[2], current[2])):  # links, literals of inputs
        if old is new:
            continue
        for name, v in new.items():
            o = old.get(name)
            if o is not v and (o is None or o != v):
                stale.add(name)
        stale.update(old.keys() - new.keys())
    return stale


def _renumbered(items: list, old_items: list, old_numbered: list) -> list | None:
    """``number_items(items)`` from the last page's numbering of ``old_items``, or None when it cannot be.

    The numbers depend only on where the headings (and their levels) and the steps and checks stand, so
    when every place holds the same record as before, or a step or check where one stood, or an unnumbered
    record where one stood, each place keeps its number: a kept record its numbered copy, a new one a copy
    under the old number.
    """
    from .trace import CheckResult, Heading, Step, copied

    counted, numbered = (Step, CheckResult), (Heading, Step, CheckResult)
    out = []
    for item, old, done in zip(items, old_items, old_numbered):
        if item is old:
            out.append(done)
        elif isinstance(item, counted) and isinstance(old, counted):
            out.append(copied(item, number=done.number))
        elif not isinstance(item, numbered) and not isinstance(old, numbered):
            out.append(item)
        else:
            return None
    return out


def _document_class():
    from .render.page import PackageDocument
    from .trace import CheckResult, Heading, Prose, Step

    class PreviewDocument(PackageDocument):
        """The package document, reusing a record's whole printed block when nothing it shows changed.

        A list of blocks (the calculation's records, the summary's rows, the inputs' rows) is laid beside
        the same list of the last page: a block whose place holds the very record that printed it there,
        under the same number, is taken as it was unless a name it shows has a new link, literal or
        "changed" mark (a fast rebuild keeps an unchanged record's object, so after an edit only the
        records it reached are looked at). Any other block is found by what it prints from (its content
        key: formula parts, values, number, anchor, description, marks, verdict), which a full run's
        records find again; failing that it is printed. Each block's content key is kept for the next page.
        """

        def __init__(self, result, memo: PartsMemo, **options):
            self.memo = memo
            super().__init__(result, **options)
            self.printer = _MemoPrinter(self.printer, memo)
            context = (self.printer._settings, self.anchors, self.exact, frozenset(self.changed))
            self._stale = _stale_names(memo.previous.get(_PAGE), context)
            memo.current[_PAGE] = context

        def number(self, items):
            """The numbered records of the last page where the same records stand in the same places."""
            memo = self.memo
            prev = memo.previous.get(("numbered",))
            out = None if prev is None or len(prev[0]) != len(items) else _renumbered(items, *prev)
            if out is None:
                out = super().number(items)
            memo.current[("numbered",)] = (list(items), out)
            return out

        # ---------------------------------------------------------------- lists of blocks
        def _reuse(self, kind, records, numbers, items, make):
            """The blocks of ``items``; ``records[i]`` is item i as the run made it (before numbering),
            ``numbers[i]`` what places it (its number; an input row's name). ``make(item)`` prints one:
            (markup, the names it shows or None when it may not be reused by its record, content key)."""
            memo = self.memo
            prev = memo.previous.get(kind)
            n = len(items)
            stale = self._stale
            if prev is not None and stale is not None and len(prev[0]) == n:
                blocks, names, keys = list(prev[2]), list(prev[3]), list(prev[4])
                redo = [i for i, same, number, shown in zip(range(n), map(operator.is_, records, prev[0]),
                                                           map(operator.eq, numbers, prev[1]), names)
                        if not (same and number) or shown is None or (stale and not stale.isdisjoint(shown))]
            else:
                blocks, names, keys = [None] * n, [None] * n, [None] * n
                redo = range(n)
            for i in redo:
                blocks[i], names[i], keys[i] = make(items[i])
            memo.current[kind] = (list(records), list(numbers), blocks, names, keys)
            memo.current.update(filter(operator.itemgetter(0), zip(keys, blocks)))  # found by content next time
            return list(blocks)  # the caller's to extend

        def _content_block(self, key, make):
            memo = self.memo
            hit = memo.current.get(key)
            if hit is None:
                hit = memo.previous.get(key)
                if hit is None:
                    hit = make()
            return hit

        def blocks(self, items):
            records = self.result.items  # numbered one for one into items
            if len(records) != len(items):
                return super().blocks(items)
            return self._reuse(("blocks",), records, [getattr(i, "number", None) for i in items], items, self._block)

        def summary_rows(self, checks):
            records = [i for i in self.result.items if isinstance(i, CheckResult)]  # numbered into checks
            if len(records) != len(checks):
                return super().summary_rows(checks)
            return self._reuse(("summary",), records, [c.number for c in checks], checks, self._summary_row)

        def input_rows(self, names):
            steps = self.result.steps
            return self._reuse(("inputs",), [steps[n] for n in names], names, names, self._input_row)

        # ---------------------------------------------------------------- one block
        def _block(self, item):
            cls = type(item)
            if cls is Step:
                return self._step_block(item)
            if cls is CheckResult:
                return self._check_block(item)
            # a heading prints its text under its number; prose its text
            return self.record(item), (() if cls is Heading or cls is Prose else None), None

        def _step_block(self, step):
            pk = self.printer.step_key(step, self.link, self.exact)
            if pk is None:
                return PackageDocument._print_Step(self, step), None, None
            token = pk[2][0]
            key = _Token(("step-block", pk, step.number, step.anchor, step.is_input, step.description, step.note,
                          step.name in self.changed), ())
            block = self._content_block(key, lambda: PackageDocument._print_Step(self, step))
            return block, (None if step.after else (step.name, *token.names)), key

        def _check_block(self, c):
            ck = self.printer.check_key(c, self.link, self.exact)
            if ck is None:
                return PackageDocument._print_CheckResult(self, c), None, None
            key = _Token(("check-block", ck, c.number, c.anchor, c.ok, c.ratio, c.description), ())
            block = self._content_block(key, lambda: PackageDocument._print_CheckResult(self, c))
            return block, (None if c.after else ck[1][0].names), key

        def _summary_row(self, c):
            ck = self.printer.check_key(c, self.link)
            if ck is None:
                return PackageDocument.summary_row(self, c), None, None
            demand, capacity = _value_key(c.demand), _value_key(c.capacity)
            key = (None if demand is None or capacity is None else
                   _Token(("summary-row", ck, c.number, c.anchor, c.ok, c.ratio, c.description, demand, capacity), ()))
            row = self._content_block(key, lambda: PackageDocument.summary_row(self, c))
            return row, ck[1][0].names, key

        def _input_row(self, name):
            # the row shows its record and the literal the sheet wrote for it, which is the record's own
            # formula (``exact_inputs``): it shows no other name, so only a new record is printed again
            step = self.result.steps[name]
            value, overridden = _value_key(step.value), _value_key(step.overridden)
            key = (None if value is None or overridden is None else
                   _Token(("input-row", name, step.anchor, step.description, value, step.display_unit, overridden,
                           _known(self.exact.get(name)), self.printer._settings), ()))
            row = self._content_block(key, lambda: PackageDocument.input_row(self, name, step))
            return row, (), key

        # ---------------------------------------------------------------- a record printed alone
        def _print_Step(self, step, inner: bool = False):
            if inner or type(step) is not Step:
                return super()._print_Step(step, inner)
            return self._step_block(step)[0]

        def _print_CheckResult(self, c, inner: bool = False):
            if inner:
                return super()._print_CheckResult(c, inner)
            return self._check_block(c)[0]

    return PreviewDocument


def preview_document(result, memo: PartsMemo | None = None, **options):
    """The package document of ``result``; with ``memo``, unchanged steps reuse their printed formulas."""
    from .render.page import PackageDocument

    if memo is None:
        return PackageDocument(result, **options)
    global _PreviewDocument
    if _PreviewDocument is None:
        _PreviewDocument = _document_class()
    return _PreviewDocument(result, memo, **options)


_PreviewDocument = None


class Preview:
    """The state the server shows: the latest page and its version number."""

    def __init__(self, sheet: Path, out_dir: Path, *, paper: str | None = None, overrides: dict | None = None):
        self.sheet = Path(sheet)
        self.out_dir = Path(out_dir)
        self.paper = paper
        self.overrides = dict(overrides or {})
        self.version = 0
        self.page = b""
        self.nonce = secrets.token_urlsafe(16)
        self.last_good = None  # the last Result without errors
        self.last_good_path: Path | None = None
        self.last_status = ""
        self.lock = threading.Lock()
        self._seen = None
        self.memo = PartsMemo()  # formula parts of the last page, reused for the steps an edit left alone

    def _signature(self):
        """Modification stamps of the sheet and of every file it included last time."""
        try:
            st = self.sheet.stat()
        except FileNotFoundError:
            return None
        sig = [(st.st_mtime_ns, st.st_size)]
        for path, _ in (self.last_good.includes if self.last_good is not None else []):
            try:
                inc = Path(path).stat()
                sig.append((path, inc.st_mtime_ns, inc.st_size))
            except FileNotFoundError:
                sig.append((path, None))
        return tuple(sig)

    def changed(self) -> bool:
        sig = self._signature()
        if sig is None or sig == self._seen:
            return False
        self._seen = sig
        return True

    def build(self) -> str:
        """Rebuild from the sheet on disk; returns a one-line status."""
        from .incremental import rebuild
        from .package import write_package

        from . import reading
        from .errors import CalcError

        try:
            source = reading.read_text(self.sheet, "SHEET_BYTES", "sheet")
        except CalcError as exc:
            return self._publish_text(f"{self.sheet}:{exc.span.line}:{exc.span.col}: {exc.message}")
        previous = self.last_good
        if previous is not None and previous.path != str(self.sheet):
            previous = None
        if previous is None:
            from .engine import run

            result = run(source, overrides=self.overrides, path=str(self.sheet))
        else:
            result = rebuild(previous, source, overrides=self.overrides).result
        version = self.version + 1
        if result.ok:
            self.memo.next_page()
            page = preview_document(result, self.memo, paper=self.paper).html()  # rendered once per save
            written = write_package(result, self.out_dir, ["html"], html=page)
            self.last_good = result
            self.last_good_path = written[0]
            html = with_script(page, refresh_script(version, self.nonce))
            n_ng = sum(1 for c in result.checks if not c.ok)
            status = f"built {written[0]} ({len(result.checks)} checks, {n_ng} NG)"
        else:
            html = error_page(str(self.sheet), result, self.last_good_path, version, self.nonce)
            status = f"{len(result.errors)} error(s); last good package kept"
        with self.lock:
            self.page = html.encode("utf-8")
            self.version = version
            self.last_status = status
        return status

    def _publish_text(self, message: str) -> str:
        html = message_page(message, self.version + 1, self.nonce)
        with self.lock:
            self.page = html.encode("utf-8")
            self.version += 1
        return message

    def snapshot(self) -> tuple[int, bytes]:
        with self.lock:
            return self.version, self.page


class LoopbackServer(ThreadingHTTPServer):
    daemon_threads = True
    allow_reuse_address = True

    def __init__(self, port: int, preview: Preview):
        self.preview = preview
        super().__init__((HOST, port), _Handler)

    def verify_request(self, request, client_address) -> bool:
        """Connections from anything but loopback are closed before a byte is read."""
        return is_loopback(str(client_address[0]))

    @property
    def port(self) -> int:
        return self.server_address[1]


class _Handler(BaseHTTPRequestHandler):
    server: LoopbackServer
    protocol_version = "HTTP/1.1"
    timeout = 10  # seconds a connection may sit idle or trickle a request (the socket's timeout)
    MAX_PATH = 2048  # the preview's routes are short; a longer request target is refused unread

    def log_message(self, fmt, *args):  # quiet: the terminal shows build status instead
        pass

    def _host_ok(self) -> bool:
        host = (self.headers.get("Host") or "").strip().lower()
        port = self.server.port
        return host in {f"127.0.0.1:{port}", f"localhost:{port}"}

    def _send(self, status: int, body: bytes, ctype: str):
        self.send_response(status)
        self.send_header("Content-Type", ctype)
        self.send_header("Content-Length", str(len(body)))
        self.send_header("Cache-Control", "no-store")
        self.send_header("X-Content-Type-Options", "nosniff")
        self.send_header("Referrer-Policy", "no-referrer")
        self.send_header("Cross-Origin-Resource-Policy", "same-origin")
        self.send_header("Content-Security-Policy",
                         f"default-src 'none'; script-src 'nonce-{self.server.preview.nonce}'; "
                         "style-src 'unsafe-inline'; img-src data:; font-src data:; connect-src 'self'; "
                         "base-uri 'none'; form-action 'none'; frame-ancestors 'none'")
        self.end_headers()
        if self.command != "HEAD":
            self.wfile.write(body)

    def do_GET(self):
        if not is_loopback(self.client_address[0]) or not self._host_ok():
            self._send(403, b"forbidden: the preview answers only to 127.0.0.1\n", "text/plain; charset=utf-8")
            return
        if len(self.path) > self.MAX_PATH:
            self._send(414, b"request target too long\n", "text/plain; charset=utf-8")
            return
        version, page = self.server.preview.snapshot()
        route = self.path.split("?", 1)[0]
        if route in ("/", "/index.html"):
            self._send(200, page, "text/html; charset=utf-8")
        elif route == "/version":
            self._send(200, json.dumps({"version": version}).encode(), "application/json")
        else:
            self._send(404, b"not found\n", "text/plain; charset=utf-8")

    do_HEAD = do_GET

    def do_POST(self):
        self.close_connection = True  # a body is never read: the connection ends instead of parsing it
        self._send(405, b"method not allowed\n", "text/plain; charset=utf-8")

    do_PUT = do_DELETE = do_PATCH = do_POST


class Watcher:
    """Polls the sheet and rebuilds on every save; serve() blocks, start() runs in the background."""

    def __init__(self, sheet: Path, out_dir: Path, port: int = 8321, *, paper: str | None = None,
                 overrides: dict | None = None, log=print):
        self.preview = Preview(sheet, out_dir, paper=paper, overrides=overrides)
        self.server = LoopbackServer(port, self.preview)
        self.log = log
        self._stop = threading.Event()
        self._threads: list[threading.Thread] = []

    @property
    def url(self) -> str:
        return f"http://{HOST}:{self.server.port}/"

    def poll_once(self) -> bool:
        if self.preview.changed():
            self.log(time.strftime("%H:%M:%S ") + self.preview.build())
            return True
        return False

    def _poll_loop(self):
        while not self._stop.is_set():
            try:
                self.poll_once()
            except Exception as exc:  # a bug in one build must not end the preview
                self.log(f"build failed: {type(exc).__name__}: {exc}")
            self._stop.wait(POLL_SECONDS)

    def start(self) -> "Watcher":
        self.poll_once()
        for target in (self._poll_loop, self.server.serve_forever):
            t = threading.Thread(target=target, daemon=True)
            t.start()
            self._threads.append(t)
        return self

    def stop(self):
        self._stop.set()
        self.server.shutdown()
        self.server.server_close()
        for t in self._threads:
            t.join(timeout=5)

    def serve(self):
        self.start()
        self.log(f"previewing {self.preview.sheet} at {self.url} (Ctrl-C to stop)")
        try:
            while not self._stop.is_set():
                self._stop.wait(1.0)
        except KeyboardInterrupt:
            pass
        finally:
            self.stop()
