/*
 * Tallyvane location page charts (uPlot, served from the application's own WebJar).
 * Reads the numbers from the element's data-src (JSON), draws them, and keeps the chart usable
 * from the keyboard: focus the chart, then Left/Right move the read-out, Home/End jump to the ends.
 * The page carries the same numbers as tables for screen readers and without JavaScript.
 */
(function () {
    'use strict';

    var forecastEl = document.getElementById('forecast-chart');
    var accuracyEl = document.getElementById('accuracy-chart');
    var horizonEl = document.getElementById('horizon-chart');
    if (!forecastEl && !accuracyEl && !horizonEl || typeof uPlot === 'undefined') {
        return;
    }
    var src = (forecastEl || accuracyEl || horizonEl).getAttribute('data-src');
    var lang = document.documentElement.lang || navigator.language;
    // the words come from the page (its message bundle), so the charts speak the reader's language
    var words = {};
    document.querySelectorAll('#chart-words [data-k]').forEach(function (el) {
        words[el.getAttribute('data-k')] = el.textContent;
    });
    function w(k, fallback) { return words[k] || fallback; }
    var dayFormat;
    try {
        dayFormat = new Intl.DateTimeFormat(lang, {dateStyle: 'medium', timeZone: 'UTC'});
    } catch (e) {
        dayFormat = null;
    }
    function day(u, ts) {
        return ts == null ? '–' : dayFormat ? dayFormat.format(new Date(ts * 1e3)) : new Date(ts * 1e3).toISOString().slice(0, 10);
    }
    var ink = '#1d2430', accent = '#1f5f8b', fittedColour = '#7a8595', earlierColour = '#a3271f',
        calendarColour = '#8a5a00';

    function money(currency) {
        var f;
        try {
            f = new Intl.NumberFormat(navigator.language || lang, {style: 'currency', currency: currency, maximumFractionDigits: 0});
        } catch (e) {
            f = new Intl.NumberFormat(navigator.language || lang, {maximumFractionDigits: 0});
        }
        return function (u, v) { return v == null ? '–' : f.format(v); };
    }

    function percent(u, v) { return v == null ? '–' : v.toFixed(1) + '%'; }

    function width(el) { return Math.max(280, el.clientWidth || 600); }

    function utc(ts) { return uPlot.tzDate(new Date(ts * 1e3), 'Etc/UTC'); }

    /** Left/Right/Home/End move the cursor read-out across the points. */
    function keyboard(el, u) {
        var idx = -1;
        el.addEventListener('keydown', function (ev) {
            var n = u.data[0].length;
            if (!n) { return; }
            if (ev.key === 'ArrowRight') { idx = Math.min(n - 1, idx + 1); }
            else if (ev.key === 'ArrowLeft') { idx = Math.max(0, idx < 0 ? n - 1 : idx - 1); }
            else if (ev.key === 'Home') { idx = 0; }
            else if (ev.key === 'End') { idx = n - 1; }
            else { return; }
            ev.preventDefault();
            u.setCursor({left: u.valToPos(u.data[0][idx], 'x'), top: u.bbox.height / devicePixelRatio / 2});
        });
    }

    function resizeWith(el, u, height) {
        window.addEventListener('resize', function () { u.setSize({width: width(el), height: height}); });
    }

    /** A phone-sized chart: fewer pixels per period, so it opens on the recent periods and the forecast. */
    function narrow(el) { return width(el) < 640; }

    /** Axis labels: compact amounts (12K) where space is short. */
    function axisMoney(currency, compact) {
        var f;
        try {
            f = new Intl.NumberFormat(navigator.language || lang, compact
                ? {style: 'currency', currency: currency, notation: 'compact', maximumFractionDigits: 1}
                : {style: 'currency', currency: currency, maximumFractionDigits: 0});
        } catch (e) {
            f = new Intl.NumberFormat(navigator.language || lang, {maximumFractionDigits: 0});
        }
        return function (u, ticks) { return ticks.map(function (t) { return f.format(t); }); };
    }

    function drawForecast(c) {
        var fmt = money(c.currency);
        var small = narrow(forecastEl);
        var height = small ? 280 : 340;
        var line = function (label, colour, w, dash) {
            return {label: label, stroke: colour, width: w, dash: dash, value: fmt, spanGaps: false,
                points: {show: c.x.length < 120}};
        };
        var bound = function (label) {
            return {label: label, stroke: 'rgba(31,95,139,0.35)', width: 1, value: fmt, points: {show: false}};
        };
        var opts = {
            width: width(forecastEl), height: height, tzDate: utc,
            series: [
                {label: w('period', 'Period'), value: day},
                line(w('actual', 'Actual'), ink, 2),
                line(w('fitted', 'Fitted'), fittedColour, 1.5, [4, 3]),
                line(w('earlier', 'Earlier forecast'), earlierColour, 1.5, [2, 2]),
                line(w('forecast', 'Forecast'), accent, 2.5),
                bound(w('lo80', '80% low')), bound(w('hi80', '80% high')), bound(w('lo95', '95% low')), bound(w('hi95', '95% high')),
                // periods holding events, holidays or closed days: a marker on the line, named in the read-out
                {label: w('calendar', 'Calendar'), stroke: calendarColour, width: 0, paths: function () { return null; },
                    points: {show: true, size: 11, width: 2, stroke: calendarColour, fill: '#f6d98b'},
                    value: function (u, v, si, idx) { return idx == null || !c.calendar[idx] ? '–' : c.calendar[idx]; }}
            ],
            bands: [
                {series: [8, 7], fill: 'rgba(31,95,139,0.10)'},
                {series: [6, 5], fill: 'rgba(31,95,139,0.22)'}
            ],
            axes: [{}, {values: axisMoney(c.currency, small), size: small ? 56 : 80}]
        };
        var marks = c.x.map(function (t, i) {
            if (!c.calendar || !c.calendar[i]) { return null; }
            var v = c.actual[i] != null ? c.actual[i] : c.forecast[i] != null ? c.forecast[i] : c.fitted[i];
            return v == null ? 0 : v;
        });
        var data = [c.x, c.actual, c.fitted, c.earlier, c.forecast, c.lo80, c.hi80, c.lo95, c.hi95, marks];
        var u = new uPlot(opts, data, forecastEl);
        u.setSeries(3, {show: false});
        keyboard(forecastEl, u);
        resizeWith(forecastEl, u, height);
        // the forecast's part: from a little before the first forecast period (twice the periods ahead, at
        // least 8) to the end; on a phone the chart opens on it, the whole history one tap away
        var first = c.forecast.findIndex(function (v) { return v != null; });
        var ahead = first < 0 ? 0 : c.x.length - first;
        var from = first < 0 ? 0 : Math.max(0, first - Math.max(8, 2 * ahead));
        var history = document.getElementById('show-history');
        function view(all) {
            var start = all ? 0 : from;
            u.setScale('x', {min: c.x[start], max: c.x[c.x.length - 1]});
            forecastEl.setAttribute('data-view', all ? 'all' : 'recent');
            forecastEl.setAttribute('data-x-from', String(start));
        }
        if (history) {
            history.checked = !small;
            history.addEventListener('change', function () { view(history.checked); });
        }
        view(!small || from === 0);
        var fitted = document.getElementById('show-fitted');
        var earlier = document.getElementById('show-earlier');
        if (fitted) { fitted.addEventListener('change', function () { u.setSeries(2, {show: fitted.checked}); }); }
        if (earlier) { earlier.addEventListener('change', function () { u.setSeries(3, {show: earlier.checked}); }); }
        forecastEl.setAttribute('data-points', String(c.x.length));
        forecastEl.setAttribute('data-marks', String(marks.filter(function (m) { return m != null; }).length));
        forecastEl.setAttribute('data-ready', 'true');
    }

    function drawAccuracy(a) {
        var opts = {
            width: width(accuracyEl), height: 200, tzDate: utc,
            series: [
                {label: w('period', 'Period'), value: day},
                {label: w('mapeRolling', 'MAPE (rolling)'), stroke: accent, width: 2, value: percent}
            ],
            axes: [{}, {values: function (u, ticks) { return ticks.map(function (t) { return t + '%'; }); }}]
        };
        var u = new uPlot(opts, [a.x, a.mape], accuracyEl);
        keyboard(accuracyEl, u);
        resizeWith(accuracyEl, u, 200);
        accuracyEl.setAttribute('data-points', String(a.x.length));
        accuracyEl.setAttribute('data-ready', 'true');
    }

    /** Accuracy by how far ahead the forecast was made: MAPE and the share inside the 80% range, per step. */
    function drawHorizon(rows) {
        var num = function (v) { return typeof v === 'number' && isFinite(v) ? v : null; };
        var steps = rows.map(function (r) { return r.step; });
        var opts = {
            width: width(horizonEl), height: 200,
            scales: {x: {time: false}},
            series: [
                {label: w('ahead', 'Periods ahead'), value: function (u, v) { return v == null ? '–' : String(v); }},
                {label: 'MAPE', stroke: accent, width: 2, value: percent},
                {label: w('inside80', 'Inside 80% range'), stroke: fittedColour, width: 1.5, dash: [4, 3], value: percent}
            ],
            axes: [{values: function (u, ticks) { return ticks.map(function (t) { return Number.isInteger(t) ? t : ''; }); }},
                {values: function (u, ticks) { return ticks.map(function (t) { return t + '%'; }); }}]
        };
        var u = new uPlot(opts, [steps, rows.map(function (r) { return num(r.mape); }),
            rows.map(function (r) { return num(r.coverage80); })], horizonEl);
        keyboard(horizonEl, u);
        resizeWith(horizonEl, u, 200);
        horizonEl.setAttribute('data-points', String(steps.length));
        horizonEl.setAttribute('data-ready', 'true');
    }

    fetch(src, {credentials: 'same-origin', headers: {'Accept': 'application/json'}})
        .then(function (r) {
            if (!r.ok) { throw new Error('HTTP ' + r.status); }
            return r.json();
        })
        .then(function (d) {
            if (forecastEl && d.forecast) { drawForecast(d.forecast); }
            if (accuracyEl && d.accuracy && d.accuracy.x.length) { drawAccuracy(d.accuracy); }
            if (horizonEl && d.accuracy && d.accuracy.byHorizon.length) { drawHorizon(d.accuracy.byHorizon); }
        })
        .catch(function (e) {
            [forecastEl, accuracyEl, horizonEl].forEach(function (el) {
                if (el) {
                    el.textContent = w('failed', 'The chart could not be loaded ({0}); the table below has the numbers.').replace('{0}', e.message);
                    el.setAttribute('data-ready', 'error');
                }
            });
        });
}());
