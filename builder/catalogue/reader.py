"""Read one catalogue YAML file safely: bounded in size and depth, no duplicate keys.

A catalogue file is data from a pull request, so reading it must never crash
or exhaust memory.  The reader

* refuses files larger than :data:`MAX_FILE_BYTES` and text that is not UTF-8;
* parses with PyYAML's safe loader only (no Python-object tags);
* refuses nesting deeper than :data:`MAX_DEPTH` (checked on the event stream,
  before any recursive construction) and documents that expand, through
  aliases, to more than :data:`MAX_NODES` nodes (an "alias bomb");
* refuses a key written twice in one mapping (YAML's rule, which PyYAML does
  not enforce: the second value silently replaced the first);
* refuses integers too large for a float.

Every refusal is a :class:`ReadProblem` with the line and column when known.
"""

from __future__ import annotations

from pathlib import Path
from typing import Any

import yaml
from yaml.nodes import MappingNode, Node, ScalarNode, SequenceNode

__all__ = ["MAX_DEPTH", "MAX_FILE_BYTES", "MAX_NODES", "ReadProblem", "read_yaml"]

MAX_FILE_BYTES = 1_000_000
MAX_DEPTH = 32
MAX_NODES = 50_000
MAX_INTEGER_DIGITS = 30


class ReadProblem(ValueError):
    """A file that cannot be read as a catalogue file: ``expected`` and ``found``."""

    def __init__(self, expected: str, found: str) -> None:
        super().__init__(f"expected {expected}; found {found}")
        self.expected = expected
        self.found = found


def _where(mark: Any) -> str:
    return f" at line {mark.line + 1}, column {mark.column + 1}" if mark is not None else ""


# libyaml's parser when available (about ten times faster); PyYAML's pure-Python one otherwise.
_BASE: type[yaml.SafeLoader] = getattr(yaml, "CSafeLoader", yaml.SafeLoader)


class _StrictLoader(_BASE):  # type: ignore[valid-type,misc]
    """The safe loader, refusing duplicate keys and huge integers."""

    def construct_mapping(self, node: MappingNode, deep: bool = False) -> dict[Any, Any]:
        seen: dict[Any, Node] = {}
        for key_node, _value in node.value:
            if isinstance(key_node, ScalarNode):
                key = key_node.value
                if key in seen:
                    raise ReadProblem(
                        "each key once in a mapping",
                        f"the key {key!r} a second time{_where(key_node.start_mark)} "
                        f"(first{_where(seen[key].start_mark)})")
                seen[key] = key_node
        return super().construct_mapping(node, deep=deep)


def _construct_int(loader: yaml.SafeLoader, node: ScalarNode) -> int:
    digits = sum(ch.isdigit() for ch in str(node.value))
    if digits > MAX_INTEGER_DIGITS:
        raise ReadProblem("a number of ordinary size",
                          f"an integer of {digits} digits{_where(node.start_mark)}")
    return int(yaml.SafeLoader.construct_yaml_int(loader, node))


_StrictLoader.add_constructor("tag:yaml.org,2002:int", _construct_int)


def _check_events(text: str) -> None:
    """Depth and size limits on the event stream (iterative: no recursion)."""
    depth = 0
    events = 0
    for event in yaml.parse(text, Loader=_BASE):
        events += 1
        if isinstance(event, (yaml.MappingStartEvent, yaml.SequenceStartEvent)):
            depth += 1
            if depth > MAX_DEPTH:
                raise ReadProblem(f"nesting at most {MAX_DEPTH} levels deep",
                                  f"deeper nesting{_where(event.start_mark)}")
        elif isinstance(event, (yaml.MappingEndEvent, yaml.SequenceEndEvent)):
            depth -= 1
        if events > MAX_NODES:
            raise ReadProblem(f"at most {MAX_NODES} values in one file", "more")


def _expanded_size(root: Node) -> int:
    """Nodes the document holds once aliases are expanded (without expanding them)."""
    sizes: dict[int, int] = {}
    # Post-order over the node graph with an explicit stack; the depth is already bounded.
    stack: list[tuple[Node, bool]] = [(root, False)]
    while stack:
        node, done = stack.pop()
        if id(node) in sizes:
            continue
        children: list[Node] = []
        if isinstance(node, SequenceNode):
            children = list(node.value)
        elif isinstance(node, MappingNode):
            children = [n for pair in node.value for n in pair]
        if done:
            total = 1 + sum(sizes[id(c)] for c in children)
            sizes[id(node)] = min(total, MAX_NODES + 1)
        else:
            stack.append((node, True))
            stack.extend((c, False) for c in children if id(c) not in sizes)
    return sizes[id(root)]


def read_yaml(path: Path) -> Any:
    """The data of one YAML file, or :class:`ReadProblem` (OSError when unreadable)."""
    size = path.stat().st_size
    if size > MAX_FILE_BYTES:
        raise ReadProblem(f"a file of at most {MAX_FILE_BYTES // 1000} kB",
                          f"{size // 1000} kB")
    raw = path.read_bytes()
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError as error:
        line = raw[:error.start].count(b"\n") + 1
        raise ReadProblem("text encoded as UTF-8",
                          f"the byte 0x{raw[error.start]:02x} at line {line}, which is not "
                          "UTF-8 (save the file as UTF-8)") from None
    try:
        _check_events(text)
        loader = _StrictLoader(text)
        try:
            node = loader.get_single_node()
            if node is None:
                return None
            if _expanded_size(node) > MAX_NODES:
                raise ReadProblem(f"at most {MAX_NODES} values once aliases are expanded",
                                  "more (aliases that repeat each other)")
            return loader.construct_document(node)
        finally:
            loader.dispose()
    except yaml.YAMLError as error:
        mark = getattr(error, "problem_mark", None)
        problem = getattr(error, "problem", None) or str(error)
        raise ReadProblem("valid YAML", f"a syntax error{_where(mark)}: {problem}") from None
