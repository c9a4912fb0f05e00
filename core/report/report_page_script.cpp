// The report page's script: draws the clouds and the curves as SVG from the data block,
// moves A with the θ slider exactly as the engine's FamilyMap does (shift, rotate and scale
// about the pivot, interpolate along the W2 plan entries, mix), and reads every measure out
// at the nearest θ the sweep computed. It computes no measure: every number is the sweep's.
#include "report/report_html.h"

namespace barrow {

const char* reportPageScript() {
  return R"JS((function () {
  'use strict';
  var NS = 'http://www.w3.org/2000/svg';
  var data = JSON.parse(document.getElementById('barrow-report-data').textContent);
  var view = JSON.parse(document.getElementById('barrow-report-view').textContent);
  var sw = data.settings.sweep;
  var ids = sw.measures;
  var nm = ids.length;
  var rows = data.sweep.rows;

  // The sweep's own numbers, read from the table ("inf" is +infinity, null a failed cell).
  function cell(c) { return c === null ? NaN : c === 'inf' ? Infinity : c === '-inf' ? -Infinity : c; }
  var thetas = rows.map(function (r) { return r[0]; });
  var values = ids.map(function (id, k) { return rows.map(function (r) { return cell(r[1 + k]); }); });
  var slopes = ids.map(function (id, k) { return rows.map(function (r) { return cell(r[1 + nm + k]); }); });
  var findings = {};
  data.findings.forEach(function (f) { findings[f.id] = f; });

  function nearestRow(t) {
    var best = 0;
    for (var k = 1; k < thetas.length; ++k) if (Math.abs(thetas[k] - t) < Math.abs(thetas[best] - t)) best = k;
    return best;
  }
  var refRow = thetas.length ? nearestRow(sw.reference) : 0;

  function el(name, attrs, parent) {
    var e = document.createElementNS(NS, name);
    for (var k in attrs) e.setAttribute(k, attrs[k]);
    if (parent) parent.appendChild(e);
    return e;
  }
  function fmt(v) {
    if (v === Infinity) return '+\u221e';
    if (v === -Infinity) return '\u2212\u221e';
    if (isNaN(v)) return '\u2014';
    return String(Number(v.toPrecision(6)));
  }
  function styleOf(id) {
    var k = view.rank[id] === undefined ? 0 : view.rank[id];
    var n = view.curves.length;
    return { color: view.curves[k % n], dash: view.dashes[Math.floor(k / n) % view.dashes.length] };
  }
  function swatch(id) {
    var s = styleOf(id);
    var svg = el('svg', { width: 22, height: 10, 'class': 'swatch', 'aria-hidden': 'true' });
    el('line', { x1: 1, y1: 5, x2: 21, y2: 5, stroke: s.color, 'stroke-width': 2.4, 'stroke-dasharray': s.dash }, svg);
    return svg;
  }

  // ---- The family: A_theta exactly as the engine's FamilyMap builds it -------------------
  var A = data.clouds.A, B = data.clouds.B;
  var nA = A.points.length, nB = B.points.length;
  function column(pts, c) { var out = new Float64Array(pts.length); for (var i = 0; i < pts.length; ++i) out[i] = pts[i][c]; return out; }
  var ax = column(A.points, 0), ay = column(A.points, 1), bx = column(B.points, 0), by = column(B.points, 1);
  function normalised(w) { var s = 0, i; for (i = 0; i < w.length; ++i) s += w[i]; return w.map(function (v) { return v / s; }); }
  var aw = A.weights, bw = B.weights, awN = normalised(aw), bwN = normalised(bw);
  var iplan = data.clouds.interpolation_plan || [];
  var fam = sw.family;
  var pivot = [sw.pivot[0], sw.pivot[1]];
  var size = fam === 'interpolate' ? iplan.length : fam === 'mix' ? nA + nB : nA;

  function familyAt(t) {
    var x = new Float64Array(size), y = new Float64Array(size), w, i;
    if (fam === 'shift') {
      var dx = sw.direction[0], dy = sw.direction[1], n = Math.sqrt(dx * dx + dy * dy), ux = dx / n, uy = dy / n;
      for (i = 0; i < nA; ++i) { x[i] = ax[i] + t * ux; y[i] = ay[i] + t * uy; }
      w = aw;
    } else if (fam === 'rotate') {
      var r = t * (Math.PI / 180), c = Math.cos(r), s = Math.sin(r);
      for (i = 0; i < nA; ++i) {
        var px = ax[i] - pivot[0], py = ay[i] - pivot[1];
        x[i] = (px * c - py * s) + pivot[0]; y[i] = (px * s + py * c) + pivot[1];
      }
      w = aw;
    } else if (fam === 'scale') {
      for (i = 0; i < nA; ++i) { x[i] = (ax[i] - pivot[0]) * t + pivot[0]; y[i] = (ay[i] - pivot[1]) * t + pivot[1]; }
      w = aw;
    } else if (fam === 'interpolate') {
      w = new Array(size);
      for (i = 0; i < size; ++i) {
        var e = iplan[i];
        x[i] = (1 - t) * ax[e[0]] + t * bx[e[1]]; y[i] = (1 - t) * ay[e[0]] + t * by[e[1]]; w[i] = e[2];
      }
    } else {  // mix: both point sets, A's weights times (1 - t), B's times t
      w = new Array(size);
      for (i = 0; i < nA; ++i) { x[i] = ax[i]; y[i] = ay[i]; w[i] = (1 - t) * awN[i]; }
      for (i = 0; i < nB; ++i) { x[nA + i] = bx[i]; y[nA + i] = by[i]; w[nA + i] = t * bwN[i]; }
    }
    return { x: x, y: y, w: w };
  }

  // Marker diameter in pixels as the window draws it: area proportional to the share of mass.
  function diameters(w, base) {
    var total = 0, i, out = new Float64Array(w.length);
    for (i = 0; i < w.length; ++i) total += w[i];
    for (i = 0; i < w.length; ++i) {
      var share = total > 0 ? w[i] * w.length / total : 1;
      out[i] = share <= 0 ? 0 : Math.min(Math.max(base * Math.sqrt(share), 3), 5 * base);
    }
    return out;
  }

  function niceTicks(lo, hi, count) {
    if (!(hi > lo)) return [lo];
    var step = Math.pow(10, Math.floor(Math.log10((hi - lo) / count)));
    var err = (hi - lo) / count / step;
    step *= err >= 7.5 ? 10 : err >= 3.5 ? 5 : err >= 1.5 ? 2 : 1;
    var out = [];
    for (var v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) out.push(Math.abs(v) < step * 1e-9 ? 0 : v);
    return out;
  }
  function tickText(v) { return String(Number(v.toPrecision(4))); }

  // ---- The clouds figure --------------------------------------------------------------------
  var cloudSvg = document.getElementById('cloud-fig');
  var W = 540, PAD = 34;
  var lo = [Infinity, Infinity], hi = [-Infinity, -Infinity];
  function grow(x, y) {
    for (var i = 0; i < x.length; ++i) {
      if (x[i] < lo[0]) lo[0] = x[i]; if (x[i] > hi[0]) hi[0] = x[i];
      if (y[i] < lo[1]) lo[1] = y[i]; if (y[i] > hi[1]) hi[1] = y[i];
    }
  }
  grow(bx, by); grow(ax, ay);
  var samples = thetas.length ? thetas : [sw.from, sw.to];
  for (var q = 0; q <= 16; ++q) {
    var at = familyAt(samples[Math.round(q * (samples.length - 1) / 16)]);
    grow(at.x, at.y);
  }
  var span = Math.max(hi[0] - lo[0], hi[1] - lo[1]);
  if (!(span > 0)) span = Math.max(1, Math.abs(lo[0]), Math.abs(lo[1]));
  var spanX = Math.max(hi[0] - lo[0], span * 0.35), spanY = Math.max(hi[1] - lo[1], span * 0.35);
  var H = Math.round(Math.min(Math.max((W - 2 * PAD) * spanY / spanX + 2 * PAD, 300), 620));
  var scale = Math.min((W - 2 * PAD) / (spanX * 1.08), (H - 2 * PAD) / (spanY * 1.08));
  var midX = (lo[0] + hi[0]) / 2, midY = (lo[1] + hi[1]) / 2;
  var ox = W / 2 - scale * midX, oy = H / 2 + scale * midY;
  cloudSvg.setAttribute('viewBox', '0 0 ' + W + ' ' + H);
  var frame = el('g', { 'class': 'axes', 'font-size': 10, fill: '#5d6872' }, cloudSvg);
  el('rect', { x: 0.5, y: 0.5, width: W - 1, height: H - 1, fill: 'none', stroke: '#d8dde2' }, frame);
  niceTicks(lo[0] - spanX * 0.04, hi[0] + spanX * 0.04, 5).forEach(function (v) {
    var px = ox + scale * v;
    if (px < 20 || px > W - 10) return;
    el('line', { x1: px, x2: px, y1: H - 14, y2: H - 10, stroke: '#9aa4ad' }, frame);
    el('text', { x: px, y: H - 2, 'text-anchor': 'middle' }, frame).textContent = tickText(v);
  });
  niceTicks(lo[1] - spanY * 0.04, hi[1] + spanY * 0.04, 5).forEach(function (v) {
    var py = oy - scale * v;
    if (py < 10 || py > H - 20) return;
    el('line', { x1: 1, x2: 5, y1: py, y2: py, stroke: '#9aa4ad' }, frame);
    el('text', { x: 8, y: py + 3.5 }, frame).textContent = tickText(v);
  });
  // Data coordinates inside: cx, cy of every marker are the cloud's own numbers.
  var world = el('g', { transform: 'matrix(' + scale + ' 0 0 ' + -scale + ' ' + ox + ' ' + oy + ')' }, cloudSvg);
  var px1 = 1 / scale;
  function num(v) { return String(v); }

  // A as given, faint and hollow, so the move is visible.
  if (fam !== 'mix') {
    var ghost = [], gd = diameters(aw, 6);
    for (var i = 0; i < nA; ++i) {
      var gr = Math.max(gd[i], 3) / 2 * px1;
      ghost.push('M' + (ax[i] - gr) + ' ' + ay[i] + 'a' + gr + ' ' + gr + ' 0 1 0 ' + 2 * gr + ' 0a' + gr + ' ' + gr + ' 0 1 0 ' + -2 * gr + ' 0');
    }
    el('path', { d: ghost.join(''), fill: 'none', stroke: view.colors.A, 'stroke-opacity': 0.32, 'stroke-width': 0.9,
                 'vector-effect': 'non-scaling-stroke', 'class': 'ghost' }, world);
  }
  // The exact W2 plan at the reference theta, opacity following the mass (eight levels).
  var planG = el('g', { 'class': 'plan' }, world);
  var plan = data.clouds.plan.entries, refCloud = familyAt(thetas.length ? thetas[refRow] : sw.reference);
  if (plan.length) {
    var maxMass = 0;
    plan.forEach(function (e) { if (e[2] > maxMass) maxMass = e[2]; });
    var levels = [[], [], [], [], [], [], [], []];
    plan.forEach(function (e) {
      var lv = Math.min(7, Math.floor(8 * e[2] / maxMass));
      levels[lv].push('M' + refCloud.x[e[0]] + ' ' + refCloud.y[e[0]] + 'L' + bx[e[1]] + ' ' + by[e[1]]);
    });
    levels.forEach(function (segs, lv) {
      if (segs.length) el('path', { d: segs.join(''), fill: 'none', stroke: view.colors.plan, 'stroke-opacity': 0.06 + 0.5 * (lv + 1) / 8,
                                    'stroke-width': 1, 'vector-effect': 'non-scaling-stroke' }, planG);
    });
  }
  // B: triangles, one path.
  var tri = [], bd = diameters(bw, 8);
  for (var j = 0; j < nB; ++j) {
    var h = bd[j] / 2 * 1.15 * px1;
    tri.push('M' + bx[j] + ' ' + (by[j] + h) + 'L' + (bx[j] + 0.92 * h) + ' ' + (by[j] - 0.6 * h) + 'L' + (bx[j] - 0.92 * h) + ' ' + (by[j] - 0.6 * h) + 'Z');
  }
  el('path', { d: tri.join(''), fill: view.colors.B, 'fill-opacity': 0.78, stroke: '#9e4600', 'stroke-width': 0.8,
               'vector-effect': 'non-scaling-stroke', 'class': 'cloud-b' }, world);
  // A_theta: one path, one circle per point, each begun by an absolute move to the point's
  // exact coordinates ("M x y", then a relative step to the circle's edge): one attribute to
  // update per move of the slider, and the points can be read back from it exactly.
  var aPath = el('path', { 'class': 'cloud-a', fill: view.colors.A, 'fill-opacity': 0.78, stroke: '#005484',
                           'stroke-width': 0.8, 'vector-effect': 'non-scaling-stroke' }, world);
  // Marker outlines, kept by diameter in quarter pixels (as the window keeps its sprites).
  var arcCache = {};
  function arcFor(diam) {
    var key = Math.round(diam * 4);
    var hit = arcCache[key];
    if (hit !== undefined) return hit;
    var r = key / 8 * px1;
    return (arcCache[key] = r > 0 ? 'm' + -r + ' 0a' + r + ' ' + r + ' 0 1 0 ' + 2 * r + ' 0a' + r + ' ' + r + ' 0 1 0 ' + -2 * r + ' 0' : '');
  }
  function arcs(diam) { var out = new Array(diam.length); for (var i = 0; i < diam.length; ++i) out[i] = arcFor(diam[i]); return out; }
  // Only the mix changes the masses (and so the marker sizes); only the mix keeps the points still.
  var fixedArcs = fam === 'mix' ? null : arcs(diameters(familyAt(sw.from).w, 7));
  var fixedMoves = null;
  if (fam === 'mix') {
    var still = familyAt(sw.from);
    fixedMoves = new Array(size);
    for (var q2 = 0; q2 < size; ++q2) fixedMoves[q2] = 'M' + still.x[q2] + ' ' + still.y[q2];
  }
  var planNote = el('text', { x: W - 8, y: 14, 'text-anchor': 'end', 'font-size': 11, fill: '#5d6872' }, cloudSvg);

  var cloudLegend = document.getElementById('cloud-legend');
  function legendItem(parent, html) { var s = document.createElement('span'); s.className = 'legend-item'; s.innerHTML = html; parent.appendChild(s); return s; }
  function textOf(s) { var d = document.createElement('span'); d.textContent = s; return d.innerHTML; }
  legendItem(cloudLegend, '<span class="mark mark-a"></span>A<sub>\u03b8</sub> \u201c' + textOf(A.name || 'A') + '\u201d');
  legendItem(cloudLegend, '<span class="mark mark-b"></span>B \u201c' + textOf(B.name || 'B') + '\u201d');
  if (fam !== 'mix') legendItem(cloudLegend, '<svg width="12" height="12"><circle cx="6" cy="6" r="4.5" fill="none" stroke="' + view.colors.A + '" stroke-opacity="0.5"/></svg>A as given');
  legendItem(cloudLegend, plan.length ? '<svg width="16" height="8"><line x1="0" y1="4" x2="16" y2="4" stroke="#000"/></svg>W2 plan at the reference \u03b8 (darker = more mass)'
                                      : textOf(data.clouds.plan.note || 'no plan'));

  // ---- The curves figure --------------------------------------------------------------------
  var curveSvg = document.getElementById('curve-fig');
  var CW = 760, ML = 58, MR = 14, MT = 14, PH = 300, LANE = 13;
  var lanesTop = MT + PH + 58, CH = lanesTop + LANE * nm + 8;
  curveSvg.setAttribute('viewBox', '0 0 ' + CW + ' ' + CH);
  var t0 = thetas.length ? thetas[0] : sw.from, t1 = thetas.length ? thetas[thetas.length - 1] : sw.to;
  if (!(t1 > t0)) t1 = t0 + 1;
  function xOf(t) { return ML + (CW - ML - MR) * (t - t0) / (t1 - t0); }
  var curveAxes = el('g', { 'font-size': 10.5, fill: '#5d6872' }, curveSvg);
  var bandsG = el('g', {}, curveSvg);
  var seriesG = el('g', { fill: 'none', 'stroke-linejoin': 'round' }, curveSvg);
  var lanesG = el('g', { 'font-size': 9.5 }, curveSvg);
  var cursorG = el('g', {}, curveSvg);
  var thetaWords = { shift: 'distance moved along (' + sw.direction.join(', ') + ')', rotate: 'degrees about the pivot',
                     scale: 'scale factor about the pivot', interpolate: 't along the W2 plan', mix: 'share of B in the mixture' };
  niceTicks(t0, t1, 8).forEach(function (v) {
    el('line', { x1: xOf(v), x2: xOf(v), y1: MT, y2: MT + PH, stroke: '#edf0f2' }, curveAxes);
    el('text', { x: xOf(v), y: MT + PH + 14, 'text-anchor': 'middle' }, curveAxes).textContent = tickText(v);
  });
  el('text', { x: (ML + CW - MR) / 2, y: MT + PH + 30, 'text-anchor': 'middle', fill: '#1c2328' }, curveAxes).textContent =
    '\u03b8: ' + (thetaWords[fam] || fam);
  el('rect', { x: ML, y: MT, width: CW - ML - MR, height: PH, fill: 'none', stroke: '#c5ccd2' }, curveAxes);
  var yAxisG = el('g', {}, curveAxes);
  var infLabel = el('text', { x: ML - 5, y: MT + 8, 'text-anchor': 'end', fill: '#1c2328' }, curveAxes);
  var yLabel = el('text', { transform: 'translate(12 ' + (MT + PH / 2) + ') rotate(-90)', 'text-anchor': 'middle', fill: '#1c2328' }, curveAxes);

  var ranges = values.map(function (vs) {
    var mn = Infinity, mx = -Infinity;
    vs.forEach(function (v) { if (isFinite(v)) { if (v < mn) mn = v; if (v > mx) mx = v; } });
    return [mn, mx];
  });
  var globalLo = Math.min.apply(null, ranges.map(function (r) { return r[0]; }).concat([Infinity]));
  var globalHi = Math.max.apply(null, ranges.map(function (r) { return r[1]; }).concat([-Infinity]));
  var normalisedView = true;
  function yOf(k, v) {
    var a, b;
    if (normalisedView) { a = ranges[k][0]; b = ranges[k][1]; } else { a = globalLo; b = globalHi; }
    var u = b > a ? (v - a) / (b - a) : 0.5;
    return MT + PH - (0.04 + 0.92 * u) * PH;
  }
  var paths = [], infMarks = [], dots = [];
  ids.forEach(function (id, k) {
    var s = styleOf(id);
    paths.push(el('path', { stroke: s.color, 'stroke-width': 1.8, 'stroke-dasharray': s.dash, 'data-id': id }, seriesG));
    infMarks.push(el('path', { stroke: s.color, 'stroke-width': 1.6, 'data-id': id }, seriesG));
    dots.push(el('circle', { r: 3.6, fill: s.color, stroke: '#fff', 'stroke-width': 1, 'data-id': id }, cursorG));
  });
  function drawCurves() {
    yAxisG.textContent = '';
    var anyInf = false;
    var ticks = normalisedView ? [0, 0.25, 0.5, 0.75, 1] : niceTicks(globalLo, globalHi, 6);
    ticks.forEach(function (v) {
      var y = normalisedView ? MT + PH - (0.04 + 0.92 * v) * PH : yOf(0, v);
      if (!isFinite(y) || y < MT + 10 || y > MT + PH + 1) return;
      el('line', { x1: ML, x2: CW - MR, y1: y, y2: y, stroke: '#edf0f2' }, yAxisG);
      el('text', { x: ML - 5, y: y + 3.5, 'text-anchor': 'end' }, yAxisG).textContent = tickText(v);
    });
    yLabel.textContent = normalisedView ? 'D, each scaled to its own range' : 'D (values as computed)';
    ids.forEach(function (id, k) {
      var d = [], inf = [], pen = false;
      for (var r = 0; r < thetas.length; ++r) {
        var v = values[k][r];
        if (isFinite(v)) { d.push((pen ? 'L' : 'M') + xOf(thetas[r]).toFixed(2) + ' ' + yOf(k, v).toFixed(2)); pen = true; }
        else { pen = false; if (v === Infinity) inf.push('M' + xOf(thetas[r]).toFixed(2) + ' ' + (MT + 2) + 'v6'); }
      }
      paths[k].setAttribute('d', d.join(''));
      infMarks[k].setAttribute('d', inf.join(''));
      anyInf = anyInf || inf.length > 0;
    });
    infLabel.textContent = anyInf ? '+\u221e' : '';
  }

  // Lanes: one per measure, its flat stretches and jumps.
  ids.forEach(function (id, k) {
    var y = lanesTop + k * LANE, f = findings[id];
    el('text', { x: ML - 8, y: y + 9.5, 'text-anchor': 'end', fill: '#1c2328' }, lanesG).textContent = id;
    el('line', { x1: ML, x2: CW - MR, y1: y + 6.5, y2: y + 6.5, stroke: styleOf(id).color, 'stroke-width': 1.4,
                 'stroke-dasharray': styleOf(id).dash, 'stroke-opacity': 0.7 }, lanesG);
    if (!f) return;
    f.flat.forEach(function (st) {
      el('rect', { x: xOf(st[0]), y: y + 1.5, width: Math.max(1.5, xOf(st[1]) - xOf(st[0])), height: 10, fill: view.colors.flat,
                   'fill-opacity': 0.55, 'class': 'flat-mark', 'data-id': id }, lanesG);
    });
    var marks = function (list, hollow) {
      (list || []).forEach(function (jp) {
        var x = xOf(jp.theta);
        el('path', { d: 'M' + (x - 4.5) + ' ' + (y + 1) + 'h9l-4.5 10z', fill: hollow ? '#fff' : view.colors.jump, stroke: view.colors.jump,
                     'class': 'jump-mark', 'data-id': id, 'data-theta': jp.theta }, lanesG);
      });
    };
    marks(f.jumps, false);
    marks(f.unresolved, true);
  });
  el('text', { x: ML, y: lanesTop - 6, fill: '#5d6872', 'font-size': 10 }, lanesG).textContent =
    'Findings per measure: \u25bc jump, \u25bd unresolved, blue band = flat (no gradient)';

  var cursorLine = el('line', { y1: MT, y2: CH - 4, stroke: '#282828', 'stroke-width': 1.2 }, cursorG);
  cursorG.insertBefore(cursorLine, cursorG.firstChild);
  var pickedBands = el('g', {}, bandsG);

  var curveLegend = document.getElementById('curve-legend');
  legendItem(curveLegend, 'Click a row of the table below to pick out one measure.').classList.add('screen-only');

  // ---- The readout ---------------------------------------------------------------------------
  var tbody = document.querySelector('#readout tbody');
  var readCells = ids.map(function (id, k) {
    var tr = document.createElement('tr');
    tr.setAttribute('data-id', id);
    tr.tabIndex = 0;
    var name = document.createElement('td');
    name.appendChild(swatch(id));
    name.appendChild(document.createTextNode(view.names[id] || id));
    var v = document.createElement('td'); v.className = 'n value';
    var s = document.createElement('td'); s.className = 'n slope';
    var w = document.createElement('td'); w.className = 'where';
    tr.appendChild(name); tr.appendChild(v); tr.appendChild(s); tr.appendChild(w);
    tbody.appendChild(tr);
    tr.addEventListener('click', function () { pick(picked === id ? null : id); });
    tr.addEventListener('keydown', function (e) { if (e.key === 'Enter' || e.key === ' ') { e.preventDefault(); pick(picked === id ? null : id); } });
    return { tr: tr, v: v, s: s, w: w };
  });

  var picked = null;
  function pick(id) {
    picked = id;
    pickedBands.textContent = '';
    ids.forEach(function (other, k) {
      var on = id === null || other === id;
      paths[k].setAttribute('stroke-opacity', on ? 1 : 0.16);
      paths[k].setAttribute('stroke-width', other === id ? 2.8 : 1.8);
      dots[k].setAttribute('opacity', on ? 1 : 0.2);
      readCells[k].tr.classList.toggle('picked', other === id);
    });
    var f = id && findings[id];
    if (f) {
      f.flat.forEach(function (st) {
        el('rect', { x: xOf(st[0]), y: MT, width: Math.max(1.5, xOf(st[1]) - xOf(st[0])), height: PH, fill: view.colors.flat, 'fill-opacity': 0.22 }, pickedBands);
      });
      f.jumps.forEach(function (jp) {
        el('line', { x1: xOf(jp.theta), x2: xOf(jp.theta), y1: MT, y2: MT + PH, stroke: view.colors.jump, 'stroke-dasharray': '4 3' }, pickedBands);
      });
    }
  }

  function inFlat(f, t) { return f && f.flat.some(function (st) { return t >= st[0] && t <= st[1]; }); }
  function jumpNear(f, r) {
    if (!f) return null;
    var a = thetas[Math.max(0, r - 1)], b = thetas[Math.min(thetas.length - 1, r + 1)];
    for (var q = 0; q < f.jumps.length; ++q) if (f.jumps[q].theta >= a && f.jumps[q].theta <= b) return f.jumps[q];
    return null;
  }

  // ---- Moving theta ----------------------------------------------------------------------------
  var slider = document.getElementById('theta');
  var out = document.getElementById('theta-out');
  slider.max = Math.max(0, thetas.length - 1);
  var current = -1;
  function setIndex(r) {
    r = Math.max(0, Math.min(thetas.length - 1, r | 0));
    if (!thetas.length) return;
    var t = thetas[r];
    current = r;
    slider.value = r;
    var text = '\u03b8 = ' + fmt(t);
    slider.setAttribute('aria-valuetext', text);
    out.textContent = text + (r === refRow ? '  (reference)' : '');
    out.setAttribute('data-theta', String(t));
    var at = familyAt(t);
    var arc = fixedArcs || arcs(diameters(at.w, 7)), parts = new Array(size);
    if (fixedMoves) for (var i = 0; i < size; ++i) parts[i] = fixedMoves[i] + arc[i];
    else for (var i2 = 0; i2 < size; ++i2) parts[i2] = 'M' + at.x[i2] + ' ' + at.y[i2] + arc[i2];
    aPath.setAttribute('d', parts.join(''));
    var showPlan = r === refRow;
    planG.setAttribute('visibility', showPlan ? 'visible' : 'hidden');
    planNote.textContent = plan.length && !showPlan ? 'plan shown at the reference \u03b8 only' : '';
    var x = xOf(t);
    cursorLine.setAttribute('x1', x); cursorLine.setAttribute('x2', x);
    ids.forEach(function (id, k) {
      var v = values[k][r], sl = slopes[k][r], cellRow = readCells[k], f = findings[id];
      cellRow.v.textContent = fmt(v);
      cellRow.v.setAttribute('data-exact', isNaN(v) ? '' : String(v));
      cellRow.s.textContent = isNaN(v) ? '' : fmt(sl);
      cellRow.s.setAttribute('data-exact', isNaN(v) || isNaN(sl) ? '' : String(sl));
      var jp = jumpNear(f, r);
      cellRow.w.textContent = isNaN(v) ? 'failed here' : v === Infinity ? 'infinite here'
        : jp ? 'jump at \u03b8 \u2248 ' + fmt(jp.theta) : inFlat(f, t) ? 'flat: no gradient' : '';
      if (isFinite(v)) { dots[k].setAttribute('cx', x); dots[k].setAttribute('cy', yOf(k, v)); dots[k].setAttribute('visibility', 'visible'); }
      else dots[k].setAttribute('visibility', 'hidden');
    });
  }

  slider.addEventListener('input', function () { setIndex(+slider.value); });
  document.getElementById('to-reference').addEventListener('click', function () { setIndex(refRow); slider.focus(); });
  document.getElementById('normalise').addEventListener('change', function (e) {
    normalisedView = e.target.checked; drawCurves(); setIndex(current);
  });
  function rowAtPointer(e) {
    var m = curveSvg.getScreenCTM();
    if (!m) return current;
    var p = curveSvg.createSVGPoint(); p.x = e.clientX; p.y = e.clientY;
    return nearestRow(t0 + (p.matrixTransform(m.inverse()).x - ML) / (CW - ML - MR) * (t1 - t0));
  }
  var dragging = false;
  curveSvg.addEventListener('pointerdown', function (e) { dragging = true; curveSvg.setPointerCapture(e.pointerId); setIndex(rowAtPointer(e)); });
  curveSvg.addEventListener('pointermove', function (e) { if (dragging) setIndex(rowAtPointer(e)); });
  curveSvg.addEventListener('pointerup', function () { dragging = false; });

  // ---- Saving the numbers back out -------------------------------------------------------------
  function cloudCsv(which) {
    var c = which === 'A' ? A : B, lines = ['x,y,w'];
    for (var i = 0; i < c.points.length; ++i) lines.push(c.points[i][0] + ',' + c.points[i][1] + ',' + c.weights[i]);
    return lines.join('\n') + '\n';
  }
  function sweepCsv() {
    var lines = [data.sweep.columns.join(',')];
    rows.forEach(function (r) { lines.push(r.map(function (v) { return v === null ? '' : String(v); }).join(',')); });
    return lines.join('\n') + '\n';
  }
  Array.prototype.forEach.call(document.querySelectorAll('[data-save]'), function (b) {
    b.addEventListener('click', function () {
      var what = b.getAttribute('data-save');
      var text = what === 'sweep' ? sweepCsv() : cloudCsv(what);
      var a = document.createElement('a');
      a.href = URL.createObjectURL(new Blob([text], { type: 'text/csv' }));
      a.download = what === 'sweep' ? 'sweep.csv' : what + '.csv';
      document.body.appendChild(a); a.click(); a.remove();
    });
  });

  drawCurves();
  pick(null);
  setIndex(refRow);

  // Print: a still copy of the figures and readout at the reference theta.
  var explorer = document.querySelector('.explorer'), readout = document.getElementById('readout');
  [explorer, readout].forEach(function (node) {
    var copy = node.cloneNode(true);
    Array.prototype.forEach.call(copy.querySelectorAll('[id]'), function (n) { n.removeAttribute('id'); });
    copy.removeAttribute('id');
    copy.classList.add('print-only');
    node.classList.add('screen-only');
    node.parentNode.insertBefore(copy, node.nextSibling);
  });

  window.barrowReport = { setIndex: setIndex, index: function () { return current; }, referenceIndex: refRow,
                          familyAt: familyAt, cloudCsv: cloudCsv, sweepCsv: sweepCsv, ready: true,
                          readyAt: performance.now() };
})();
)JS";
}

}  // namespace barrow
