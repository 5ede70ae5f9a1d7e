"""The atlas site: settings, escaping, generation, the offline check and a small build.

References: "common practice" (HTML escaping, offline assets) and the project's own
contract (builder.results records in, a static site out).  The browser tests in
tests/browser/ open the built site in Chromium.
"""

from __future__ import annotations

import csv
import dataclasses
import io
import json
import re
import shutil
from pathlib import Path

import pytest

from builder.analysis.results import RESULTS_VERSION, ConditionResult, PairResults
from builder.analysis.stability import ThreePhase
from builder.catalogue.loader import Catalogue
from builder.site.assemble import AssembleError, check_output_folder
from builder.site.content import SiteContent, generate
from builder.site.figures import pair_figures
from builder.site.pair_files import page_view
from builder.site.settings import SettingsError, SiteSettings, load_settings
from builder.site.text import UnsafeName, escape, file_slug, safe_id
from builder.site.verify import verify_site
from tests.conftest import SMALL, ShippedResults

pytest.importorskip("material", reason="the site extra is not installed: pip install -e '.[site]'")


@pytest.fixture(scope="module")
def small_atlas(shipped_results: ShippedResults) -> dict[str, PairResults]:
    return {pid: shipped_results[pid] for pid in SMALL}


# -- text safety (common practice) -------------------------------------------------


def test_escape_leaves_no_markup_or_markdown_syntax() -> None:
    text = str(escape('<a href="x">[y](javascript:z)</a> *b* `c` $d$ {: e} # f\n- g'))
    assert not re.search(r"[<>\"'`*\[\](){}#$\\]", re.sub(r"&#\d+;", "", text))
    assert "\n" not in text
    assert escape("1-Butanol") == "1-Butanol"


def test_file_names_are_safe_slugs() -> None:
    assert safe_id("ethanol--water") == "ethanol--water"
    for bad in ("../x", "a/b", "A", "x--y--z", "a b", ""):
        with pytest.raises(UnsafeName):
            safe_id(bad)
    assert file_slug("isobar-101.325kPa") == "isobar-101-325kpa"
    content = SiteContent()
    for bad in ("../x.md", "pairs/../../x.svg", "/abs.md", "pairs/x.html", "pairs/Ab.md"):
        with pytest.raises(UnsafeName):
            content.add(bad, b"")


# -- settings ---------------------------------------------------------------------------


def test_settings_defaults_and_file(tmp_path: Path) -> None:
    shipped = load_settings()
    assert shipped.summary_pressure_Pa == pytest.approx(101325.0)
    path = tmp_path / "site.yaml"
    path.write_text("title: Plant atlas\nunits: {temperature: K, pressure: bar}\n"
                    "summary_pressure: 1 bar\n", encoding="utf-8")
    settings = load_settings(path)
    assert (settings.title, settings.temperature_symbol, settings.pressure_unit) == (
        "Plant atlas", "K", "bar")
    assert settings.summary_pressure_Pa == pytest.approx(1e5)


@pytest.mark.parametrize("text, field", [
    ("colour: blue\n", "colour"),
    ("units: {temperature: F}\n", "units.temperature"),
    ("units: {pressure: furlong}\n", "units.pressure"),
    ("summary_pressure: 101.325\n", "summary_pressure"),
    ("second_opinion: maybe\n", "second_opinion"),
    ("predicted_pairs: some\n", "predicted_pairs"),
])
def test_settings_errors_name_the_field(tmp_path: Path, text: str, field: str) -> None:
    path = tmp_path / "site.yaml"
    path.write_text(text, encoding="utf-8")
    with pytest.raises(SettingsError) as error:
        load_settings(path)
    assert error.value.field == field
    assert str(path) in str(error.value)


# -- sections whose result field is None by its documented meaning -----------------


def _without_sections(results: PairResults) -> PairResults:
    """The same pair with no liquid split, no quick look, no trace and no checks."""
    def strip(c: ConditionResult) -> ConditionResult:
        return dataclasses.replace(c, three_phase=None, quicklook=None)

    return dataclasses.replace(results, isobars=tuple(strip(c) for c in results.isobars),
                               isotherms=tuple(strip(c) for c in results.isotherms),
                               trace=None, checks=())


def test_pages_leave_out_the_sections_whose_field_is_none(
        catalogue: Catalogue, small_atlas: dict[str, PairResults]) -> None:
    bare = {pid: _without_sections(r) for pid, r in small_atlas.items()}
    # The component figures (drawn by every site build) are not what this test checks.
    view, content = generate(SiteSettings(), catalogue, bare, comp_figs={})
    page = content.files["pairs/ethanol--water.md"].decode()
    assert "Phase diagrams" in page and "Distillation quick look" not in page
    assert "Reference checks" not in page
    assert {p.id for p in view.pairs} == set(SMALL)


def test_the_result_record_is_complete_and_versioned(
        small_atlas: dict[str, PairResults]) -> None:
    """Every field of the record is set by the analysis (none left to a default)."""
    results = small_atlas["ethanol--water"]
    assert results.version == RESULTS_VERSION
    assert all(f.default is dataclasses.MISSING for f in dataclasses.fields(ConditionResult))
    assert [f.name for f in dataclasses.fields(PairResults)
            if f.default is not dataclasses.MISSING] == ["version"]
    assert results.checks and all(c.liquid_stable.shape == c.curve.x1.shape
                                  for c in results.conditions)


