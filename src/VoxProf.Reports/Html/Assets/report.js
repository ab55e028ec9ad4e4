// VoxProf report pages: sortable tables, image switches and the per-pixel readout. Plain script, inlined; it loads
// nothing (the page's Content-Security-Policy forbids it) and decodes the embedded pixel data itself.
(() => {
  'use strict';
  const $ = (selector, root = document) => root.querySelector(selector);
  const $$ = (selector, root = document) => Array.from(root.querySelectorAll(selector));

  // Sortable tables: a header button sorts by the cells' data-v (numbers) or text; empty values sort last.
  const sortKey = (cell) => {
    if (cell.dataset.v === undefined) return cell.textContent.trim();
    return cell.dataset.v === '' ? null : Number(cell.dataset.v);
  };
  const order = (a, b, ascending) => {
    if (a === null || b === null) return a === null ? (b === null ? 0 : 1) : -1;
    const c = typeof a === 'number' && typeof b === 'number' ? a - b : String(a).localeCompare(String(b));
    return ascending ? c : -c;
  };
  for (const table of $$('table.sortable')) {
    const heads = $$('thead th', table);
    heads.forEach((th, column) => {
      const button = $('button', th);
      if (!button) return;
      button.addEventListener('click', () => {
        const ascending = th.getAttribute('aria-sort') !== 'ascending';
        heads.forEach((h) => h.removeAttribute('aria-sort'));
        th.setAttribute('aria-sort', ascending ? 'ascending' : 'descending');
        const body = table.tBodies[0];
        const rows = Array.from(body.rows);
        rows.sort((a, b) => order(sortKey(a.cells[column]), sortKey(b.cells[column]), ascending));
        rows.forEach((row) => body.appendChild(row));
      });
    });
  }

  // Image switches: each radio group names an image attribute (data-strategy, data-map); the first image whose
  // attributes all match, or are "*", is shown.
  const viewers = $$('figure.viewer');
  for (const viewer of viewers) {
    const section = viewer.closest('section');
    const radios = $$('input[type=radio]', section);
    const caption = $('figcaption', viewer);
    const empty = $('.viewer-empty', viewer);
    const update = () => {
      const state = {};
      for (const r of radios) if (r.checked) state[r.name] = r.value;
      let shown = null;
      for (const img of $$('img', viewer)) {
        const match = Object.keys(state).every((k) => img.dataset[k] === undefined || img.dataset[k] === '*' || img.dataset[k] === state[k]);
        img.hidden = !match || shown !== null;
        if (!img.hidden) shown = img;
      }
      empty.hidden = shown !== null;
      caption.textContent = shown ? shown.dataset.caption : '';
      viewer.dispatchEvent(new CustomEvent('vp-switch', { detail: state }));
    };
    radios.forEach((r) => r.addEventListener('change', update));
    update();
  }

  // Per-pixel readout (report.html only): planes of zigzag-delta varints, deflated, base64 (docs/reports.md).
  const dataElement = $('#vp-data');
  const readout = $('#readout');
  if (!dataElement || !readout || viewers.length === 0) return;
  const data = JSON.parse(dataElement.textContent);
  const pixels = data.width * data.height;

  const inflate = async (base64) => {
    const text = atob(base64.trim());
    const bytes = new Uint8Array(text.length);
    for (let i = 0; i < text.length; i++) bytes[i] = text.charCodeAt(i);
    const stream = new Blob([bytes]).stream().pipeThrough(new DecompressionStream('deflate'));
    return new Uint8Array(await new Response(stream).arrayBuffer());
  };
  const unpack = (bytes, count) => {
    const planes = [];
    let p = 0;
    for (let c = 0; c < count; c++) {
      const plane = new Int32Array(pixels);
      let previous = 0;
      for (let i = 0; i < pixels; i++) {
        let zigzag = 0, shift = 0, b;
        do { b = bytes[p++]; zigzag |= (b & 127) << shift; shift += 7; } while (b & 128);
        previous = (previous + ((zigzag >>> 1) ^ -(zigzag & 1))) | 0;
        plane[i] = previous;
      }
      planes.push(plane);
    }
    return planes;
  };
  const blobs = new Map();
  const planesOf = (entry) => {
    if (!blobs.has(entry.blob)) {
      const count = data.counters.length + (entry.hits === entry.blob ? data.hitPlanes.length : 0);
      blobs.set(entry.blob, inflate($('#' + entry.blob).textContent).then((bytes) => unpack(bytes, count)));
    }
    return blobs.get(entry.blob);
  };
  // Hit planes stored as differences from the first strategy's get those added back (wrapping, as written).
  const hitCache = new Map();
  const hitsOf = (id) => {
    if (!hitCache.has(id)) {
      const entry = data.strategies.find((s) => s.blob === id);
      hitCache.set(id, planesOf(entry).then(async (planes) => {
        const own = planes.slice(data.counters.length);
        if (!entry.hitsRelativeTo) return own;
        const base = await hitsOf(entry.hitsRelativeTo);
        return own.map((plane, p) => plane.map((d, i) => (d + base[p][i]) | 0));
      }));
    }
    return hitCache.get(id);
  };
  const strategyData = async (name) => {
    const entry = data.strategies.find((s) => s.name === name);
    const counters = (await planesOf(entry)).slice(0, data.counters.length);
    const hits = await hitsOf(entry.hits);
    return { counters, hits, t: new Float32Array(hits[6].buffer) };
  };

  const field = (id) => $('#' + id, readout);
  const counterCells = data.counters.map((name) => $(`dd[data-counter="${name}"]`, readout));
  let strategy = null;
  let decoded = null;
  let last = null;
  let pinned = false;

  const show = (x, y) => {
    last = [x, y];
    field('ro-pixel').textContent = `${x}, ${y}`;
    field('ro-strategy').textContent = strategy;
    if (!decoded || decoded.name !== strategy) {
      field('ro-voxel').textContent = 'decoding…';
      return;
    }
    const i = y * data.width + x;
    const [hit, face, material, vx, vy, vz] = decoded.value.hits.map((plane) => plane[i]);
    field('ro-voxel').textContent = hit ? `${vx}, ${vy}, ${vz}` : 'miss';
    field('ro-face').textContent = hit ? data.faces[face] : '–';
    field('ro-t').textContent = hit ? decoded.value.t[i].toFixed(3) : '–';
    field('ro-material').textContent = hit ? String(material) : '–';
    counterCells.forEach((cell, c) => { cell.textContent = String(decoded.value.counters[c][i] >>> 0); });
  };

  const select = async (name) => {
    strategy = name;
    readout.dataset.ready = '';
    const value = await strategyData(name);
    if (strategy !== name) return;
    decoded = { name, value };
    readout.dataset.ready = name;
    if (last) show(last[0], last[1]);
  };

  const viewer = viewers[0];
  const actual = $('#actual-size');
  if (actual) actual.addEventListener('change', () => viewer.classList.toggle('actual', actual.checked));
  viewer.addEventListener('vp-switch', (e) => { if (e.detail.strategy && e.detail.strategy !== strategy) select(e.detail.strategy); });
  const pixelAt = (img, event) => {
    const box = img.getBoundingClientRect();
    const px = Math.floor((event.clientX - box.left) / box.width * img.naturalWidth) - Number(img.dataset.x0 || 0);
    const py = Math.floor((event.clientY - box.top) / box.height * img.naturalHeight) - Number(img.dataset.y0 || 0);
    return px >= 0 && py >= 0 && px < data.width && py < data.height ? [px, py] : null;
  };
  viewer.addEventListener('mousemove', (event) => {
    if (pinned || event.target.tagName !== 'IMG') return;
    const at = pixelAt(event.target, event);
    if (at) show(at[0], at[1]);
  });
  viewer.addEventListener('click', (event) => {
    if (event.target.tagName !== 'IMG') return;
    const at = pixelAt(event.target, event);
    pinned = at !== null && !pinned;
    readout.classList.toggle('pinned', pinned);
    if (at) show(at[0], at[1]);
  });
  const checked = $('input[name=strategy]:checked', viewer.closest('section'));
  select(checked ? checked.value : data.strategies[0].name).catch((error) => {
    readout.dataset.ready = 'error';
    field('ro-voxel').textContent = `pixel data unreadable: ${error.message}`;
  });
})();
