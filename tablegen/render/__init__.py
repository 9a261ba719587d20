"""Renderers: turn computed values into HTML, MathML, LaTeX and data files.

Renderers compute nothing: they receive planned pages and computed values and
only format them.
"""
