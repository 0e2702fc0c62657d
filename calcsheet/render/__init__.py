"""Every output format: one printer per format, each in its own module.

Formulas: ``math`` (structure) with ``text``, ``html`` and ``sheet``; documents: ``document`` (the walk over
trace records) with ``text.TextDocument`` and ``page`` (the package page); ``json`` (the result as data);
``diff`` (a comparison as text, JSON, page); ``preview`` (the live preview's pages); ``check`` (the findings
of ``calcsheet check``). ``markup`` is the typed HTML string they all build with.
"""
