// warpwise workbench: the little the pages need beyond plain HTML forms.
// Polls running jobs and catalogues, takes dropped files, zooms the pictures.
"use strict";

function poll(url, done, every) {
  fetch(url, {cache: "no-store"}).then(function (r) { return r.json(); }).then(function (s) {
    if (done(s)) { window.location.reload(); } else { setTimeout(function () { poll(url, done, every); }, every); }
  }).catch(function () { setTimeout(function () { poll(url, done, every); }, 2 * every); });
}

function watchJob() {
  var box = document.getElementById("running");
  if (!box) { return; }
  var shown = document.getElementById("job-state"), secs = document.getElementById("job-seconds");
  poll(box.dataset.stateUrl, function (s) {
    if (shown) { shown.textContent = s.state; }
    if (secs) { secs.textContent = s.seconds.toFixed(1); }
    return ["done", "failed", "cancelled"].indexOf(s.state) >= 0;
  }, 400);
}

function watchCatalogue() {
  var box = document.getElementById("catalogue");
  if (!box || box.dataset.over === "yes") { return; }
  var before = null;
  poll(box.dataset.stateUrl, function (s) {
    var now = s.rows.map(function (r) { return r.state; }).join(",");
    if (before === null) { before = now; }
    return s.over || now !== before;
  }, 500);
}

function takeDrops() {
  var form = document.getElementById("upload-form"), input = document.getElementById("files");
  if (!form || !input) { return; }
  ["dragenter", "dragover"].forEach(function (e) {
    form.addEventListener(e, function (ev) { ev.preventDefault(); form.classList.add("over"); });
  });
  form.addEventListener("dragleave", function () { form.classList.remove("over"); });
  form.addEventListener("drop", function (ev) {
    ev.preventDefault();
    input.files = ev.dataTransfer.files;
    form.submit();
  });
}

function zoomable(fig) {
  var svg = fig.querySelector("svg");
  if (!svg || !svg.viewBox || !svg.viewBox.baseVal) { return; }
  var start = svg.getAttribute("viewBox");
  svg.addEventListener("wheel", function (ev) {
    ev.preventDefault();
    var b = svg.viewBox.baseVal, r = svg.getBoundingClientRect();
    var fx = (ev.clientX - r.left) / r.width, fy = (ev.clientY - r.top) / r.height;
    var k = ev.deltaY < 0 ? 0.8 : 1.25;
    var w = b.width * k, h = b.height * k;
    svg.setAttribute("viewBox", [b.x + fx * (b.width - w), b.y + fy * (b.height - h), w, h].join(" "));
  }, {passive: false});
  svg.addEventListener("dblclick", function () { if (start) { svg.setAttribute("viewBox", start); } });
  svg.setAttribute("aria-description", "turn the wheel to zoom, double-click to see it whole");
  var out = fig.querySelector(".pointer"), frame = svg.dataset.frame;
  if (!out || !frame) { return; }
  var f = frame.split(" ").map(Number);  // x0, y1, left, top, scale, k
  svg.addEventListener("mousemove", function (ev) {
    var p = svg.createSVGPoint();
    p.x = ev.clientX; p.y = ev.clientY;
    var q = p.matrixTransform(svg.getScreenCTM().inverse());
    var x = (f[0] + (q.x - f[2]) / f[4]) * f[5], y = (f[1] - (q.y - f[3]) / f[4]) * f[5];
    var band = ev.target.getAttribute && ev.target.getAttribute("data-band");
    out.textContent = " Pointer at x = " + x.toPrecision(5) + ", y = " + y.toPrecision(5) + " " +
      svg.dataset.unit + (band ? "; " + band : "") + ".";
  });
  svg.addEventListener("mouseleave", function () { out.textContent = ""; });
}

function reloadLater() {
  var p = document.getElementById("reading");
  if (p) { setTimeout(function () { window.location.reload(); }, 1000 * Number(p.dataset.reload || 2)); }
}

document.addEventListener("DOMContentLoaded", function () {
  watchJob();
  watchCatalogue();
  takeDrops();
  reloadLater();
  document.querySelectorAll(".zoomable").forEach(zoomable);
});
