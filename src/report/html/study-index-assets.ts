// The study index's inline style and script (study-index.ts). The script reads the inline JSON, draws one page of
// rows, sorts on a heading click (numbers as numbers, empty cells last either way) and filters to the recordings that
// need a look. Plain DOM, no library, no request.

import { COLOURS } from './palette';

export const STUDY_CSS = `
:root { color-scheme: light; }
body { font: 12px/1.35 system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, sans-serif; color: #1b1b1b; margin: 16px; }
h1 { font-size: 18px; margin: 0; color: ${COLOURS.line}; }
.muted { color: #5f6b73; }
.caution { border: 1px solid ${COLOURS.caution}; background: #fff8e1; padding: 4px 6px; margin: 6px 0; }
table { border-collapse: collapse; }
th, td { border-bottom: 1px solid #e3e7ea; padding: 2px 6px; text-align: left; vertical-align: middle; }
th { cursor: pointer; background: #f3f5f7; position: sticky; top: 0; user-select: none; }
th[aria-sort="ascending"]::after { content: " ▲"; }
th[aria-sort="descending"]::after { content: " ▼"; }
td.n { text-align: right; font-variant-numeric: tabular-nums; }
td.thumb { padding: 1px 4px; }
td.thumb svg { display: block; }
tr.look td:first-child { border-left: 3px solid ${COLOURS.flagged}; }
.look-reasons { color: ${COLOURS.flagged}; }
.failed { color: ${COLOURS.paco2}; }
`;

export const STUDY_SCRIPT = `
(function () {
  var data = JSON.parse(document.getElementById('study-data').textContent);
  var cols = data.columns, rows = data.rows, per = data.per_page;
  var state = { key: null, dir: 1, look: false, page: 0 };
  var head = document.querySelector('#study thead tr'), body = document.querySelector('#study tbody');
  function empty(v) { return v === null || v === undefined || v === '' || (v.length === 0 && typeof v === 'object'); }
  function sortValue(r, k) {
    var v = r[k];
    if (k === 'cautions' || k === 'look') return v.length;
    if (k === 'thumb') return r.breaths_ok;
    return v;
  }
  function compare(a, b) {
    var x = sortValue(a, state.key), y = sortValue(b, state.key);
    if (empty(x) && empty(y)) return 0;
    if (empty(x)) return 1;
    if (empty(y)) return -1;
    if (typeof x === 'number' && typeof y === 'number') return state.dir * (x - y);
    x = String(x); y = String(y);
    return state.dir * (x < y ? -1 : x > y ? 1 : 0);
  }
  function shown() {
    var list = rows.filter(function (r) { return !state.look || r.look.length > 0; });
    if (state.key !== null) {
      var idx = list.map(function (r, i) { return [r, i]; });
      idx.sort(function (p, q) { return compare(p[0], q[0]) || p[1] - q[1]; });
      list = idx.map(function (p) { return p[0]; });
    }
    return list;
  }
  function number(v, d) { return empty(v) ? '\\u2014' : String(Number(v.toFixed(d))); }
  function cell(r, c) {
    var td = document.createElement('td'), v = r[c.key];
    td.setAttribute('data-key', c.key);
    if (c.key === 'recording') {
      if (r.report) { var a = document.createElement('a'); a.href = r.report; a.textContent = r.recording; td.appendChild(a); }
      else td.textContent = r.recording;
      if (r.error) { var e = document.createElement('div'); e.className = 'failed'; e.textContent = r.error; td.appendChild(e); }
    } else if (c.key === 'thumb') {
      td.className = 'thumb';
      if (r.thumb) td.innerHTML = r.thumb;
    } else if (c.key === 'duration_s') {
      td.className = 'n'; td.textContent = empty(v) ? '\\u2014' : number(v / 60, 1);
    } else if (c.key === 'breaths_excluded') {
      td.className = 'n'; td.textContent = empty(v) ? '\\u2014' : v + (r.excluded_share === null ? '' : ' (' + Math.round(100 * r.excluded_share) + ' %)');
    } else if (c.key === 'delay_s') {
      td.className = 'n';
      td.textContent = empty(v) ? '\\u2014' : number(v, 2) + (r.delay_uncertainty_s === null ? '' : ' \\u00b1' + number(r.delay_uncertainty_s, 3)) +
        ' (' + r.delay_origin + (r.delay_trusted === false ? ', untrusted' : '') + ')';
    } else if (c.key === 'cautions') {
      td.textContent = v.map(function (x) { return x.code + (x.breaths === null ? ' (recording)' : ' (' + x.breaths + ')'); }).join(', ');
      td.title = v.map(function (x) { return x.message; }).join('\\n');
    } else if (c.key === 'look') {
      td.className = 'look-reasons'; td.textContent = v.join('; ');
    } else if (c.decimals !== null) {
      td.className = 'n'; td.textContent = number(v, c.decimals);
    } else td.textContent = empty(v) ? '' : String(v);
    return td;
  }
  function render() {
    var list = shown(), pages = Math.max(1, Math.ceil(list.length / per));
    if (state.page >= pages) state.page = pages - 1;
    var from = state.page * per, part = list.slice(from, from + per);
    body.textContent = '';
    part.forEach(function (r) {
      var tr = document.createElement('tr');
      tr.setAttribute('data-recording', r.recording);
      if (r.look.length) tr.className = 'look';
      cols.forEach(function (c) { tr.appendChild(cell(r, c)); });
      body.appendChild(tr);
    });
    document.getElementById('shown').textContent = list.length + ' of ' + rows.length + ' recordings shown';
    document.getElementById('pageinfo').textContent = 'page ' + (state.page + 1) + ' of ' + pages;
    document.getElementById('prev').disabled = state.page === 0;
    document.getElementById('next').disabled = state.page >= pages - 1;
    Array.prototype.forEach.call(head.children, function (th) {
      if (th.getAttribute('data-key') === state.key) th.setAttribute('aria-sort', state.dir > 0 ? 'ascending' : 'descending');
      else th.removeAttribute('aria-sort');
    });
  }
  cols.forEach(function (c) {
    var th = document.createElement('th');
    th.textContent = c.label;
    th.setAttribute('data-key', c.key);
    th.addEventListener('click', function () {
      if (state.key === c.key) state.dir = -state.dir; else { state.key = c.key; state.dir = 1; }
      state.page = 0;
      render();
    });
    head.appendChild(th);
  });
  document.getElementById('look').addEventListener('change', function (ev) { state.look = ev.target.checked; state.page = 0; render(); });
  document.getElementById('prev').addEventListener('click', function () { state.page--; render(); });
  document.getElementById('next').addEventListener('click', function () { state.page++; render(); });
  render();
})();
`;
