/* Sortable and filterable tables of the atlas index pages, in plain JavaScript.
   Sorting: the vendored tablesort (click a column heading).  Filtering: rows carry
   data-behaviour, data-quality, data-components and data-text; the controls above the
   table hide the rows that do not match.  No data is fetched: everything is in the page, so it
   works from file:// too. */
(function () {
  "use strict";
  function normalise(text) {
    return (text || "").toLowerCase().replace(/[\s_]+/g, " ").trim();
  }
  function setup() {
    document.querySelectorAll("table.atlas-sortable").forEach(function (table) {
      if (table.dataset.atlasSortable || !window.Tablesort) return;
      table.dataset.atlasSortable = "1";
      new window.Tablesort(table);
    });
    document.querySelectorAll("table.atlas-filterable").forEach(function (table) {
      if (table.dataset.atlasFilterable) return;
      table.dataset.atlasFilterable = "1";
      var behaviour = document.getElementById("atlas-behaviour");
      var component = document.getElementById("atlas-component");
      var quality = document.getElementById("atlas-quality");
      var text = document.getElementById("atlas-text");
      var count = document.getElementById("atlas-count");
      var rows = Array.prototype.slice.call(table.tBodies[0].rows);
      function apply() {
        var b = behaviour ? behaviour.value : "";
        var c = component ? component.value : "";
        var q = quality ? quality.value : "";
        var words = normalise(text ? text.value : "").split(" ").filter(Boolean);
        var shown = 0;
        rows.forEach(function (row) {
          var ok = (!b || row.dataset.behaviour === b) &&
            (!q || row.dataset.quality === q) &&
            (!c || (row.dataset.components || "").split(" ").indexOf(c) >= 0) &&
            words.every(function (w) { return (row.dataset.text || "").indexOf(w) >= 0; });
          row.hidden = !ok;
          if (ok) shown += 1;
        });
        if (count) {
          count.textContent = shown + " of " + rows.length + " shown";
        }
      }
      [behaviour, component, quality, text].forEach(function (el) {
        if (!el) return;
        el.addEventListener("input", apply);
        el.addEventListener("change", apply);
      });
      var params = new URLSearchParams(window.location.search);
      if (behaviour && params.get("behaviour")) behaviour.value = params.get("behaviour");
      if (component && params.get("component")) component.value = params.get("component");
      if (quality && params.get("quality")) quality.value = params.get("quality");
      apply();
    });
  }
  if (window.document$ && window.document$.subscribe) {
    window.document$.subscribe(setup);
  } else {
    document.addEventListener("DOMContentLoaded", setup);
  }
})();
