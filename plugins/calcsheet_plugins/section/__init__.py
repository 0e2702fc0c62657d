"""Cross-section properties plugin (namespace ``section``); see functions.py for the sheet form."""
from .functions import namespace

__all__ = ["namespace"]
