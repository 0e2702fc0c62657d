"""Printers: one class per output format (text, HTML math, JSON)."""
