// The page's only script, small vanilla JavaScript kept as a string: a cursor at one distance on every chart
// with the values read out, the dot on the map and the g-g diagram, and zooming every chart to a corner.
// It writes text with textContent only, never as markup.

import { niceTicks } from './scale.js';

const SCRIPT_BODY = String.raw`(function () {
  'use strict';
  var niceTicks = __NICE_TICKS__;
  var data = JSON.parse(document.getElementById('lap-data').textContent);
  var charts = Array.prototype.slice.call(document.querySelectorAll('svg[data-distance-chart]'));
  var svgNs = charts.length ? charts[0].namespaceURI : null;
  var maps = Array.prototype.slice.call(document.querySelectorAll('svg[data-track-map]'));
  var mapDots = maps.map(function (map) { return map.querySelector('.map-dot'); });
  var gg = document.querySelector('svg[data-chart="gg"]');
  var ggDots = gg ? { R: gg.querySelector('.gg-dot-reference'), D: gg.querySelector('.gg-dot-driver') } : {};
  var resetButton = document.getElementById('zoom-reset');
  var zoomLabel = document.getElementById('zoom-label');
  var domain = [0, data.length];

  function attrs(element, values) {
    for (var key in values) element.setAttribute(key, String(values[key]));
    return element;
  }
  function plotOf(svg) {
    return { left: +svg.getAttribute('data-plot-left'), width: +svg.getAttribute('data-plot-width') };
  }
  function drawAxis(svg, plot) {
    var axis = svg.querySelector('.x-axis');
    var y = +axis.getAttribute('data-y');
    while (axis.firstChild) axis.removeChild(axis.firstChild);
    niceTicks(domain[0], domain[1], 10).forEach(function (tick) {
      var x = plot.left + ((tick - domain[0]) / (domain[1] - domain[0])) * plot.width;
      axis.appendChild(attrs(document.createElementNS(svgNs, 'line'), { x1: x, x2: x, y1: y, y2: y + 4, stroke: '#555555' }));
      var label = attrs(document.createElementNS(svgNs, 'text'), { x: x, y: y + 15, 'text-anchor': 'middle', fill: '#555555', class: 'tick' });
      label.textContent = String(Number(tick.toFixed(2)));
      axis.appendChild(label);
    });
    var title = attrs(document.createElementNS(svgNs, 'text'), { x: plot.left + plot.width, y: y + 26, 'text-anchor': 'end', fill: '#555555' });
    title.textContent = 'distance, ' + data.labels.distance;
    axis.appendChild(title);
  }
  // The y range of a chart's series inside [from, to], padded, held inside the axis of the whole lap (whose
  // ranges already leave out a logged lap's spikes), and with zero where the chart reads against zero.
  function yDomainOf(svg, from, to) {
    var whole = svg.getAttribute('data-y-domain').split(' ').map(Number);
    if (to - from >= data.length) return whole;
    var low = Infinity;
    var high = -Infinity;
    svg.getAttribute('data-y-keys').split(' ').forEach(function (key) {
      var series = data.series[key];
      if (!series) return;
      for (var i = 0; i < data.d.length; i++) {
        if (data.d[i] < from || data.d[i] > to) continue;
        if (series[i] < low) low = series[i];
        if (series[i] > high) high = series[i];
      }
    });
    if (svg.hasAttribute('data-y-zero')) { low = Math.min(low, 0); high = Math.max(high, 0); }
    if (!(high >= low)) return whole;
    var pad = Math.max((high - low) * 0.08, (whole[1] - whole[0]) * 0.01);
    return [Math.max(whole[0], low - pad), Math.min(whole[1], high + pad)];
  }
  function drawYAxis(svg, plot, yDomain, top, bottom) {
    var ticks = svg.querySelector('.y-ticks');
    while (ticks.firstChild) ticks.removeChild(ticks.firstChild);
    niceTicks(yDomain[0], yDomain[1], 4).forEach(function (tick) {
      var y = bottom - ((tick - yDomain[0]) / (yDomain[1] - yDomain[0])) * (bottom - top);
      ticks.appendChild(attrs(document.createElementNS(svgNs, 'line'), { x1: plot.left, x2: plot.left + plot.width, y1: y, y2: y, stroke: tick === 0 ? '#b8b8b8' : '#e3e3e3' }));
      var label = attrs(document.createElementNS(svgNs, 'text'), { x: plot.left - 6, y: y, dy: '0.32em', 'text-anchor': 'end', fill: '#555555' });
      label.textContent = String(Number(tick.toFixed(2)));
      ticks.appendChild(label);
    });
  }
  // Corner numbers stay at their apex: the whole lap shows the ones that fit; a zoomed corner shows every one inside it.
  function placeCornerLabels(svg, plot, zoomed) {
    Array.prototype.slice.call(svg.querySelectorAll('.corner-label')).forEach(function (text) {
      var at = +text.getAttribute('data-at');
      var inside = at >= domain[0] && at <= domain[1];
      text.setAttribute('x', plot.left + ((at - domain[0]) / (domain[1] - domain[0])) * plot.width);
      text.setAttribute('visibility', !inside ? 'hidden' : zoomed ? 'visible' : text.getAttribute('data-whole'));
    });
  }
  function zoomTo(from, to, label) {
    domain = [from, to];
    var k = data.length / (to - from);
    charts.forEach(function (svg) {
      var plot = plotOf(svg);
      var shift = (-from / data.length) * plot.width;
      var yPart = ' 0) scale(' + k + ' 1)';
      if (svg.hasAttribute('data-y-keys')) {
        var whole = svg.getAttribute('data-y-domain').split(' ').map(Number);
        var top = +svg.getAttribute('data-plot-top');
        var bottom = +svg.getAttribute('data-plot-bottom');
        var yDomain = yDomainOf(svg, from, to);
        var ky = (whole[1] - whole[0]) / (yDomain[1] - yDomain[0]);
        var ty = bottom * (1 - ky) - ((whole[0] - yDomain[0]) * (bottom - top)) / (yDomain[1] - yDomain[0]);
        yPart = ' ' + ty + ') scale(' + k + ' ' + ky + ')';
        svg.setAttribute('data-y-shown', yDomain.map(function (v) { return Number(v.toPrecision(6)); }).join(' '));
        drawYAxis(svg, plot, yDomain, top, bottom);
      }
      svg.querySelector('.zoom').setAttribute('transform', 'translate(' + plot.left + yPart + ' translate(' + shift + ' 0)');
      drawAxis(svg, plot);
      placeCornerLabels(svg, plot, Boolean(label));
    });
    document.body.setAttribute('data-zoom', label ? 'corner' : 'lap');
    resetButton.disabled = !label;
    zoomLabel.textContent = label || 'whole lap';
    hide();
  }
  function indexAt(distance) {
    var d = data.d;
    var low = 0;
    var high = d.length - 1;
    while (high - low > 1) {
      var middle = (low + high) >> 1;
      if (d[middle] <= distance) low = middle;
      else high = middle;
    }
    return distance - d[low] <= d[high] - distance ? low : high;
  }
  function text(value, digits, unit) {
    return value === null || value === undefined ? '–' : value.toFixed(digits) + unit;
  }
  function channel(name, index) {
    var series = data.series[name];
    return series ? series[index] : null;
  }
  function setField(name, value) {
    var element = document.querySelector('[data-field="' + name + '"]');
    if (element) element.textContent = value;
  }
  function show(index) {
    var distance = data.d[index];
    if (distance < domain[0] || distance > domain[1]) return hide();
    charts.forEach(function (svg) {
      var plot = plotOf(svg);
      var x = plot.left + ((distance - domain[0]) / (domain[1] - domain[0])) * plot.width;
      attrs(svg.querySelector('.cursor'), { x1: x, x2: x, visibility: 'visible' });
    });
    mapDots.forEach(function (dot) { if (dot) attrs(dot, { cx: data.mapX[index], cy: data.mapY[index], visibility: 'visible' }); });
    ['R', 'D', 'O'].forEach(function (who) {
      var dot = ggDots[who];
      var ax = channel('ax' + who, index);
      var ay = channel('ay' + who, index);
      if (!dot || ax === null || ay === null) return;
      attrs(dot, { cx: data.gg.cx + ay * data.gg.pxPerG, cy: data.gg.cy - ax * data.gg.pxPerG, visibility: 'visible' });
    });
    setField('distance', text(distance, 0, ' ' + data.labels.distance));
    ['R', 'D', 'O'].forEach(function (who) {
      setField('speed' + who, text(channel('v' + who, index), 1, ' ' + data.labels.speed));
      setField('throttle' + who, text(channel('t' + who, index), 0, ' %'));
      setField('brake' + who, text(channel('b' + who, index), 0, ' %'));
      setField('grip' + who, text(channel('g' + who, index), 0, ' %'));
      var ax = channel('ax' + who, index);
      var ay = channel('ay' + who, index);
      setField('accel' + who, ax === null ? '–' : ax.toFixed(2) + ' / ' + ay.toFixed(2) + ' g');
    });
    ['dt', 'dtO'].forEach(function (name) {
      var delta = channel(name, index);
      setField(name === 'dt' ? 'delta' : 'deltaO', delta === null ? '–' : (delta > 0 ? '+' : '') + delta.toFixed(3) + ' s');
    });
  }
  function hide() {
    charts.forEach(function (svg) { svg.querySelector('.cursor').setAttribute('visibility', 'hidden'); });
    mapDots.forEach(function (dot) { if (dot) dot.setAttribute('visibility', 'hidden'); });
    if (ggDots.R) ggDots.R.setAttribute('visibility', 'hidden');
    if (ggDots.D) ggDots.D.setAttribute('visibility', 'hidden');
  }
  function svgPoint(svg, event) {
    var point = svg.createSVGPoint();
    point.x = event.clientX;
    point.y = event.clientY;
    return point.matrixTransform(svg.getScreenCTM().inverse());
  }
  charts.forEach(function (svg) {
    var area = svg.querySelector('.hover-area');
    area.addEventListener('pointermove', function (event) {
      var plot = plotOf(svg);
      var local = svgPoint(svg, event);
      show(indexAt(domain[0] + ((local.x - plot.left) / plot.width) * (domain[1] - domain[0])));
    });
    area.addEventListener('pointerleave', hide);
  });
  maps.forEach(function (map) {
    map.addEventListener('pointermove', function (event) {
      var local = svgPoint(map, event);
      var best = -1;
      var bestDistance = 400;
      for (var i = 0; i < data.mapX.length; i++) {
        var dx = data.mapX[i] - local.x;
        var dy = data.mapY[i] - local.y;
        var squared = dx * dx + dy * dy;
        if (squared < bestDistance) { bestDistance = squared; best = i; }
      }
      if (best >= 0) show(best); else hide();
    });
    map.addEventListener('pointerleave', hide);
  });
  var cornerById = {};
  data.corners.forEach(function (corner) { cornerById[corner.id] = corner; });
  Array.prototype.slice.call(document.querySelectorAll('[data-corner]')).forEach(function (element) {
    function zoom() {
      var corner = cornerById[element.getAttribute('data-corner')];
      if (corner) zoomTo(corner.from, corner.to, corner.label);
    }
    element.addEventListener('click', zoom);
    element.addEventListener('keydown', function (event) {
      if (event.key === 'Enter' || event.key === ' ') { event.preventDefault(); zoom(); }
    });
  });
  resetButton.addEventListener('click', function () { zoomTo(0, data.length, null); });
  document.addEventListener('keydown', function (event) { if (event.key === 'Escape') zoomTo(0, data.length, null); });
  zoomTo(0, data.length, null);
})();`;

/** The script's text, with the tick function the server uses built in. */
export function clientScript(): string {
  return SCRIPT_BODY.replace('__NICE_TICKS__', niceTicks.toString());
}
