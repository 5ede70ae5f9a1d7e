"""Check: the figures' SVG of this checkout, byte for byte against another revision's.

A change meant to make the figures faster must not change a byte of them.  This
script computes the results once (every shipped fitted pair, with and without the
predictive model's second opinion; the first ``--predicted`` predicted pairs chosen
as in ``benchmarks/figures.py``; every component), draws every figure with this
checkout's figure code and with the code of ``--against`` (a git revision of this
repository, exported into a temporary folder, ``main`` unless told), each in a
fresh process, and compares the SVG bytes.  It prints how many figures were
compared and lists any that differ; it exits non-zero if any does.

Run: ``python benchmarks/figures_identity.py [--against main] [--predicted 12]
[--keep FILE]`` (``--keep``: the results kept in ``FILE`` for the next run).
"""

from __future__ import annotations

import argparse
import os
import pickle
import subprocess
import sys
import tarfile
import tempfile
from dataclasses import replace
from io import BytesIO
from pathlib import Path

REPO = Path(__file__).resolve().parent.parent


def _compute(predicted: int) -> dict[str, list]:
    sys.path.insert(0, str(REPO))
    sys.path.insert(0, str(REPO / "benchmarks"))
    from build import PREDICTED_AMONG  # type: ignore[import-not-found]

    from builder.analysis.results import compute_pair
    from builder.analysis.second_opinion import second_opinion
    from builder.catalogue.loader import load_catalogue
    from builder.site.predicted import select_predicted
    from builder.site.settings import SiteSettings

    settings = SiteSettings()
    catalogue = load_catalogue()
    fitted = [compute_pair(catalogue, catalogue.pairs[pid]) for pid in sorted(catalogue.pairs)]
    opinions = [second_opinion(catalogue, r, settings.summary_pressure_Pa) for r in fitted]
    selection = select_predicted(catalogue, tuple(c for c in PREDICTED_AMONG
                                                  if c in catalogue.components))
    work = replace(catalogue, pairs={**catalogue.pairs, **selection.records})
    chosen = [compute_pair(work, work.pairs[pid])
              for pid in sorted(selection.records)[:predicted]]
    components = [catalogue.components[cid] for cid in sorted(catalogue.components)]
    return {"fitted": fitted, "opinions": opinions, "predicted": chosen,
            "components": components}


def _render(results_file: str) -> None:
    """Runs in the checkout to check (its folder first on ``PYTHONPATH``): writes every
    figure's SVG, in order, as a pickled list of (name, bytes) to standard output."""
    from builder.site.figures import component_figure, pair_figures
    from builder.site.predicted_figures import predicted_figure
    from builder.site.settings import SiteSettings

    with open(results_file, "rb") as handle:
        results = pickle.load(handle)
    settings = SiteSettings()
    out: list[tuple[str, bytes]] = []
    for r in results["fitted"]:
        out += [(f"fitted {f.path}", f.svg) for f in pair_figures(r, settings)]
    for r, opinion in zip(results["fitted"], results["opinions"], strict=True):
        out += [(f"with opinion {f.path}", f.svg) for f in pair_figures(r, settings, opinion)]
    for r in results["predicted"]:
        out += [(f"predicted {f.path}", f.svg) for f in predicted_figure(r, settings)]
    for component in results["components"]:
        f = component_figure(component, settings)
        out.append((f"component {f.path}", f.svg))
    sys.stdout.buffer.write(pickle.dumps(out))


def _run(code: Path, results_file: str) -> list[tuple[str, bytes]]:
    env = dict(os.environ, PYTHONPATH=str(code), MPLBACKEND="Agg")
    done = subprocess.run([sys.executable, str(Path(__file__).resolve()), "--render",
                           results_file], env=env, cwd=str(code), check=True,
                          capture_output=True)
    figures: list[tuple[str, bytes]] = pickle.loads(done.stdout)
    return figures


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--against", default="main", help="git revision to compare with")
    parser.add_argument("--predicted", type=int, default=12, help="first N predicted pairs")
    parser.add_argument("--keep", type=Path, default=None,
                        help="a file to keep the computed results in (read if it exists)")
    parser.add_argument("--render", default=None, help=argparse.SUPPRESS)
    args = parser.parse_args()
    if args.render:
        _render(args.render)
        return
    if args.keep is not None and args.keep.exists():
        with open(args.keep, "rb") as handle:
            results = pickle.load(handle)
    else:
        results = _compute(args.predicted)
        if args.keep is not None:
            with open(args.keep, "wb") as handle:
                pickle.dump(results, handle)
    with tempfile.TemporaryDirectory() as folder:
        other = Path(folder) / "other"
        archive = subprocess.run(["git", "-C", str(REPO), "archive", args.against, "builder",
                                  "pairs", "benchmarks"], check=True, capture_output=True)
        with tarfile.open(fileobj=BytesIO(archive.stdout)) as tar:
            tar.extractall(other, filter="data")
        results_file = str(Path(folder) / "results.pickle")
        with open(results_file, "wb") as handle:
            pickle.dump(results, handle)
        ours = _run(REPO, results_file)
        theirs = _run(other, results_file)
    differ = [name for (name, a), (_name, b) in zip(ours, theirs, strict=True) if a != b]
    if [n for n, _ in ours] != [n for n, _ in theirs]:
        differ.append("(the lists of figures differ)")
    print(f"{len(ours)} figures compared against {args.against}: "
          f"{len(ours) - len(differ)} identical, {len(differ)} different")
    for name in differ:
        print(f"  differs: {name}")
    sys.exit(1 if differ else 0)


if __name__ == "__main__":
    main()
