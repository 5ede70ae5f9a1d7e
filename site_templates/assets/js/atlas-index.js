/* The index of pairs, listed from data: the page carries every pair as compact JSON
   (<script type="application/json" id="atlas-index-data">, written by
   builder/site/index_data.py) and this script shows one page of rows at a time.  Filters,
   find and sorting act on the data, not on the table, so a full atlas of thousands of
   pairs opens as fast as a small one.  The view (filters, sort, page) is kept in the
   address after "#", so it can be bookmarked or sent and the browser's Back button
   returns to the previous view.  Without JavaScript the table holds the fitted pairs as
   plain HTML (and a note says where the others are).  No data is fetched: it works from
   file:// too. */
(function () {
  "use strict";

  var SIZES = [50, 100, 250, 1000];
  var DEFAULT_SIZE = 100;

  function normalise(text) {
    return (text || "").toLowerCase().replace(/[\s_]+/g, " ").trim();
  }

  function grouped(n) {
    return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  }

  function load(table) {
    var block = document.getElementById("atlas-index-data");
    if (!block) return null;
    var data = JSON.parse(block.textContent);
    var f = {};
    data.fields.forEach(function (name, i) { f[name] = i; });
    var comps = data.components;
    var rows = data.rows.map(function (r) {
      var c1 = comps[r[f.component1]], c2 = comps[r[f.component2]];
      return {
        id: r[f.id], c1: c1, c2: c2,
        title: c1[1] + " + " + c2[1],
        behaviour: data.behaviours[r[f.behaviour]][0],
        behaviourIndex: r[f.behaviour],
        behaviourLabel: data.behaviours[r[f.behaviour]][1],
        azT: r[f.azeotrope_T], azTSort: r[f.azeotrope_T_sort],
        azX: r[f.azeotrope_x1], azXSort: r[f.azeotrope_x1_sort],
        alpha: r[f.alpha_range], alphaSort: r[f.alpha_sort],
        model: data.models[r[f.model]], quality: data.qualities[r[f.quality]],
        predicted: r[f.predicted] === 1,
        opinion: r[f.opinion], opinionSort: r[f.opinion_sort],
        differs: r[f.opinion_differs] === 1,
        text: r[f.id] + " " + c1[4] + " " + c2[4]
      };
    });
    return { rows: rows, page: data.page, table: table };
  }

  /* Sort keys by column: a number (null: no value, always last) or a text. */
  var KEYS = {
    "pair": function (r) { return r.title.toLowerCase(); },
    "boiling1": function (r) { return r.c1[3]; },
    "boiling2": function (r) { return r.c2[3]; },
    "behaviour": function (r) { return r.behaviourIndex; },
    "azeotrope-t": function (r) { return r.azTSort; },
    "azeotrope-x1": function (r) { return r.azXSort; },
    "alpha": function (r) { return r.alphaSort; },
    "model": function (r) { return r.model.toLowerCase(); },
    "quality": function (r) { return r.quality.toLowerCase(); },
    "opinion": function (r) { return r.opinionSort; }
  };

  function compare(a, b) {
    if (a === b) return 0;
    if (a === null || a === undefined) return 1;
    if (b === null || b === undefined) return -1;
    return a < b ? -1 : 1;
  }

  /* The view: filters, find, sort, page and rows per page; read from and written to the
     address ("#behaviour=...&component=...&set=...&find=...&sort=-alpha&page=2&rows=250"). */
  function emptyState() {
    return { behaviour: "", component: "", set: "", find: "", sort: "", page: 1,
             rows: DEFAULT_SIZE };
  }

  function parseState(hash, search) {
    var state = emptyState();
    var params = new URLSearchParams((hash || "").replace(/^#/, ""));
    var legacy = new URLSearchParams(search || "");  // ?behaviour=... links of older pages
    state.behaviour = params.get("behaviour") || legacy.get("behaviour") || "";
    state.component = params.get("component") || legacy.get("component") || "";
    state.set = params.get("set") || legacy.get("quality") || "";
    state.find = params.get("find") || "";
    var sort = params.get("sort") || "";
    state.sort = KEYS.hasOwnProperty(sort.replace(/^-/, "")) ? sort : "";
    var page = parseInt(params.get("page") || "1", 10);
    state.page = page > 0 ? page : 1;
    var size = parseInt(params.get("rows") || "", 10);
    state.rows = SIZES.indexOf(size) >= 0 ? size : DEFAULT_SIZE;
    return state;
  }

  function formatState(state) {
    var parts = [];
    function add(name, value) {
      if (value) parts.push(name + "=" + encodeURIComponent(value));
    }
    add("behaviour", state.behaviour);
    add("component", state.component);
    add("set", state.set);
    add("find", state.find);
    add("sort", state.sort);
    if (state.page > 1) add("page", String(state.page));
    if (state.rows !== DEFAULT_SIZE) add("rows", String(state.rows));
    return parts.length ? "#" + parts.join("&") : "";
  }

  function setup() {
    var table = document.getElementById("atlas-pairs");
    if (!table || table.dataset.atlasIndex) return;
    var index = load(table);
    if (!index) return;
    table.dataset.atlasIndex = "1";
    var controls = {
      behaviour: document.getElementById("atlas-behaviour"),
      component: document.getElementById("atlas-component"),
      set: document.getElementById("atlas-quality"),
      find: document.getElementById("atlas-text"),
      rows: document.getElementById("atlas-page-size")
    };
    var count = document.getElementById("atlas-count");
    var pagers = [document.getElementById("atlas-pager-top"),
                  document.getElementById("atlas-pager")].filter(Boolean);
    var body = table.tBodies[0];
    var headers = Array.prototype.slice.call(table.tHead.rows[0].cells);
    var sorted = {};  // sort -> row order (every row), computed once per sort
    var state = parseState(window.location.hash, window.location.search);
    var typing = false;  // the last change of the address was a keystroke in Find

    function order(sort) {
      if (!sorted.hasOwnProperty(sort)) {
        var rows = index.rows.slice();
        if (sort) {
          var key = KEYS[sort.replace(/^-/, "")], down = sort.charAt(0) === "-";
          var keyed = rows.map(function (r, i) { return { r: r, k: key(r), i: i }; });
          keyed.sort(function (a, b) {
            var missing = (a.k === null) - (b.k === null);
            if (missing) return missing;  // no value: last either way
            var c = compare(a.k, b.k);
            return (down ? -c : c) || a.i - b.i;
          });
          rows = keyed.map(function (k) { return k.r; });
        }
        sorted[sort] = rows;
      }
      return sorted[sort];
    }

    function matches(s) {
      var words = normalise(s.find).split(" ").filter(Boolean);
      return function (r) {
        return (!s.behaviour || r.behaviour === s.behaviour) &&
          (!s.set || (s.set === "predicted") === r.predicted) &&
          (!s.component || r.c1[0] === s.component || r.c2[0] === s.component) &&
          words.every(function (w) { return r.text.indexOf(w) >= 0; });
      };
    }

    function cell(tr, text, className, sortKey) {
      var td = document.createElement("td");
      td.textContent = text;
      if (className) td.className = className;
      if (sortKey !== undefined) td.dataset.sort = sortKey === null ? "" : String(sortKey);
      tr.appendChild(td);
      return td;
    }

    function row(r) {
      var tr = document.createElement("tr");
      tr.dataset.behaviour = r.behaviour;
      tr.dataset.quality = r.predicted ? "predicted" : "fitted";
      tr.dataset.components = r.c1[0] + " " + r.c2[0];
      var first = document.createElement("td");
      var link = document.createElement("a");
      link.href = index.page[0] + r.id + index.page[1];
      link.textContent = r.title;
      first.appendChild(link);
      if (r.predicted) {
        var badge = document.createElement("span");
        badge.className = "atlas-badge-small";
        badge.textContent = "predicted";
        first.appendChild(document.createTextNode(" "));
        first.appendChild(badge);
      }
      tr.appendChild(first);
      cell(tr, r.c1[2], "", r.c1[3]);
      cell(tr, r.c2[2], "", r.c2[3]);
      cell(tr, r.behaviourLabel, "atlas-behaviour atlas-b-" + r.behaviour);
      cell(tr, r.azT, "", r.azTSort);
      cell(tr, r.azX, "", r.azXSort);
      cell(tr, r.alpha, "", r.alphaSort);
      cell(tr, r.model);
      cell(tr, r.quality);
      cell(tr, r.opinion, r.differs ? "atlas-differs" : "", r.opinionSort);
      return tr;
    }

    function pageButton(nav, label, page, current, title) {
      var b = document.createElement("button");
      b.type = "button";
      b.textContent = label;
      b.dataset.page = String(page);
      if (title) b.setAttribute("aria-label", title);
      if (current) b.setAttribute("aria-current", "page");
      nav.appendChild(b);
      return b;
    }

    function drawPager(nav, page, pages) {
      nav.textContent = "";
      nav.hidden = pages <= 1;
      if (pages <= 1) return;
      var prev = pageButton(nav, "‹ Previous", page - 1, false, "previous page");
      prev.dataset.step = "previous";
      prev.disabled = page <= 1;
      var shown = [1, pages, page - 2, page - 1, page, page + 1, page + 2].filter(
        function (n, i, all) { return n >= 1 && n <= pages && all.indexOf(n) === i; });
      shown.sort(function (a, b) { return a - b; });
      shown.forEach(function (n, i) {
        if (i > 0 && n > shown[i - 1] + 1) {
          var gap = document.createElement("span");
          gap.className = "atlas-pager-gap";
          gap.textContent = "…";
          nav.appendChild(gap);
        }
        pageButton(nav, grouped(n), n, n === page, "page " + n + " of " + pages);
      });
      var next = pageButton(nav, "Next ›", page + 1, false, "next page");
      next.dataset.step = "next";
      next.disabled = page >= pages;
    }

    function drawHeaders() {
      var key = state.sort.replace(/^-/, ""), down = state.sort.charAt(0) === "-";
      headers.forEach(function (th) {
        if (th.dataset.key === key && key) {
          th.setAttribute("aria-sort", down ? "descending" : "ascending");
        } else {
          th.removeAttribute("aria-sort");
        }
      });
    }

    function render() {
      var shown = order(state.sort).filter(matches(state));
      var pages = Math.max(1, Math.ceil(shown.length / state.rows));
      if (state.page > pages) state.page = pages;
      var from = (state.page - 1) * state.rows;
      var slice = shown.slice(from, from + state.rows);
      var fragment = document.createDocumentFragment();
      slice.forEach(function (r) { fragment.appendChild(row(r)); });
      body.textContent = "";
      body.appendChild(fragment);
      var total = index.rows.length;
      if (count) {
        var filtered = shown.length !== total;
        count.textContent = (shown.length === 0 ? "no pair matches" :
          "showing " + grouped(from + 1) + "–" + grouped(from + slice.length) + " of " +
          grouped(shown.length) + (filtered ? " matching" : "") + " pairs") +
          (filtered ? " (" + grouped(total) + " in all)" : "");
      }
      pagers.forEach(function (nav) { drawPager(nav, state.page, pages); });
      drawHeaders();
    }

    function showControls() {
      controls.behaviour.value = state.behaviour;
      controls.component.value = state.component;
      controls.set.value = state.set;
      if (controls.find.value !== state.find) controls.find.value = state.find;
      controls.rows.value = String(state.rows);
    }

    /* A change made on the page: draw it, then record it in the address (a new history
       entry, except while typing in Find, where one entry stands for the whole word). */
    function change(update, fromTyping) {
      update(state);
      render();
      var hash = formatState(state);
      if (hash === formatState(parseState(window.location.hash, ""))) return;
      var url = window.location.href.split("#")[0] + (hash || "#");
      if (fromTyping && typing) {
        window.location.replace(url);
      } else {
        window.location.assign(url);
      }
      typing = fromTyping;
    }

    ["behaviour", "component", "set"].forEach(function (name) {
      controls[name].addEventListener("change", function () {
        change(function (s) { s[name] = controls[name].value; s.page = 1; }, false);
      });
    });
    controls.rows.addEventListener("change", function () {
      var first = (state.page - 1) * state.rows;
      change(function (s) {
        s.rows = parseInt(controls.rows.value, 10) || DEFAULT_SIZE;
        s.page = Math.floor(first / s.rows) + 1;  // keep the first row in view
      }, false);
    });
    controls.find.addEventListener("input", function () {
      change(function (s) { s.find = controls.find.value; s.page = 1; }, true);
    });

    headers.forEach(function (th) {
      if (!th.dataset.key) return;
      var button = document.createElement("button");
      button.type = "button";
      button.className = "atlas-sort";
      while (th.firstChild) button.appendChild(th.firstChild);
      th.appendChild(button);
      button.addEventListener("click", function () {
        var key = th.dataset.key;
        change(function (s) {
          s.sort = s.sort === key ? "-" + key : key;
          s.page = 1;
        }, false);
      });
    });

    pagers.forEach(function (nav) {
      nav.addEventListener("click", function (event) {
        var button = event.target.closest ? event.target.closest("button[data-page]") : null;
        if (!button || button.disabled) return;
        var page = parseInt(button.dataset.page, 10), step = button.dataset.step;
        change(function (s) { s.page = page; }, false);
        if (nav.id === "atlas-pager") table.scrollIntoView({ block: "start" });
        /* The buttons are drawn anew: keep the focus on the one pressed (Next stays on
           Next while there is a next page), else on the page now shown. */
        var again = (step && nav.querySelector('button[data-step="' + step + '"]:not(:disabled)')) ||
          nav.querySelector("button[aria-current]");
        if (again) again.focus({ preventScroll: true });
      });
    });

    /* Back, Forward, or an address typed or followed: show the view it names. */
    function fromAddress() {
      var next = parseState(window.location.hash, "");
      if (formatState(next) === formatState(state)) return;
      state = next;
      typing = false;
      showControls();
      render();
    }
    window.addEventListener("hashchange", fromAddress);
    window.addEventListener("popstate", fromAddress);

    document.getElementById("atlas-index-controls").hidden = false;
    showControls();
    render();
  }

  /* At once if the table is already parsed (this script comes at the end of the page), so
     the first frame shows the rows; the theme's page-load signal covers the rest. */
  if (document.getElementById("atlas-index-data")) setup();
  if (window.document$ && window.document$.subscribe) {
    window.document$.subscribe(setup);
  } else {
    document.addEventListener("DOMContentLoaded", setup);
  }
})();
