"""Compact SVG: matplotlib's output without what no reader sees.

matplotlib writes SVG for round trips and debugging: six decimals on every
coordinate (a millionth of a point), one line and an indentation per
element, an id on every group, the font list repeated on every label, and a
metadata block.  :func:`compact` rewrites one figure so that it draws the
same at any zoom a reader uses, in about a third of the bytes:

* coordinates rounded to 0.1 pt (0.13 px at 96 dpi) and path data written
  without spaces around commands;
* a polyline thinned to the fewest points that keep it within 0.1 pt of
  every point dropped (the eye cannot see the difference; markers sit on
  the curve at their own positions and are kept);
* no indentation, no DOCTYPE or metadata, no ``id`` that nothing refers to,
  identity rotations removed, the font list written once in the stylesheet.

Text stays text (``svg.fonttype: none``) and is never changed: only
attribute values that hold geometry are rewritten.
"""

from __future__ import annotations

import re
from collections import Counter

__all__ = ["compact"]

_NUMBER = re.compile(r"-?\d+\.\d+(?:e-?\d+)?")
_GEOMETRY_ATTR = re.compile(r' (d|x|y|transform|points)="([^"]*)"')
_STYLE_ATTR = re.compile(r' style="([^"]*)"')
_ID_ATTR = re.compile(r' id="([^"]+)"')
_REFERENCE = re.compile(r'(?:href="#|url\(#)([^")]+)')
_FONT = re.compile(r"font-family: ?([^;\"]+);? ?")
_TOKEN = re.compile(r"[A-Za-z]|-?\d+(?:\.\d+)?(?:e-?\d+)?")
#: Distance (pt) below which a polyline point is dropped, and the rounding of coordinates.
TOLERANCE_PT = 0.1


def _round(match: re.Match[str]) -> str:
    return _fmt(float(match.group(0)))


def _simplify(points: list[tuple[float, float]]) -> list[tuple[float, float]]:
    """The fewest points whose polyline stays within :data:`TOLERANCE_PT` of every
    dropped point (Ramer-Douglas-Peucker: the error does not add up along a curve)."""
    if len(points) < 3:
        return points
    keep = [False] * len(points)
    keep[0] = keep[-1] = True
    spans = [(0, len(points) - 1)]
    while spans:
        first, last = spans.pop()
        ax, ay = points[first]
        dx, dy = points[last][0] - ax, points[last][1] - ay
        length = (dx * dx + dy * dy) ** 0.5
        worst, at = -1.0, -1
        if length:
            # The distance to the chord times its length: compared against the
            # tolerance times the length (the same choice of points, fewer divisions).
            cross = dy * ax - dx * ay
            for i in range(first + 1, last):
                bx, by = points[i]
                distance = abs(dx * by - dy * bx + cross)
                if distance > worst:
                    worst, at = distance, i
            worst /= length
        else:
            for i in range(first + 1, last):
                bx, by = points[i]
                distance = abs(bx - ax) + abs(by - ay)
                if distance > worst:
                    worst, at = distance, i
        if worst > TOLERANCE_PT:
            keep[at] = True
            spans += [(first, at), (at, last)]
    return [p for p, k in zip(points, keep, strict=True) if k]


#: Path commands matplotlib writes; a path of these letters and numbers separated by
#: white space is read by splitting, anything else by :data:`_TOKEN`.
_LETTERS = frozenset("MLQCz")


#: A path of such commands and numbers, each token on its own between white space: a
#: command letter, or a number's start (digit, sign or point) not ending in a letter.
_SPACED = re.compile(r"\s*(?:(?:[MLQCz]|[-.0-9](?:\S*[^\sA-Za-z])?)(?:\s+|\Z))*")


def _tokens(d: str) -> list[str]:
    if d.isascii() and _SPACED.fullmatch(d):
        return d.split()
    tokens = d.split()
    for token in tokens:
        if token not in _LETTERS and not (token[0].isdigit() or token[0] in "-."):
            return _TOKEN.findall(d)
        if len(token) > 1 and token[-1].isalpha():
            return _TOKEN.findall(d)
    return tokens


def _path(d: str) -> str:
    tokens = _tokens(d)
    out: list[str] = []
    run: list[tuple[float, float]] = []  # a polyline: M (or L after a curve) then L ... L
    opens = ["M"]  # the command of the run's first point

    def flush() -> None:
        for k, (x, y) in enumerate(_simplify(run)):
            out.append(f"{opens[0] if k == 0 else 'L'}{_fmt(x)} {_fmt(y)}")
        run.clear()

    i = 0
    count = len(tokens)
    while i < count:
        command = tokens[i]
        if (command == "M" or command == "L") and i + 2 < count:
            if command == "M":
                flush()
            if not run:  # a line after a curve stays a line, not a move
                opens[0] = command
            run.append((float(tokens[i + 1]), float(tokens[i + 2])))
            i += 3
            continue
        flush()
        if command.isalpha():
            out.append(command)
            i += 1
            numbers = []
            while i < count and not tokens[i].isalpha():
                numbers.append(_fmt(float(tokens[i])))
                i += 1
            out.append(" ".join(numbers))
        else:  # a stray number: keep it
            out.append(" " + _fmt(float(command)))
            i += 1
    flush()
    return "".join(out)


