"""The atlas site: ``atlas build`` turns the catalogue into an offline, searchable HTML atlas.

A pipeline of stages, each a module with one job, each handing a plain data
object to the next (nothing is written until everything is computed):

1. :mod:`.settings` -- read and validate the site settings (``site.yaml``);
2. load and validate the catalogue (:func:`builder.catalogue.load_catalogue`);
3. compute every pair (:func:`builder.analysis.results.compute_atlas`), the predicted
   pairs the settings ask for (:mod:`.predicted`) and the second opinion on every
   fitted pair (:func:`builder.analysis.second_opinion.second_opinions`);
4. :mod:`.context` -- turn results into page views (plain, display-ready data), with
   :mod:`.partners` and :mod:`.matrix` (solvent screening, grouped by :mod:`.families`),
   :mod:`.opinion` (the second opinion) and :mod:`.datasheet` (the printed sheet);
5. :mod:`.figures`, :mod:`.data`, :mod:`.pages` -- render SVG figures, CSV and
   JSON downloads and Markdown pages through the jinja2 templates of
   ``site_templates/`` into an in-memory :class:`~.content.SiteContent`;
6. :mod:`.assemble` -- write the content and let mkdocs assemble the HTML site
   (the only stage that knows about mkdocs, so it can be swapped);
7. :mod:`.verify` -- check the finished site: no resource from another host,
   every local reference resolves.

:mod:`.build` runs the stages, :mod:`.serve` previews a built site on
127.0.0.1 and :mod:`.commands` adds ``atlas build`` and ``atlas serve``.
"""

from __future__ import annotations

__all__ = ["DEFAULT_OUTPUT", "TEMPLATES"]

from pathlib import Path

#: The templates and assets of the site (jinja2 templates, vendored assets, mkdocs config).
TEMPLATES = Path(__file__).resolve().parent.parent.parent / "site_templates"

#: Where ``atlas build`` writes the site by default (the repository's ``site/``, git-ignored).
DEFAULT_OUTPUT = Path(__file__).resolve().parent.parent.parent / "site"
