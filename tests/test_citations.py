"""Every number cites the publication it comes from, never a program or its data files.

Project rule (BRIEF/DEVELOPERS.md): a source names the publication (author, title, year,
table or page); a transcription route may appear only in a note.  For activity-model sets
from the DECHEMA Chemistry Data Series, the source gives volume, part and page, or says
that the page was not recorded in the transcription.
"""

from __future__ import annotations

import re
from pathlib import Path

import pytest

from builder.catalogue.loader import DEFAULT_CATALOGUE, Catalogue
from builder.catalogue.records import Source

#: Names of programs and data files that must not appear as a source (where, title, ...).
PROGRAM_NAMES = re.compile(r"chemsep|\.ipd\b|\.json\b|thermo package|chemicals package|"
                           r"coolprop|aspen|dwsim|chemcad|pro/ii", re.IGNORECASE)
DECHEMA_WHERE = re.compile(r"^Vol\. I, Part \w+, p\. \d+|^Vol\. I; part and page not recorded in "
                           r"the transcription; verify")


def _sources(catalogue: Catalogue) -> list[tuple[str, Source]]:
    out: list[tuple[str, Source]] = []
    for c in catalogue.components.values():
        out += [(c.id, s) for s in c.constants_sources.values()]
        out.append((c.id, c.vapour_pressure_source))
        out += [(c.id, s) for s in (c.hazard_source, c.uniquac_source) if s is not None]
    for p in catalogue.pairs.values():
        out.append((p.id, p.source))
        if p.recorded is not None:
            out += [(p.id, a.source) for a in p.recorded.azeotropes]
            if p.recorded.source is not None:
                out.append((p.id, p.recorded.source))
    return out


def test_sources_name_publications_not_programs(catalogue: Catalogue) -> None:
    for owner, source in _sources(catalogue):
        assert not PROGRAM_NAMES.search(source.where), (owner, source.where)
    for ref in catalogue.references.values():
        for text in (ref.title, ref.authors, ref.publisher, ref.journal):
            assert not PROGRAM_NAMES.search(text), (ref.id, text)
        assert ref.kind != "software", ref.id


def test_dechema_sets_give_volume_part_and_page(catalogue: Catalogue) -> None:
    cited = [p for p in catalogue.pairs.values() if p.source.ref == "dechema-vle"]
    assert len(cited) >= 30
    for pair in cited:
        assert DECHEMA_WHERE.match(pair.source.where), (pair.id, pair.source.where)
    with_page = [p for p in cited if "p. " in p.source.where]
    assert len(with_page) >= 20


@pytest.mark.parametrize("folder", ["references", "components", "binaries"])
def test_catalogue_files_name_no_program_outside_notes(folder: str) -> None:
    """Outside ``note:`` lines and free-text ``notes:``, no program or data-file name."""
    for path in sorted((DEFAULT_CATALOGUE / folder).glob("*.yaml")):
        text = Path(path).read_text(encoding="utf-8")
        text = re.sub(r"note: \"[^\"]*\"", "", text)
        text = re.sub(r"(?m)^(\s*)notes?: >-\n(?:\1  .*\n)+", "", text)
        text = re.sub(r"(?m)^\s*notes?: .*$", "", text)
        text = text.replace("schema.json", "")  # the schema comment on line 1
        assert not PROGRAM_NAMES.search(text), (path.name, PROGRAM_NAMES.search(text))


def test_citations_have_one_full_stop_between_parts(catalogue: Catalogue) -> None:
    """An edition ("10th ed.") or an author list ending in an initial is followed by one full
    stop, not two (common practice in reference lists)."""
    from builder.catalogue.records import Reference

    book = Reference(id="x", authors="Lange, N. A.", title="Handbook of Chemistry", year=1961,
                     kind="handbook", edition="10th", publisher="McGraw-Hill")
    assert book.citation() == ("Lange, N. A. Handbook of Chemistry. 10th ed. McGraw-Hill. "
                               "1961.")
    assert not [r.id for r in catalogue.references.values() if ".." in r.citation()]
