#include "src/output/report_page_script.h"

namespace coilspin::output {

const char* ReportScript() {
  return R"js(
(function () {
  "use strict";
  var problems = document.getElementById("report-problems");
  function note(message) {
    problems.hidden = false;
    var item = document.createElement("li");
    item.textContent = String(message);
    problems.querySelector("ul").appendChild(item);
  }
  window.addEventListener("error", function (event) { note(event.message); });
  if (typeof Dygraph === "undefined") { note("the charting library did not load"); return; }
  var specs = JSON.parse(document.getElementById("chart-data").textContent);
  var UNUSED = "rgba(120, 110, 95, 0.16)";
  function underlay(spec) {
    return function (ctx, area, g) {
      var range = g.xAxisRange();
      if (spec.shade) {
        ctx.fillStyle = UNUSED;
        var fill = function (a, b) {
          var x0 = g.toDomXCoord(a), x1 = g.toDomXCoord(b);
          ctx.fillRect(Math.max(x0, area.x), area.y, Math.min(x1, area.x + area.w) - Math.max(x0, area.x), area.h);
        };
        var start = range[0];
        spec.used.forEach(function (u) {
          if (u[0] > start) fill(start, Math.min(u[0], range[1]));
          start = Math.max(start, u[1]);
        });
        if (start < range[1]) fill(start, range[1]);
      }
      if (spec.residual) {
        var y = g.toDomYCoord(0);
        if (y >= area.y && y <= area.y + area.h) {
          ctx.strokeStyle = "#6c6c6c";
          ctx.lineWidth = 1;
          ctx.beginPath();
          ctx.moveTo(area.x, y);
          ctx.lineTo(area.x + area.w, y);
          ctx.stroke();
        }
      }
    };
  }
  var drawn = 0;
  specs.forEach(function (spec) {
    try {
      var element = document.getElementById(spec.id);
      var options = {
        labels: ["x"].concat(spec.series),
        colors: spec.colours,
        xlabel: spec.xlabel,
        ylabel: spec.ylabel,
        title: spec.title,
        titleHeight: 24,
        strokeWidth: 1.3,
        legend: "always",
        labelsSeparateLines: false,
        labelsDiv: element.id + "-legend",
        customBars: spec.band,
        underlayCallback: underlay(spec),
        axes: { y: { axisLabelWidth: 72, pixelsPerLabel: 22, axisLabelFontSize: 12 }, x: { axisLabelWidth: 64, axisLabelFontSize: 12 } },
        series: {}
      };
      spec.points.forEach(function (name) {
        options.series[name] = { strokeWidth: 0, drawPoints: true, pointSize: 3.5 };
      });
      if (spec.series.length > 1) options.series[spec.series[1]] = options.series[spec.series[1]] || { strokeWidth: 2 };
      new Dygraph(element, spec.rows, options);
      drawn += 1;
    } catch (error) {
      note(spec.id + ": " + error);
    }
  });
  var boxes = [];
  specs.forEach(function (spec) {
    var canvas = document.getElementById(spec.id).querySelector("canvas");
    if (!canvas) return;
    var r = canvas.getBoundingClientRect();
    boxes.push([Math.round(r.left + window.scrollX), Math.round(r.top + window.scrollY),
                Math.round(r.width), Math.round(r.height)].join(","));
  });
  document.body.setAttribute("data-charts-drawn", String(drawn));
  document.body.setAttribute("data-chart-boxes", boxes.join(";"));
  document.body.setAttribute("data-page-height", String(document.documentElement.scrollHeight));
  document.body.setAttribute("data-resources-fetched", String(performance.getEntriesByType("resource").length));
})();
)js";
}

const char* ReportStyle() {
  return R"css(
body { font-family: "DejaVu Sans", Verdana, sans-serif; font-size: 14px; color: #1d2430; background: #fbfaf7;
       margin: 0 auto; padding: 16px 28px 40px; max-width: 1000px; }
h1 { font-size: 22px; margin: 8px 0 4px; color: #14213d; }
h2 { font-size: 18px; margin: 28px 0 8px; padding-bottom: 3px; border-bottom: 2px solid #d9d2c5; color: #14213d; }
h3 { font-size: 15px; margin: 22px 0 6px; color: #33415c; }
p.lead { margin: 2px 0 10px; color: #4a5568; }
table { border-collapse: collapse; margin: 6px 0 12px; }
th, td { padding: 3px 9px; text-align: left; vertical-align: top; border-bottom: 1px solid #e4ded3; }
th { background: #efe9dd; font-weight: 600; }
td.num { font-variant-numeric: tabular-nums; white-space: nowrap; }
td.note { color: #4a5568; font-size: 12.5px; max-width: 360px; }
ul.findings li { margin: 3px 0; }
.chart { width: 880px; height: 250px; margin: 4px 0 0; }
.chart.residual { height: 170px; }
.legend { font-size: 12px; min-height: 18px; margin: 0 0 10px 60px; color: #33415c; }
.key { font-size: 12.5px; color: #4a5568; }
.swatch { display: inline-block; width: 22px; height: 11px; vertical-align: middle; border: 1px solid #b8b0a2; }
table.correlation td { text-align: center; min-width: 54px; font-variant-numeric: tabular-nums; }
#report-problems { border: 2px solid #b00020; background: #fde8ea; padding: 4px 12px; }
pre { background: #f1ede4; padding: 8px 10px; overflow-x: auto; font-size: 12px; }
footer { margin-top: 30px; font-size: 12px; color: #6b7280; }
)css";
}

}  // namespace coilspin::output
