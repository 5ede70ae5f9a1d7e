"""The raw HTML of the pages bypasses the Markdown parser (builder/site/raw_html.py) and the
site is the same as mkdocs makes it alone."""

from __future__ import annotations

import filecmp
from pathlib import Path

import pytest
import yaml

from builder.site.raw_html import put_back, set_aside

from .conftest import cache_sharing_work, hostile_catalogue


def _mkdocs(source: Path, out: Path, with_plugin: bool, release: bool = False) -> None:
    from mkdocs.commands.build import build
    from mkdocs.config import load_config

    from builder.site.page_memory import ReleasePageText
    from builder.site.raw_html import RawHtmlPassThrough

    config_data = yaml.safe_load((source / "mkdocs.yml").read_text(encoding="utf-8"))
    config_data["site_dir"] = str(out)
    config_file = source / f"mkdocs-{out.name}.yml"
    config_file.write_text(yaml.safe_dump(config_data), encoding="utf-8")
    config = load_config(config_file=str(config_file))
    if with_plugin:
        config.plugins["atlas-raw-html"] = RawHtmlPassThrough()
    if release:
        config.plugins["atlas-release-pages"] = ReleasePageText()
    build(config)


def _different(left: Path, right: Path) -> list[str]:
    found: list[str] = []
    compare = filecmp.dircmp(left, right)
    stack = [(compare, "")]
    while stack:
        node, prefix = stack.pop()
        found += [prefix + n for n in node.left_only + node.right_only + node.diff_files]
        stack += [(sub, f"{prefix}{name}/") for name, sub in node.subdirs.items()]
    return found


def test_site_is_the_same_with_and_without_the_bypass(
        tmp_path_factory: pytest.TempPathFactory, shared_work: Path) -> None:
    """A build of the catalogue with markup and Markdown in its texts (conftest's hostile
    copy) and of ethanol-water, assembled by mkdocs with and without the plugin: every
    output file byte-identical (the plugin's claim)."""
    pytest.importorskip("material")
    from builder.site.build import build_site

    root = tmp_path_factory.mktemp("raw-html")
    source = root / "source"
    build_site(hostile_catalogue(root), out_dir=root / "site", source_dir=source,
               only=["acetone--chloroform", "ethanol--water"], strict=True,
               cache_dir=cache_sharing_work(shared_work, root), quiet_progress=True)
    _mkdocs(source, root / "plain", with_plugin=False)
    _mkdocs(source, root / "bypass", with_plugin=True)
    # builder/site/page_memory.py: each page's text let go once used, as the build does.
    _mkdocs(source, root / "released", with_plugin=True, release=True)
    pages = list((root / "plain").rglob("*.html"))
    assert len(pages) > 90
    assert _different(root / "plain", root / "bypass") == []
    assert _different(root / "plain", root / "released") == []


def test_blocks_set_aside_and_put_back() -> None:
    text = ("# Title\n\n<div class=\"a\">\n<p>one</p>\n\n<div>\n<p>two</p>\n</div>\n</div>\n"
            "<table><tr><td>3</td></tr></table>\n\n## Next\n\nProse with <b>bold</b>\n\n"
            "<b>inline start</b> is a paragraph\n\n<div>\nnever closed\n")
    kept, blocks = set_aside(text)
    assert kept == ("# Title\n\nATLASRAWHTML000000\n\n## Next\n\nProse with <b>bold</b>\n\n"
                    "<b>inline start</b> is a paragraph\n\n<div>\nnever closed\n")
    assert blocks["ATLASRAWHTML000000"].startswith('<div class="a">')
    assert blocks["ATLASRAWHTML000000"].endswith("</table>")
    html = "<h1>Title</h1>\n<p>ATLASRAWHTML000000</p>\n<h2>Next</h2>"
    assert put_back(html, blocks) == ("<h1>Title</h1>\n" + blocks["ATLASRAWHTML000000"]
                                      + "\n\n<h2>Next</h2>")
