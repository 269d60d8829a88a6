// Re-fit progress on the overview and a location's page: asks the server every few seconds while a
// re-fit is waiting or running (less often while idle), keeps the words and counters current, and
// loads the page again once a newer forecast was issued and nothing is left to do, so that the user
// sees the new forecast without reloading by hand.
(function () {
    var box = document.querySelector('[data-progress]');
    if (!box || !window.fetch) {
        return;
    }
    var src = box.getAttribute('data-progress');
    var seen = Number(box.getAttribute('data-newest') || 0);
    var zone = box.getAttribute('data-zone');
    var BUSY_MS = 3000;
    var IDLE_MS = 10000;

    // the same form as the page's own: the date as the reader writes dates, the time on the 24-hour clock,
    // the location's zone named
    function when(iso) {
        if (!iso) {
            return '';
        }
        var lang = document.documentElement.lang || navigator.language;
        try {
            var d = new Date(iso);
            var date = new Intl.DateTimeFormat(lang, {dateStyle: 'medium', timeZone: zone || undefined}).format(d);
            var time = new Intl.DateTimeFormat('en-GB', {hour: '2-digit', minute: '2-digit', hourCycle: 'h23',
                timeZone: zone || undefined}).format(d);
            return date + ' ' + time + (zone ? ' ' + zone : '');
        } catch (e) {
            return iso;
        }
    }

    function show(status) {
        box.querySelectorAll('[data-field]').forEach(function (el) {
            var name = el.getAttribute('data-field');
            if (name === 'lastIssuedAt') {
                el.textContent = when(status.lastIssuedAt);
            } else if (status[name] !== undefined) {
                el.textContent = String(status[name]);
            }
        });
        var busy = status.queued > 0 || status.running > 0;
        box.querySelectorAll('[data-when]').forEach(function (el) {
            var w = el.getAttribute('data-when');
            el.hidden = !((w === 'running' && status.running > 0) || (w === 'queued' && status.running === 0
                && status.queued > 0) || (w === 'idle' && !busy && status.lastIssuedAt)
                || (w === 'never' && !busy && !status.lastIssuedAt));
        });
        box.setAttribute('data-state', busy ? 'busy' : 'idle');
        return busy;
    }

    function ask() {
        if (document.hidden) {
            setTimeout(ask, BUSY_MS);
            return;
        }
        fetch(src, {headers: {'Accept': 'application/json'}, credentials: 'same-origin'})
            .then(function (r) {
                if (!r.ok) {
                    throw new Error(String(r.status));
                }
                return r.json();
            })
            .then(function (status) {
                var busy = show(status);
                if (!busy && status.newestForecast > seen) {
                    box.setAttribute('data-state', 'reloading');
                    window.location.reload();
                    return;
                }
                setTimeout(ask, busy ? BUSY_MS : IDLE_MS);
            })
            .catch(function () {
                setTimeout(ask, IDLE_MS);
            });
    }

    setTimeout(ask, box.getAttribute('data-state') === 'busy' ? BUSY_MS : IDLE_MS);
})();