def test_three_phase_line_is_drawn_and_tabulated(catalogue: Catalogue,
                                                 small_atlas: dict[str, PairResults]) -> None:
    """A synthetic liquid split (not a real one of this pair) exercises the slots."""
    results = small_atlas["ethanol--water"]
    first = results.isobars[0]
    three = ThreePhase(T_K=352.0, P_Pa=first.condition, x1_a=0.2, x1_b=0.6, y1=0.45)
    split = dataclasses.replace(first, three_phase=three)
    altered = dataclasses.replace(results, isobars=(split, *results.isobars[1:]))
    view = page_view(catalogue, altered, SiteSettings())
    assert view.behaviour == "heterogeneous"
    assert any(r.label == "Liquid compositions x1" for r in view.conditions[0].three_phase)
    svg = pair_figures(altered, SiteSettings())[0].svg.decode()
    assert "three-phase line" in svg


# -- the offline check ------------------------------------------------------------------


def test_verify_finds_external_and_missing_resources(tmp_path: Path) -> None:
    (tmp_path / "a.css").write_text("@import 'https://cdn.example/x.css'; "
                                    "body{background:url(missing.png)}", encoding="utf-8")
    (tmp_path / "index.html").write_text(
        '<link rel="stylesheet" href="a.css"><script src="//cdn.example/x.js"></script>'
        '<img src="figure.svg"><a href="javascript:alert(1)">x</a>'
        '<a href="https://example.org/">outside</a>', encoding="utf-8")
    check = verify_site(tmp_path)
    text = "\n".join(check.problems)
    assert "cdn.example/x.js" in text and "cdn.example/x.css" in text
    assert "figure.svg" in text and "missing.png" in text and "javascript:" in text
    assert check.external_links == 1


def test_verify_in_worker_processes_finds_the_same(small_site: Path, tmp_path: Path) -> None:
    """Parsing spread over processes: the same findings in the same order, the same memo."""
    site = tmp_path / "site"
    shutil.copytree(small_site, site)
    page = site / "pairs" / "ethanol--water.html"
    page.write_text(page.read_text(encoding="utf-8").replace(
        "</body>", '<script src="https://cdn.example/x.js"></script>'
                   '<a href="nowhere.html">x</a></body>'), encoding="utf-8")
    figure = next(site.rglob("*.svg"))
    figure.write_text(figure.read_text(encoding="utf-8").replace(
        "<svg ", '<svg onload="alert(1)" ', 1), encoding="utf-8")
    (site / "components" / "extra.css").write_text("body{background:url(gone.png)}",
                                                     encoding="utf-8")
    one_memo: dict = {}
    many_memo: dict = {}
    one = verify_site(site, one_memo, workers=1)
    many = verify_site(site, many_memo, workers=2)
    assert len(one.problems) == 4, one.problems
    assert many == one and many_memo == one_memo
    # From the memo alone (nothing parsed again): still the same.
    assert verify_site(site, many_memo, workers=2) == one


def test_output_folder_guard(tmp_path: Path) -> None:
    (tmp_path / "notes.txt").write_text("mine", encoding="utf-8")
    with pytest.raises(AssembleError):
        check_output_folder(tmp_path)
    check_output_folder(tmp_path / "new")  # a new folder is fine


# -- a small strict build ---------------------------------------------------------------


def test_small_site_has_every_page_figure_and_download(small_site: Path) -> None:
    assert verify_site(small_site).problems == []
    index = (small_site / "index.html").read_text(encoding="utf-8")
    assert index.count('data-behaviour="') == len(SMALL)
    for pid in SMALL:
        page = (small_site / "pairs" / f"{pid}.html").read_text(encoding="utf-8")
        images = re.findall(r'<img src="([^"]+)" alt="([^"]+)"', page)
        assert len(images) >= 5
        for src, alt in images:
            assert (small_site / "pairs" / src).is_file() and alt
        assert "Screening only" in page and "Hazards" in page
        for href in re.findall(r'href="([^"]+\.csv)"', page):
            assert (small_site / "pairs" / href).is_file()
    assert (small_site / "components" / "water.html").is_file()
    assert "\\(" in (small_site / "methods.html").read_text(encoding="utf-8")
    checks = (small_site / "catalogue.html").read_text(encoding="utf-8")
    assert "azeotrope at 101.325 kPa" in checks and "poling-2001" in checks


def test_atlas_json_and_csv(small_site: Path) -> None:
    data = json.loads((small_site / "atlas.json").read_text(encoding="utf-8"))
    assert data["format"] == "vle-atlas/2"
    pairs = {p["id"]: p for p in data["pairs"]}
    assert set(pairs) == set(SMALL)
    ethanol = pairs["ethanol--water"]
    assert ethanol["behaviour"] == "minimum-boiling"
    az = ethanol["conditions"][0]["azeotropes"][0]
    assert 0.85 < az["x1"] < 0.92 and 350 < az["T_K"] < 353  # handbook azeotrope table
    rows = list(csv.reader(io.StringIO(
        (small_site / ethanol["conditions"][0]["curve_csv"]).read_text(encoding="utf-8"))))
    assert rows[0][:4] == ["x1 (ethanol, liquid)", "y1 (ethanol, vapour)", "T_K", "P_Pa"]
    assert all(not cell.startswith(("=", "+", "@")) for row in rows for cell in row)


