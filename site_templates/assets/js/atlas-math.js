/* Render the formulas of pages with math: pymdownx.arithmatex (generic) leaves
   \( ... \) and \[ ... \] in elements of class "arithmatex"; KaTeX (vendored) renders them. */
(function () {
  "use strict";
  function render() {
    if (!window.katex) return;
    document.querySelectorAll(".arithmatex").forEach(function (el) {
      if (el.dataset.atlasRendered) return;
      var tex = el.textContent.trim();
      var display = el.tagName === "DIV";
      tex = tex.replace(/^\\[\(\[]/, "").replace(/\\[\)\]]$/, "");
      try {
        window.katex.render(tex, el, { displayMode: display, throwOnError: false });
        el.dataset.atlasRendered = "1";
      } catch (error) {
        el.title = String(error);
      }
    });
  }
  if (window.document$ && window.document$.subscribe) {
    window.document$.subscribe(render);
  } else {
    document.addEventListener("DOMContentLoaded", render);
  }
})();
