// compass-debrief report page script: draws the charts and the compass card from the inline JSON.
// Plain modern JavaScript, no build step, no network. Text from the log is only ever set with
// textContent (never innerHTML) and never passed to Plotly labels (Plotly renders its labels as markup).
(function () {
  'use strict';
  performance.mark('script-start');

  /** Okabe & Ito (2008) colour-universal-design palette. */
  var OI = {
    black: '#000000', orange: '#E69F00', sky: '#56B4E9', green: '#009E73',
    yellow: '#F0E442', blue: '#0072B2', vermillion: '#D55E00', purple: '#CC79A7',
  };
  var DEG = Math.PI / 180;
  var NUMERALS = { 0: 'N', 30: '3', 60: '6', 90: 'E', 120: '12', 150: '15', 180: 'S', 210: '21', 240: '24', 270: 'W', 300: '30', 330: '33' };
  var CARD = { cx: 280, radius: 262, maxDelta: 70, top: 26 };

  var data = JSON.parse(document.getElementById('report-data').textContent);
  var S = data.series;
  var n = S.n;
  var tMs = S.tS.map(function (t) { return t === null ? null : (S.t0Utc + t) * 1000; });

  // ---- small helpers -------------------------------------------------------------------------
  function wrap180(d) { var w = ((d % 360) + 360) % 360; return w > 180 ? w - 360 : w; }
  function hdg(d) {
    if (d === null || !isFinite(d)) return '–';
    var r = ((Math.round(d) % 360) + 360) % 360;
    return ('00' + r).slice(-3) + '°';
  }
  function signed(d, dec) {
    if (d === null || !isFinite(d)) return '–';
    var s = Math.abs(d).toFixed(dec);
    if (Number(s) === 0) return s + '°';
    return (d > 0 ? '+' : '\u2212') + s + '°';
  }
  function bankText(d) {
    if (d === null || !isFinite(d)) return '–';
    var r = Math.round(Math.abs(d));
    return r === 0 ? '0° (wings level)' : r + '° ' + (d > 0 ? 'right' : 'left');
  }
  /** hh:mm:ssZ, rounded to the second like the printed tables. */
  function utc(ms) { return ms === null || !isFinite(ms) ? '–' : new Date(Math.round(ms / 1000) * 1000).toISOString().slice(11, 19) + 'Z'; }
  /** A date-axis value from Plotly ("2026-05-04 10:21:00.5", read as UTC like the data) in ms. */
  function axisMs(v) { return typeof v === 'number' ? v : Date.parse(String(v).replace(' ', 'T') + 'Z'); }
  function elapsed(s) {
    if (s === null) return '';
    var t = Math.round(s), h = Math.floor(t / 3600), m = Math.floor((t % 3600) / 60), sec = t % 60;
    return '+' + (h > 0 ? h + ':' + ('0' + m).slice(-2) : m) + ':' + ('0' + sec).slice(-2) + ' into the log';
  }
  function numText(v, dec, unit) { return v === null || !isFinite(v) ? '–' : v.toFixed(dec) + unit; }
  function setText(id, text) { document.getElementById(id).textContent = text; }

  /** Index of the drawn point nearest to a time [ms] (binary search; tMs is non-decreasing). */
  function nearestIndex(ms) {
    var lo = 0, hi = n - 1;
    while (hi - lo > 1) {
      var mid = (lo + hi) >> 1;
      if ((tMs[mid] === null ? -Infinity : tMs[mid]) < ms) lo = mid; else hi = mid;
    }
    return Math.abs(tMs[lo] - ms) <= Math.abs(tMs[hi] - ms) ? lo : hi;
  }

  /**
   * x/y arrays for a line: a null is put between segments (log gaps) and, for directions, where the
   * value wraps across 360/0, so Plotly breaks the line instead of drawing a vertical stroke.
   */
  function lineXY(values, isDirection) {
    var x = [], y = [], idx = [];
    for (var i = 0; i < n; i++) {
      if (i > 0 && (S.seg[i] !== S.seg[i - 1] ||
          (isDirection && values[i] !== null && values[i - 1] !== null && Math.abs(values[i] - values[i - 1]) > 180))) {
        x.push(tMs[i]); y.push(null); idx.push(i);
      }
      x.push(tMs[i]); y.push(values[i]); idx.push(i);
    }
    return { x: x, y: y, customdata: idx };
  }

  var CONFIG = {
    displaylogo: false,
    responsive: true,
    typesetMath: false,
    showSendToCloud: false,
    showTips: false,
    plotlyServerURL: '',
    topojsonURL: 'data:,',
    scrollZoom: false,
    modeBarButtonsToRemove: ['select2d', 'lasso2d', 'autoScale2d', 'toggleSpikelines', 'hoverClosestCartesian', 'hoverCompareCartesian'],
    toImageButtonOptions: { format: 'png', scale: 2, filename: String(data.imageName || 'compass-debrief').replace(/[^A-Za-z0-9_-]+/g, '_').slice(0, 60) },
  };
  var FONT = { family: 'system-ui, -apple-system, Segoe UI, Roboto, Noto Sans, Liberation Sans, Arial, sans-serif', size: 12, color: '#1c1f24' };

  // ---- plan view -----------------------------------------------------------------------------
  /** Diverging scale, blue (reads low) – warm grey (agrees) – vermillion (reads high), from Okabe–Ito ends. */
  var ERROR_SCALE = [[0, OI.blue], [0.25, '#5f9cc8'], [0.5, '#b9b4a8'], [0.75, '#e38a4f'], [1, OI.vermillion]];
  var BINS = 11;
  function scaleColour(f) {
    for (var k = 1; k < ERROR_SCALE.length; k++) {
      if (f <= ERROR_SCALE[k][0]) {
        var a = ERROR_SCALE[k - 1], b = ERROR_SCALE[k], u = (f - a[0]) / (b[0] - a[0]);
        var ca = parseInt(a[1].slice(1), 16), cb = parseInt(b[1].slice(1), 16), out = [];
        for (var sh = 16; sh >= 0; sh -= 8) out.push(Math.round(((ca >> sh) & 255) * (1 - u) + ((cb >> sh) & 255) * u));
        return 'rgb(' + out.join(',') + ')';
      }
    }
    return ERROR_SCALE[ERROR_SCALE.length - 1][1];
  }

  /**
   * The track as BINS line traces, one per band of compass error (a polyline per run of consecutive
   * samples in the same band), so a long flight is a few SVG paths instead of thousands of markers.
   * Hover still works on every vertex.
   */
  function planFigure() {
    var E = data.errorScaleDeg;
    function bin(e) { return e === null ? -1 : Math.max(0, Math.min(BINS - 1, Math.floor(((e + E) / (2 * E)) * BINS))); }
    var bands = [];
    for (var k = 0; k < BINS; k++) bands.push({ x: [], y: [], text: [], customdata: [] });
    var prevBand = -2;
    for (var i = 0; i < n - 1; i++) {
      var a = S.errorDeg[i], b = S.errorDeg[i + 1];
      var band = S.seg[i] !== S.seg[i + 1] || a === null || b === null ? -1 : bin((a + b) / 2);
      if (band !== prevBand && prevBand >= 0) { var pb = bands[prevBand]; pb.x.push(null); pb.y.push(null); pb.text.push(null); pb.customdata.push(null); }
      if (band >= 0) {
        var B = bands[band];
        if (band !== prevBand) pushVertex(B, i);
        pushVertex(B, i + 1);
      }
      prevBand = band;
    }
    function pushVertex(B, j) {
      B.x.push(S.eastNm[j]); B.y.push(S.northNm[j]); B.customdata.push(j);
      B.text.push(utc(tMs[j]) + ' · error ' + signed(S.errorDeg[j], 1) + '<br>compass ' + hdg(S.compassDeg[j]) + ' · magnetic ' + hdg(S.headingMagDeg[j]));
    }
    var traces = [];
    // Divergence windows: a wide translucent band under the track, and a ringed label at each peak.
    var bandX = [], bandY = [], peakX = [], peakY = [], peakLabel = [];
    data.divergences.forEach(function (d) {
      var i0 = nearestIndex(d.startUtc * 1000), i1 = nearestIndex(d.endUtc * 1000), ip = nearestIndex(d.peakUtc * 1000);
      for (var i = i0; i <= i1; i++) { bandX.push(S.eastNm[i]); bandY.push(S.northNm[i]); }
      bandX.push(null); bandY.push(null);
      peakX.push(S.eastNm[ip]); peakY.push(S.northNm[ip]); peakLabel.push(d.showLabel ? d.label : '');
    });
    traces.push({ type: 'scatter', mode: 'lines', x: bandX, y: bandY, name: 'Divergence window', line: { color: 'rgba(0,0,0,0.17)', width: 15 }, hoverinfo: 'skip' });
    // Legs flown on the compass: where the heading the pilot believed would have taken the aircraft.
    var bx = [], by = [];
    data.excursions.forEach(function (x) {
      if (x.believedEastNm.length === 0) return;
      bx = bx.concat(x.believedEastNm, [null]); by = by.concat(x.believedNorthNm, [null]);
    });
    if (bx.length > 0) {
      traces.push({ type: 'scatter', mode: 'lines', x: bx, y: by, name: 'Track the compass heading promised', line: { color: OI.black, width: 2, dash: 'dash' }, hoverinfo: 'skip' });
    }
    bands.forEach(function (B, k) {
      traces.push({ type: 'scatter', mode: 'lines', x: B.x, y: B.y, text: B.text, customdata: B.customdata, showlegend: false,
        name: 'error band ' + k, line: { color: scaleColour((k + 0.5) / BINS), width: 4.5 }, hovertemplate: '%{text}<extra></extra>' });
    });
    // Carrier of the colour bar only (no visible points).
    traces.push({ type: 'scatter', mode: 'markers', x: [null], y: [null], showlegend: false, hoverinfo: 'skip',
      marker: { color: [0], cmin: -E, cmax: E, colorscale: ERROR_SCALE, showscale: true,
        colorbar: { title: { text: 'compass error', side: 'right' }, thickness: 14, len: 0.85,
          tickvals: [-E, -E / 2, 0, E / 2, E], ticktext: ['−' + E + '° or less (reads low)', '−' + E / 2 + '°', '0°', '+' + E / 2 + '°', '+' + E + '° or more (reads high)'] } } });
    traces.push({ type: 'scatter', mode: 'markers+text', x: peakX, y: peakY, text: peakLabel, textposition: 'top right', name: 'Window peak',
      marker: { symbol: 'x-thin', size: 9, color: OI.black, line: { width: 1.5, color: OI.black } }, textfont: { size: 13, color: OI.black }, hoverinfo: 'skip', showlegend: false });
    traces.push({ type: 'scatter', mode: 'markers+text', x: [S.eastNm[0], S.eastNm[n - 1]], y: [S.northNm[0], S.northNm[n - 1]], text: ['start', 'end'],
      textposition: ['bottom center', 'top center'], marker: { symbol: ['triangle-up', 'square'], size: 12, color: OI.black }, hoverinfo: 'skip', showlegend: false });
    var layout = {
      font: FONT, margin: { l: 60, r: 20, t: 16, b: 50 }, paper_bgcolor: '#ffffff', plot_bgcolor: '#ffffff',
      xaxis: { title: { text: 'NM east of the first fix' }, zeroline: false, gridcolor: '#ebe8df', constrain: 'domain' },
      yaxis: { title: { text: 'NM north of the first fix' }, zeroline: false, gridcolor: '#ebe8df', scaleanchor: 'x', scaleratio: 1 },
      legend: { orientation: 'h', x: 0, y: 1.0, yanchor: 'bottom', bgcolor: 'rgba(255,255,255,0.8)' },
      hovermode: 'closest', dragmode: 'zoom',
      // shapes[0]: the moment shown on the card, a fixed-size diamond at the aircraft's position
      shapes: [momentShape(0)],
    };
    return { traces: traces, layout: layout };
  }
  function momentShape(i) {
    return { type: 'path', xref: 'x', yref: 'y', xsizemode: 'pixel', ysizemode: 'pixel', xanchor: S.eastNm[i], yanchor: S.northNm[i],
      path: 'M 0 -10 L 9 0 L 0 10 L -9 0 Z', fillcolor: OI.black, line: { color: '#ffffff', width: 2 } };
  }

  // ---- timeline ------------------------------------------------------------------------------
  /**
   * The 95 % band (±2σ) of the simulated reading from the heading's uncertainty: one closed polygon per run
   * of points without a segment break or a wrap through north (upper edge forward, lower edge back).
   */
  function compassBandXY() {
    var x = [], y = [];
    var start = 0;
    function flush(end) {
      var k, any = false;
      for (k = start; k < end; k++) if (S.compassDeg[k] !== null && S.compassSigmaDeg[k] !== null) { any = true; break; }
      if (!any) return;
      for (k = start; k < end; k++) {
        if (S.compassDeg[k] === null || S.compassSigmaDeg[k] === null) continue;
        x.push(tMs[k]); y.push(S.compassDeg[k] + 2 * S.compassSigmaDeg[k]);
      }
      for (k = end - 1; k >= start; k--) {
        if (S.compassDeg[k] === null || S.compassSigmaDeg[k] === null) continue;
        x.push(tMs[k]); y.push(S.compassDeg[k] - 2 * S.compassSigmaDeg[k]);
      }
      x.push(null); y.push(null);
    }
    for (var i = 1; i <= n; i++) {
      var brk = i === n || S.seg[i] !== S.seg[i - 1] ||
        (S.compassDeg[i] !== null && S.compassDeg[i - 1] !== null && Math.abs(S.compassDeg[i] - S.compassDeg[i - 1]) > 180);
      if (brk) { flush(i); start = i; }
    }
    return { x: x, y: y };
  }

  function timelineFigure() {
    function tr(values, isDir, props) {
      var xy = lineXY(values, isDir);
      var t = { type: 'scatter', mode: 'lines', x: xy.x, y: xy.y, customdata: xy.customdata };
      for (var k in props) t[k] = props[k];
      return t;
    }
    var hdgHover = '%{y:03.0f}°';
    var band = compassBandXY();
    var traces = [
      { type: 'scatter', mode: 'lines', x: band.x, y: band.y, fill: 'toself', fillcolor: 'rgba(213,94,0,0.13)', line: { width: 0 },
        name: 'Compass, 95 % band (heading uncertainty)', hoverinfo: 'skip' },
      tr(S.trackTrueDeg, true, { name: 'True track', line: { color: OI.black, width: 1.2, dash: 'dot' }, hovertemplate: hdgHover }),
      tr(S.headingTrueDeg, true, { name: 'True heading', line: { color: OI.sky, width: 1.6, dash: 'dash' }, hovertemplate: hdgHover }),
      tr(S.headingMagDeg, true, { name: 'Magnetic heading', line: { color: OI.blue, width: 2.6 }, hovertemplate: hdgHover }),
      tr(S.compassStaticDeg, true, { name: 'Compass, settled', line: { color: OI.orange, width: 1.6, dash: 'dashdot' }, hovertemplate: hdgHover }),
      tr(S.compassDeg, true, { name: 'Compass, as shown', line: { color: OI.vermillion, width: 2.6, dash: 'longdash' }, hovertemplate: hdgHover }),
      tr(S.errorDeg, false, { name: 'Compass error', yaxis: 'y2', line: { color: OI.black, width: 1.4 }, fill: 'tozeroy', fillcolor: 'rgba(213,94,0,0.14)', hovertemplate: '%{y:+.1f}°', showlegend: false }),
      tr(S.bankDeg, false, { name: 'Bank', yaxis: 'y3', line: { color: OI.purple, width: 1.6 }, hovertemplate: '%{y:+.0f}°', showlegend: false }),
      tr(S.accelLongKtS, false, { name: 'Fore-aft accel.', yaxis: 'y4', line: { color: OI.green, width: 1.5 }, hovertemplate: '%{y:+.2f} kt/s', showlegend: false }),
    ];
    var shapes = [{ type: 'line', xref: 'x', yref: 'paper', x0: tMs[0], x1: tMs[0], y0: 0, y1: 1, line: { color: OI.black, width: 1.5, dash: 'dot' } }];
    var annotations = [];
    data.divergences.forEach(function (d) {
      shapes.push({ type: 'rect', xref: 'x', yref: 'paper', x0: d.startUtc * 1000, x1: d.endUtc * 1000, y0: 0, y1: 1,
        fillcolor: 'rgba(230,159,0,0.17)', line: { width: 0 }, layer: 'below' });
      if (d.showLabel) annotations.push({ xref: 'x', yref: 'paper', x: d.peakUtc * 1000, y: 1, yanchor: 'top', text: d.label, showarrow: false,
        font: { size: 11, color: '#6b4a00' }, bgcolor: 'rgba(255,255,255,0.85)' });
    });
    // Turn and speed-change labels (T1…, S1…) on the bank and acceleration panels, as in the tables.
    function eventLabels(list, yref, colour) {
      if (list.length > 60) return;
      list.forEach(function (ev) {
        annotations.push({ xref: 'x', yref: yref, x: (ev.startUtc + ev.endUtc) * 500, y: 1, yanchor: 'bottom', text: ev.label, showarrow: false,
          font: { size: 10, color: colour } });
      });
    }
    eventLabels(data.turns, 'y3 domain', '#7a3d63');
    eventLabels(data.episodes, 'y4 domain', '#00644a');
    data.unreliableSpans.forEach(function (u) {
      shapes.push({ type: 'rect', xref: 'x', yref: 'y2 domain', x0: u.t0Utc * 1000, x1: Math.max(u.t1Utc * 1000, u.t0Utc * 1000 + 500), y0: 0, y1: 1,
        fillcolor: 'rgba(60,60,60,0.14)', line: { width: 0 }, layer: 'below' });
    });
    function panel(title, domain, extra) {
      var a = { domain: domain, anchor: 'x', title: { text: title, standoff: 6 }, gridcolor: '#ebe8df', zeroline: true, zerolinecolor: '#9a9a9a', fixedrange: false };
      for (var k in extra) a[k] = extra[k];
      return a;
    }
    var layout = {
      font: FONT, margin: { l: 70, r: 20, t: 40, b: 46 }, paper_bgcolor: '#ffffff', plot_bgcolor: '#ffffff',
      hovermode: 'x unified', dragmode: 'zoom', showlegend: true,
      legend: { orientation: 'h', x: 0, y: 1.01, yanchor: 'bottom', font: { size: 12 } },
      xaxis: { type: 'date', anchor: 'y4', title: { text: 'time (UTC)' }, hoverformat: '%H:%M:%S', tickformat: '%H:%M', gridcolor: '#ebe8df',
        showspikes: true, spikemode: 'across', spikethickness: 1, spikecolor: '#555', spikedash: 'solid' },
      yaxis: panel('heading', [0.5, 1], { range: [0, 360], tickvals: [0, 45, 90, 135, 180, 225, 270, 315, 360],
        ticktext: ['N', '045', 'E', '135', 'S', '225', 'W', '315', 'N'], zeroline: false }),
      yaxis2: panel('error °', [0.34, 0.47], {}),
      yaxis3: panel('bank °<br>(R +)', [0.17, 0.31], {}),
      yaxis4: panel('accel.<br>kt/s', [0, 0.14], {}),
      shapes: shapes, annotations: annotations,
    };
    return { traces: traces, layout: layout };
  }

  // ---- compass card --------------------------------------------------------------------------
  var svg = document.getElementById('card-svg');
  var SVG_NS = svg.namespaceURI;
  var strip = document.getElementById('card-strip');
  var magMark = document.getElementById('card-mag-mark');
  function el(name, attrs, text) {
    var e = document.createElementNS(SVG_NS, name);
    for (var k in attrs) e.setAttribute(k, String(attrs[k]));
    if (text !== undefined) e.textContent = text;
    return e;
  }
  function clear(node) { while (node.firstChild) node.removeChild(node.firstChild); }

  /**
   * Draws the float card seen edge-on: graduations every 5°, numerals every 30°, projected from a drum
   * (x = cx − R·sin Δ, Δ = graduation − reading). The minus sign is the classic float card's reversed
   * scale: a graduation larger than the reading lies to the left of the lubber line.
   */
  function drawCard(reading, mag, unreliable) {
    clear(strip); clear(magMark);
    var flag = document.getElementById('card-flag');
    if (reading === null) { flag.textContent = 'no reading here'; strip.setAttribute('data-reading', ''); return; }
    for (var d = 0; d < 360; d += 5) {
      var delta = wrap180(d - reading);
      if (Math.abs(delta) > CARD.maxDelta + 8) continue;
      var x = CARD.cx - CARD.radius * Math.sin(delta * DEG);
      var c = Math.max(0.05, Math.cos(delta * DEG));
      var len = d % 30 === 0 ? 30 : d % 10 === 0 ? 21 : 12;
      strip.appendChild(el('line', { x1: x.toFixed(2), y1: CARD.top, x2: x.toFixed(2), y2: CARD.top + len, class: 'tick',
        'stroke-width': ((d % 10 === 0 ? 2.6 : 1.5) * c).toFixed(2), opacity: (0.3 + 0.7 * c).toFixed(2) }));
      if (d % 30 === 0) {
        strip.appendChild(el('text', { x: 0, y: 0, class: 'numeral' + (d % 90 === 0 ? ' cardinal' : ''), 'text-anchor': 'middle',
          transform: 'translate(' + x.toFixed(2) + ' 104) scale(' + c.toFixed(3) + ' 1)', opacity: (0.3 + 0.7 * c).toFixed(2) }, NUMERALS[d]));
      }
    }
    strip.appendChild(el('line', { x1: 40, y1: 118, x2: 520, y2: 118, stroke: '#1c1c1c', 'stroke-width': 1, opacity: 0.35 }));
    strip.setAttribute('data-reading', reading.toFixed(1));
    if (mag !== null) {
      var dm = wrap180(mag - reading);
      if (Math.abs(dm) <= CARD.maxDelta) {
        var xm = CARD.cx - CARD.radius * Math.sin(dm * DEG);
        magMark.appendChild(el('path', { d: 'M' + xm.toFixed(1) + ' 146 l -9 14 h 18 z', fill: OI.blue, stroke: '#ffffff', 'stroke-width': 1.5 }));
        magMark.appendChild(el('text', { x: xm.toFixed(1), y: 174, 'text-anchor': 'middle', class: 'mag-label' }, 'magnetic ' + hdg(mag)));
      } else {
        var left = dm > 0;
        magMark.appendChild(el('text', { x: left ? 48 : 512, y: 170, 'text-anchor': left ? 'start' : 'end', class: 'mag-label' },
          (left ? '◀ ' : '') + 'magnetic ' + hdg(mag) + ' is off the window' + (left ? '' : ' ▶')));
      }
    }
    flag.textContent = unreliable ? 'reading unreliable here (card on its stop or without directive force)' : '';
    document.getElementById('card-unreliable').setAttribute('visibility', unreliable ? 'visible' : 'hidden');
  }

  /** What the aircraft was doing at drawn point i, in a few words, from bank and fore-and-aft acceleration. */
  function doing(i) {
    var b = S.bankDeg[i], a = S.accelLongKtS[i], parts = [];
    if (b !== null && Math.abs(b) >= 5) parts.push('Turning ' + (b > 0 ? 'right' : 'left') + ' at ' + Math.round(Math.abs(b)) + '° of bank');
    else parts.push('Wings level');
    if (a !== null && Math.abs(a) >= 0.5) parts.push((a > 0 ? 'gaining' : 'losing') + ' speed at ' + Math.abs(a).toFixed(1) + ' kt/s');
    var text = parts.join(', ') + '.';
    if (S.unreliable[i] === 1) text += ' The reading is not to be trusted here.';
    return text;
  }

  function showReadout(i) {
    setText('ro-time', utc(tMs[i]));
    setText('ro-elapsed', elapsed(S.tS[i]));
    setText('ro-compass', hdg(S.compassDeg[i]));
    setText('ro-mag', hdg(S.headingMagDeg[i]));
    var e = S.errorDeg[i];
    setText('ro-error', e === null ? '–' : signed(e, 0));
    setText('ro-error-words', e === null ? '' : Math.abs(e) < 0.5 ? 'card agrees' : e > 0 ? 'card reads high' : 'card reads low');
    setText('ro-doing', doing(i));
    setText('ro-static', hdg(S.compassStaticDeg[i]));
    setText('ro-bank', bankText(S.bankDeg[i]));
    setText('ro-gs', numText(S.gsKt[i], 0, ' kt'));
    setText('ro-alt', numText(S.altFt[i], 0, ' ft'));
  }

  // ---- the moment shown: slider, hover, table rows ------------------------------------------
  var slider = document.getElementById('moment-slider');
  slider.max = String(Math.max(0, n - 1));
  var planDiv = document.getElementById('plan-plot');
  var tlDiv = document.getElementById('timeline-plot');
  var plan = null, timelineDrawn = false, current = 0, pending = null, pendingSource = '';
  // After a jump from a table row the page scrolls the charts under a pointer that has not moved; the
  // browser's synthetic hover must not replace the chosen moment, so hover waits for a real movement.
  var hoverLocked = false;
  function unlockOnRealMove(ev) { if (ev.movementX !== 0 || ev.movementY !== 0) hoverLocked = false; }
  planDiv.addEventListener('pointermove', unlockOnRealMove);
  tlDiv.addEventListener('pointermove', unlockOnRealMove);

  function applyMoment(i, source) {
    current = i;
    drawCard(S.compassDeg[i], S.headingMagDeg[i], S.unreliable[i] === 1);
    showReadout(i);
    if (source !== 'slider') slider.value = String(i);
    if (source === 'init') return;
    if (plan !== null) Plotly.relayout(planDiv, { 'shapes[0].xanchor': S.eastNm[i], 'shapes[0].yanchor': S.northNm[i] });
    if (timelineDrawn && source !== 'timeline') Plotly.relayout(tlDiv, { 'shapes[0].x0': tMs[i], 'shapes[0].x1': tMs[i] });
  }
  /** Moves the moment to drawn point i; repeated calls within one frame are merged. */
  function setMoment(i, source) {
    i = Math.max(0, Math.min(n - 1, i | 0));
    if (pending === null) {
      requestAnimationFrame(function () { var k = pending, s = pendingSource; pending = null; applyMoment(k, s); });
    }
    pending = i; pendingSource = source;
  }

  slider.addEventListener('input', function () { setMoment(Number(slider.value), 'slider'); });
  document.getElementById('step-back').addEventListener('click', function () { setMoment(current - 1, 'button'); });
  document.getElementById('step-fwd').addEventListener('click', function () { setMoment(current + 1, 'button'); });

  var playTimer = null;
  var playBtn = document.getElementById('play');
  function stopPlay() { if (playTimer !== null) { clearInterval(playTimer); playTimer = null; playBtn.setAttribute('aria-pressed', 'false'); playBtn.textContent = 'Play ×10'; } }
  playBtn.addEventListener('click', function () {
    if (playTimer !== null) { stopPlay(); return; }
    playBtn.setAttribute('aria-pressed', 'true'); playBtn.textContent = 'Pause';
    playTimer = setInterval(function () {
      if (current >= n - 1) { stopPlay(); return; }
      var target = tMs[current] + 1000; // 1 s of flight per 100 ms of wall time: ten times real time
      var k = current + 1;
      while (k < n - 1 && tMs[k] < target) k++;
      setMoment(k, 'play');
    }, 100);
  });

  function zoomTimeline(t0ms, t1ms) {
    if (!timelineDrawn) return;
    var pad = Math.max(20000, 0.3 * (t1ms - t0ms));
    Plotly.relayout(tlDiv, { 'xaxis.range': [t0ms - pad, t1ms + pad] });
  }
  document.getElementById('zoom-all').addEventListener('click', function () {
    if (timelineDrawn) Plotly.relayout(tlDiv, { 'xaxis.autorange': true });
  });

  Array.prototype.forEach.call(document.querySelectorAll('tr.jump'), function (row) {
    function go() {
      var t = Number(row.getAttribute('data-t'));
      if (!isFinite(t) || row.getAttribute('data-t') === '') return;
      Array.prototype.forEach.call(document.querySelectorAll('tr.jump.current'), function (r) { r.classList.remove('current'); });
      row.classList.add('current');
      stopPlay();
      hoverLocked = true;
      setMoment(nearestIndex(t * 1000), 'table');
      var t0 = Number(row.getAttribute('data-t0')), t1 = Number(row.getAttribute('data-t1'));
      if (isFinite(t0) && isFinite(t1) && row.getAttribute('data-t0') !== '') zoomTimeline(t0 * 1000, t1 * 1000);
      document.getElementById('s-timeline').scrollIntoView({ block: 'start' });
    }
    row.addEventListener('click', go);
    row.addEventListener('keydown', function (ev) { if (ev.key === 'Enter' || ev.key === ' ') { ev.preventDefault(); go(); } });
  });

  // ---- draw ----------------------------------------------------------------------------------
  function fail(err) {
    var p = document.createElement('p');
    p.className = 'noscript';
    p.textContent = 'The charts could not be drawn: ' + (err && err.message ? err.message : String(err)) + '. The tables are complete.';
    document.querySelector('main').insertBefore(p, document.querySelector('main').firstChild);
    throw err;
  }
  if (typeof Plotly === 'undefined' || n === 0) {
    drawCard(null, null, false);
    if (n === 0) { window.__reportReady = performance.now(); return; }
    fail(new Error('the chart library did not load'));
  }
  /** The first hovered point that carries a sample row (bands and markers carry none). */
  function firstRowPoint(ev) {
    var pts = (ev && ev.points) || [];
    for (var k = 0; k < pts.length; k++) if (typeof pts[k].customdata === 'number') return pts[k];
    return null;
  }
  performance.mark('before-figures');
  var pf = planFigure();
  var tf = timelineFigure();
  applyMoment(0, 'init');
  Promise.all([
    Plotly.newPlot(planDiv, pf.traces, pf.layout, CONFIG).then(function () {
      plan = pf; performance.mark('plan-drawn');
      planDiv.on('plotly_hover', function (ev) {
        var p = firstRowPoint(ev);
        if (p && typeof p.customdata === 'number' && !hoverLocked) { stopPlay(); setMoment(p.customdata, 'plan'); }
      });
    }),
    Plotly.newPlot(tlDiv, tf.traces, tf.layout, CONFIG).then(function () {
      timelineDrawn = true; performance.mark('timeline-drawn');
      tlDiv.on('plotly_hover', function (ev) {
        var p = firstRowPoint(ev);
        if (p && typeof p.customdata === 'number' && !hoverLocked) { stopPlay(); setMoment(p.customdata, 'timeline'); }
      });
      tlDiv.on('plotly_relayout', function () {
        var r = tlDiv.layout.xaxis.range;
        setText('zoom-state', tlDiv.layout.xaxis.autorange ? '' : 'showing ' + utc(axisMs(r[0])) + ' to ' + utc(axisMs(r[1])));
      });
    }),
  ]).then(function () {
    if (current !== 0) applyMoment(current, 'late');
    // Ready once the frame holding the charts has been painted (the timeout runs after that paint).
    requestAnimationFrame(function () {
      setTimeout(function () {
        window.__reportReady = performance.now();
        document.body.setAttribute('data-ready', '1');
      }, 0);
    });
  }, fail);

  // Print: fix the charts to the printed column's width (A4 and Letter both fit 700 CSS px), then restore.
  window.addEventListener('beforeprint', function () {
    if (plan !== null) Plotly.relayout(planDiv, { width: 700, height: 640 });
    if (timelineDrawn) Plotly.relayout(tlDiv, { width: 700, height: 900 });
  });
  window.addEventListener('afterprint', function () {
    if (plan !== null) Plotly.relayout(planDiv, { width: null, height: null, autosize: true });
    if (timelineDrawn) Plotly.relayout(tlDiv, { width: null, height: null, autosize: true });
  });
})();