def test_hostile_catalogue_text_is_inert(hostile_site: Path) -> None:
    for page in ("pairs/acetone--chloroform.html", "components/chloroform.html",
                 "methods.html", "index.html", "catalogue.html"):
        html = (hostile_site / page).read_text(encoding="utf-8")
        for live in ("<script>window", "<img src=x", "<svg onload", "<iframe",
                     'href="javascript', "<b onmouseover", "evil.example/x.css\"",
                     "</title><"):
            assert live not in html, (page, live)
    page = (hostile_site / "pairs/acetone--chloroform.html").read_text(encoding="utf-8")
    assert "&#60;script&#62;" in page  # shown as text
    assert verify_site(hostile_site).problems == []


def test_views_and_figures_in_other_units(catalogue: Catalogue,
                                          small_atlas: dict[str, PairResults]) -> None:
    settings = SiteSettings(temperature_unit="K", pressure_unit="bar")
    pair = page_view(catalogue, small_atlas["ethanol--water"], settings)
    assert pair.c2.boiling_point.endswith(" K") and pair.conditions[0].label == "1.01325 bar"
    assert pair.summary_label == "1.01325 bar"
    svg = pair_figures(small_atlas["ethanol--water"], settings)[0].svg.decode()
    assert "Temperature / K" in svg and "Txy at 1.01325 bar" in svg


def test_preview_serves_on_loopback_only(small_site: Path) -> None:
    import urllib.request

    from builder.errors import AtlasError
    from builder.site.serve import Preview

    with pytest.raises(AtlasError):
        Preview(small_site, "0.0.0.0", 0)
    preview = Preview(small_site, "127.0.0.1", 0, quiet=True).start()
    try:
        with urllib.request.urlopen(preview.url + "atlas.json", timeout=10) as response:
            assert json.loads(response.read())["format"] == "vle-atlas/2"
    finally:
        preview.close()


def test_cli_build_refuses_a_foreign_folder(tmp_path: Path,
                                            capsys: pytest.CaptureFixture[str]) -> None:
    from builder.commands.cli import main

    (tmp_path / "report.docx").write_text("not a site", encoding="utf-8")
    assert main(["build", "--out", str(tmp_path)]) == 2
    assert "refusing to replace it" in capsys.readouterr().err
    assert (tmp_path / "report.docx").is_file()
    assert main(["serve", "--site", str(tmp_path / "none")]) == 2


def test_strict_build_fails_on_an_external_resource(tmp_path: Path) -> None:
    """The guard CI relies on: an external image that slips into a page fails the build."""
    from builder.site.assemble import assemble

    content = SiteContent()
    content.add("index.md", "# Atlas\n\n![logo](https://cdn.example.org/logo.png)\n")
    content.add("components/index.md", "# Components\n")
    content.add("methods.md", "# Methods\n")
    with pytest.raises(AssembleError, match="strict"):
        assemble(content, SiteSettings(), tmp_path / "strict", tmp_path / "src1", strict=True)
    report = assemble(content, SiteSettings(), tmp_path / "lax", tmp_path / "src2")
    assert any("cdn.example.org" in w for w in report.warnings)
    assert any("cdn.example.org" in p for p in verify_site(tmp_path / "lax").problems)


def test_atlas_json_validates_against_its_published_schema(small_site: Path) -> None:
    """docs/atlas-json.schema.json (validated with the jsonschema package); parameters are
    objects of numbers and no value is a number written as text."""
    import jsonschema

    schema = json.loads((Path(__file__).parents[1] / "docs" / "atlas-json.schema.json")
                        .read_text(encoding="utf-8"))
    data = json.loads((small_site / "atlas.json").read_text(encoding="utf-8"))
    jsonschema.Draft202012Validator(schema).validate(data)
    nrtl = next(p for p in data["pairs"] if p["id"] == "ethanol--water")["parameters"]
    # -57.9601 cal/mol (DECHEMA set as catalogued) = -242.5 J/mol with the thermochemical calorie
    assert abs(nrtl["g12_J_per_mol"] - (-57.9601 * 4.184)) < 1e-9 and nrtl["alpha"] == 0.2937
    quantity = re.compile(r"^\s*[-+]?\d+(\.\d*)?([eE][-+]?\d+)?\s*[A-Za-z°/]+\S*\s*$")
    labels = {c["label"] for p in data["pairs"] for c in p["conditions"]}
    stack: list[object] = [data]
    while stack:
        item = stack.pop()
        if isinstance(item, dict):
            stack.extend(item.values())
        elif isinstance(item, list):
            stack.extend(item)
        elif isinstance(item, str):
            assert not quantity.match(item) or item in labels, item