def _fmt(value: float) -> str:
    """``value`` to 0.1 (no trailing zero, no minus on zero)."""
    text = f"{value:.1f}"
    if text.endswith(".0"):
        text = text[:-2]
    return "0" if text == "-0" else text


#: Short geometry attributes already rewritten (axes frames, grids, tick marks and
#: markers repeat from figure to figure), kept for the process.
_DONE: dict[str, str] = {}


def _geometry(match: re.Match[str]) -> str:
    whole = match.group(0)
    done = _DONE.get(whole)
    if done is None:
        done = _rewrite(match.group(1), match.group(2))
        if len(whole) < 600 and len(_DONE) < 20_000:  # curves are new in every figure
            _DONE[whole] = done
    return done


def _rewrite(name: str, value: str) -> str:
    if name == "d":
        return f' d="{_path(value)}"'
    if name == "transform" and re.fullmatch(r"rotate\(-?0(?:\.0+)? [^)]*\)", value):
        return ""
    return f' {name}="{_NUMBER.sub(_round, value)}"'


#: Style attributes already rewritten, kept for the process (they repeat).
_STYLES: dict[str, str] = {}


def _style(match: re.Match[str]) -> str:
    whole = match.group(0)
    done = _STYLES.get(whole)
    if done is None:
        value = _STYLE_SPACE.sub(r"\1", match.group(1)).rstrip(";")
        done = f' style="{value}"' if value else ""
        if len(_STYLES) < 20_000:
            _STYLES[whole] = done
    return done


_STYLE_SPACE = re.compile(r"\s*([:;])\s*")


def compact(svg: bytes) -> bytes:
    """The same drawing in fewer bytes (see the module's description)."""
    text = svg.decode("utf-8")
    text = re.sub(r"<!DOCTYPE[^>]*>\s*", "", text)
    start = text.find("<metadata>")
    if start >= 0:
        end = text.find("</metadata>", start)
        if end >= 0:
            start = len(text[:start].rstrip())
            text = text[:start] + text[end + len("</metadata>"):]
    # The font list, once: the commonest font-family moves into the stylesheet.
    fonts = Counter(m.group(1).strip() for m in _FONT.finditer(text))
    if fonts:
        family = fonts.most_common(1)[0][0]
        text = re.sub(r"font-family: ?" + re.escape(family) + r";? ?", "", text)
        text = text.replace("</style>", f"\ntext{{font-family:{family}}}</style>", 1)
    text = _GEOMETRY_ATTR.sub(_geometry, text)
    text = _STYLE_ATTR.sub(_style, text)
    referenced = set(_REFERENCE.findall(text))
    text = _ID_ATTR.sub(lambda m: m.group(0) if m.group(1) in referenced else "", text)
    # matplotlib's pretty-printing: a newline and indentation between two tags.
    text = re.sub(r">\n\s*<", ">\n<", text)
    text = _unwrap_groups(text)
    text = _style_classes(text)
    return text.encode("utf-8")


_GROUP_TAG = re.compile(r"<g>\n?|<g\s[^>]*>|</g>\n?")


def _unwrap_groups(text: str) -> str:
    """Remove ``<g>`` elements without attributes (they only wrap), keeping their content."""
    out: list[str] = []
    stack: list[bool] = []  # True: this group's tags are dropped
    last = 0
    for match in _GROUP_TAG.finditer(text):
        out.append(text[last:match.start()])
        tag = match.group(0)
        if tag.startswith("</g>"):
            if not stack.pop():
                out.append(tag)
        elif tag.startswith("<g>"):
            stack.append(True)
        else:
            stack.append(False)
            out.append(tag)
        last = match.end()
    out.append(text[last:])
    return "".join(out)


def _style_classes(text: str) -> str:
    """A style written on several elements becomes one class in the stylesheet."""
    counts = Counter(_STYLE_ATTR.findall(text))
    shared = [style for style, n in counts.most_common() if n > 1 and len(style) > 12]
    if not shared or "</style>" not in text:
        return text
    names = {style: f"s{i}" for i, style in enumerate(shared)}
    text = _STYLE_ATTR.sub(lambda m: (f' class="{names[m.group(1)]}"' if m.group(1) in names
                                      else m.group(0)), text)
    rules = "".join(f"\n.{name}{{{style}}}" for style, name in names.items())
    return text.replace("</style>", rules + "</style>", 1)
