"""Safe text for the published pages: escaping, file-name slugs, numbers with units.

Catalogue text (names, synonyms, notes, sources) arrives through pull requests
and must never become live HTML or script, nor Markdown syntax (a Markdown
link ``[x](javascript:...)`` is as live as a ``<script>``).  :func:`escape`
replaces every character that HTML or the Markdown extensions in use could
read as syntax by a numeric character reference.  The result is inert in all
three places a template puts text: Markdown paragraphs and headings (a
character reference is not Markdown syntax and passes through unchanged), raw
HTML blocks and quoted HTML attributes (the browser shows the character).
Line breaks are folded into spaces so that no text can start a Markdown block
(heading, list, quote).

The templates never see raw text: the jinja2 environment of :mod:`.pages`
passes every value through :func:`escape` unless the code built it as
:class:`markupsafe.Markup` on purpose.

>>> str(escape('<script>alert("x")</script>'))
'&#60;script&#62;alert&#40;&#34;x&#34;&#41;&#60;/script&#62;'
>>> str(escape("[click](javascript:alert(1))"))
'&#91;click&#93;&#40;javascript&#58;alert&#40;1&#41;&#41;'
>>> str(escape("1-Butanol, CH3(CH2)3OH"))
'1-Butanol, CH3&#40;CH2&#41;3OH'
"""

from __future__ import annotations

import math
import re

from markupsafe import Markup

from builder.catalogue.records import PAIR_SEPARATOR, SLUG

__all__ = [
    "UnsafeName",
    "escape",
    "file_slug",
    "fmt",
    "mpl_text",
    "one_line",
    "safe_id",
]

#: Characters that HTML or Markdown (with the extensions the site enables:
#: toc, tables, admonition, arithmatex) can read as syntax.
_SPECIAL = set("&<>\"'`*_[](){}#!|$\\~^=:+")
_TABLE = {ord(c): f"&#{ord(c)};" for c in _SPECIAL}
_SUPERSCRIPT = str.maketrans("-0123456789", "⁻⁰¹²³⁴⁵⁶⁷⁸⁹")


class UnsafeName(ValueError):
    """An identifier that would become a file name is not a safe slug."""


def one_line(text: object) -> str:
    """Fold all whitespace (line breaks included) into single spaces."""
    return " ".join(str(text).split())


def escape(text: object) -> Markup:
    """Inert text for HTML, HTML attributes and Markdown alike (see the module doc)."""
    if isinstance(text, Markup):
        return text
    return Markup(one_line(text).translate(_TABLE))


def safe_id(identifier: str) -> str:
    """A catalogue id that becomes a file name: a slug, or a pair of slugs joined by ``--``.

    >>> safe_id("ethanol--water")
    'ethanol--water'
    >>> safe_id("../etc/passwd")
    Traceback (most recent call last):
    ...
    builder.site.text.UnsafeName: not a safe identifier for a file name: '../etc/passwd'
    """
    parts = identifier.split(PAIR_SEPARATOR)
    if len(parts) > 2 or not all(SLUG.match(p) for p in parts):
        raise UnsafeName(f"not a safe identifier for a file name: {identifier!r}")
    return identifier


def file_slug(text: str) -> str:
    """A file-name slug made from generated text (e.g. ``isobar-101.325kPa``).

    >>> file_slug("isobar-101.325kPa")
    'isobar-101-325kpa'
    >>> file_slug("isotherm--10C")
    'isotherm-m10c'
    """
    lowered = text.lower().replace("--", "-m")
    slug = re.sub(r"[^a-z0-9]+", "-", lowered).strip("-")
    if not SLUG.match(slug):
        raise UnsafeName(f"cannot make a file name from {text!r}")
    return slug


def mpl_text(text: object) -> str:
    """Catalogue text for a matplotlib label: ``$`` would start mathtext.

    >>> mpl_text("cost $5")
    'cost \\\\$5'
    """
    return one_line(text).replace("\\", "\\\\").replace("$", r"\$")


def fmt(value: float | None, digits: int = 4, *, fixed: bool = False, missing: str = "—"
        ) -> str:
    """A number for a page: ``digits`` significant figures (or decimals when ``fixed``).

    >>> fmt(351.44), fmt(0.000123), fmt(None), fmt(float("nan")), fmt(78.234, 1, fixed=True)
    ('351.4', '0.000123', '—', '—', '78.2')
    >>> fmt(-0.5, 3), fmt(1.5e-7, 2)
    ('−0.5', '1.5×10⁻⁷')
    """
    if value is None or not math.isfinite(value):
        return missing
    text = f"{value:.{digits}f}" if fixed else f"{value:.{digits}g}"
    if "e" in text:
        mantissa, exponent = text.split("e")
        text = f"{mantissa}×10{str(int(exponent)).translate(_SUPERSCRIPT)}"
    return text.replace("-", "−")
