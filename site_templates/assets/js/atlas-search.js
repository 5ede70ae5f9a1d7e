/* CAS numbers in the site search.  The search engine (lunr, inside the theme's search
   worker) splits every query at hyphens, so "67-66-3" would become three loose numbers.
   Each page that names a component carries the search key "cas67663" for its CAS number;
   this shim rewrites a CAS number in a query to that key before the query reaches the
   worker.  It wraps whichever Worker class is in place (the browser's over http, the
   vendored iframe-worker shim on file://), so it must load after that shim.
   The query message of the theme's worker is {type: 2, data: "<query text>"}. */
(function () {
  "use strict";
  var Base = window.Worker;
  if (!Base) return;
  var CAS = /(^|\s)(\d{2,7})-(\d{2})-(\d)(?=\s|$)/g;
  var PARTIAL = /(^|\s)(\d{2,7})-(\d{0,2})(?:-(\d?))?$/;
  function rewrite(query) {
    var text = query.replace(CAS, function (_m, pre, a, b, c) { return pre + "cas" + a + b + c; });
    return text.replace(PARTIAL, function (_m, pre, a, b, c) { return pre + "cas" + a + (b || "") + (c || ""); });
  }
  function AtlasWorker(url, options) {
    var worker = new Base(url, options);
    var post = worker.postMessage.bind(worker);
    worker.postMessage = function (message) {
      if (message && message.type === 2 && typeof message.data === "string") {
        message = { type: message.type, data: rewrite(message.data) };
      }
      var rest = Array.prototype.slice.call(arguments, 1);
      return post.apply(null, [message].concat(rest));
    };
    return worker;
  }
  AtlasWorker.prototype = Base.prototype;
  window.Worker = AtlasWorker;
  window.atlasRewriteQuery = rewrite;
})();
