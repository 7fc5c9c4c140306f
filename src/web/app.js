// lapwright preview page: builds the form from GET /v1/params, asks GET /v1/tracks/{seed} for the
// track (JSON) and its drawing (format=svg) as values change, and keeps the request in the
// address bar. It talks only to the service that served it; no framework, no network beyond it.

/** Wait after the last change before asking the service, ms. */
const DEBOUNCE_MS = 250;

// short labels and groups of the parameters; a parameter the service adds later lands in "More"
const LABELS = {
  lengthM: 'Lap length',
  curvatureBudgetDeg: 'Turning budget',
  turnBalance: 'Right-hand share',
  cornerCount: 'Corners',
  minCornerRadiusM: 'Tightest radius',
  noise: 'Noise',
  'widthM.min': 'Road width, narrowest',
  'widthM.max': 'Road width, widest',
  'wall.heightM': 'Wall height',
  'wall.thicknessM': 'Wall thickness',
  clearanceM: 'Clearance',
  'gateSpacingM.min': 'Gate gap, in bends',
  'gateSpacingM.max': 'Gate gap, on straights',
  spawnSlots: 'Start poses',
  'car.lengthM': 'Car length',
  'car.widthM': 'Car width',
};
const GROUPS = [
  { title: 'Shape', names: ['lengthM', 'curvatureBudgetDeg', 'turnBalance', 'cornerCount', 'minCornerRadiusM', 'noise'] },
  { title: 'Road and walls', names: ['widthM.min', 'widthM.max', 'wall.heightM', 'wall.thicknessM', 'clearanceM'] },
  { title: 'Gates and start', names: ['gateSpacingM.min', 'gateSpacingM.max', 'spawnSlots', 'car.lengthM', 'car.widthM'] },
];
const UNIT_TEXT = { m: 'm', deg: '°' };

const $ = (id) => document.getElementById(id);
const number = new Intl.NumberFormat('en', { maximumFractionDigits: 1 });
const state = { params: [], timer: 0, pending: false, controller: null, generation: 0, imageUrl: '', retryTimer: 0 };

start().catch((err) => {
  showProblem({ title: 'The page could not start', message: `${err && err.message ? err.message : err}. Is the lapwright service running? Reload the page to try again.` });
  setBusy(false);
});

async function start() {
  const [paramsDoc, presets, health] = await Promise.all([getJson('/v1/params'), getJson('/v1/presets'), getJson('/healthz')]);
  $('service').textContent = `lapwright ${health.version} · generator ${health.generatorVersion}`;
  state.params = paramsDoc.parameters;
  buildFields(paramsDoc);
  buildPresets(presets.presets);
  restoreFromUrl();
  $('request-form').addEventListener('input', (event) => {
    if (event.target.id === 'preset') return;
    // a value of its own means the request is no longer the preset (the seed and drawing are not part of one)
    if (event.target.closest('#param-groups')) $('preset').value = '';
    schedule();
  });
  $('new-seed').addEventListener('click', () => {
    $('seed').value = String(drawSeed());
    schedule(0);
  });
  $('preset').addEventListener('change', () => applyPreset(presets.presets));
  $('reset').addEventListener('click', () => {
    for (const p of state.params) fieldInput(p.name).value = '';
    $('preset').value = '';
    schedule(0);
  });
  $('copy-link').addEventListener('click', copyLink);
  $('request-form').addEventListener('submit', (event) => event.preventDefault());
  schedule(0);
}

async function getJson(url) {
  const res = await fetch(url, { headers: { accept: 'application/json' } });
  if (!res.ok) throw new Error(`${url} answered ${res.status}`);
  return res.json();
}

// one fieldset per group, one labelled input per parameter with its unit, range and default
function buildFields(doc) {
  const known = new Set(GROUPS.flatMap((g) => g.names));
  const groups = [...GROUPS, { title: 'More', names: doc.parameters.map((p) => p.name).filter((n) => !known.has(n)) }];
  const byName = new Map(doc.parameters.map((p) => [p.name, p]));
  const host = $('param-groups');
  for (const group of groups) {
    const params = group.names.map((n) => byName.get(n)).filter(Boolean);
    if (params.length === 0) continue;
    const fieldset = el('fieldset', { class: 'group' }, [el('legend', {}, [group.title])]);
    for (const p of params) fieldset.append(buildField(p));
    host.append(fieldset);
  }
  $('seed-help').textContent = `An integer 0 to ${doc.seed.integerMax}, or any text of 1 to ${doc.seed.stringMaxChars} characters. Same seed and values, same track.`;
}

function buildField(p) {
  const id = fieldId(p.name);
  const unit = p.unit ? UNIT_TEXT[p.unit] ?? p.unit : '';
  const withUnit = (value) => (unit === '' ? String(value) : unit === '°' ? `${value}°` : `${value} ${unit}`);
  const dflt = p.default === null ? p.defaultText : withUnit(p.default);
  const describedBy = `${id}-range ${id}-meaning ${id}-error`;
  let input;
  let allowed;
  if (p.type === 'choice') {
    // an empty choice means the default, like an empty number field
    input = el('select', { id, name: p.name, 'aria-describedby': describedBy }, [el('option', { value: '' }, [`(default: ${dflt})`]), ...p.values.map((v) => el('option', { value: v }, [v]))]);
    allowed = `one of ${p.values.join(', ')}`;
  } else if (p.type === 'text') {
    input = el('input', { id, name: p.name, type: 'text', spellcheck: 'false', placeholder: String(p.default ?? ''), 'aria-describedby': describedBy });
    allowed = 'text';
  } else {
    input = el('input', {
      id,
      name: p.name,
      type: 'number',
      inputmode: 'decimal',
      min: String(p.min),
      max: String(p.max),
      step: stepOf(p),
      placeholder: p.default === null ? 'derived' : String(p.default),
      'aria-describedby': describedBy,
    });
    allowed = `${p.type === 'integer' ? 'whole number, ' : ''}${p.min}–${withUnit(p.max)}`;
  }
  return el('div', { class: 'field param', 'data-param': p.name }, [
    el('label', { for: id }, LABELS[p.name] ? [LABELS[p.name], ' ', el('code', {}, [p.name])] : [el('code', {}, [p.name])]),
    el('div', { class: 'with-unit' }, [input, el('span', { class: 'unit', 'aria-hidden': 'true' }, [unit])]),
    el('p', { class: 'help', id: `${id}-range` }, [`${allowed} · default ${dflt}`]),
    el('p', { class: 'meaning', id: `${id}-meaning` }, [p.meaning]),
    el('p', { class: 'field-error', id: `${id}-error`, hidden: '' }, []),
  ]);
}

// arrow keys move by a step that suits the range
function stepOf(p) {
  if (p.type === 'integer') return '1';
  const span = p.max - p.min;
  if (span <= 1) return '0.05';
  if (span <= 20) return '0.1';
  return '1';
}

function buildPresets(presets) {
  for (const preset of presets) $('preset').append(el('option', { value: preset.name }, [`${preset.name}: ${preset.description}`]));
}

function applyPreset(presets) {
  const preset = presets.find((p) => p.name === $('preset').value);
  if (!preset) return;
  for (const p of state.params) {
    const value = readDotted(preset.params, p.name);
    fieldInput(p.name).value = value === undefined ? '' : String(value);
  }
  schedule(0);
}

function readDotted(object, name) {
  return name.split('.').reduce((node, key) => (node && typeof node === 'object' ? node[key] : undefined), object);
}

function restoreFromUrl() {
  const query = new URLSearchParams(location.search);
  for (const p of state.params) if (query.has(p.name)) fieldInput(p.name).value = query.get(p.name);
  $('seed').value = query.get('seed') ?? String(drawSeed());
  $('heat').checked = query.get('heat') === 'true';
}

function drawSeed() {
  // any unsigned 32-bit integer is a valid seed
  return crypto.getRandomValues(new Uint32Array(1))[0];
}

// the preview is busy from the first change until the answer to the last one is shown
function schedule(delay = DEBOUNCE_MS) {
  clearTimeout(state.timer);
  clearTimeout(state.retryTimer);
  state.pending = true;
  setBusy(true);
  state.timer = setTimeout(refresh, delay);
}

// what the form asks for: the seed, the parameters that have a value (as typed), the drawing option
function readRequest() {
  const params = new URLSearchParams();
  const bad = [];
  for (const p of state.params) {
    const input = fieldInput(p.name);
    if (input.validity.badInput) bad.push({ path: p.name, message: 'not a number' });
    else if (input.value.trim() !== '') params.set(p.name, input.value.trim());
  }
  return { seed: $('seed').value.trim(), params, heat: $('heat').checked, bad };
}

function trackUrl(request, format, extra = {}) {
  const query = new URLSearchParams(request.params);
  if (format !== undefined) query.set('format', format);
  for (const [key, value] of Object.entries(extra)) query.set(key, value);
  const text = query.toString();
  return `/v1/tracks/${encodeURIComponent(request.seed)}${text ? `?${text}` : ''}`;
}

async function refresh() {
  state.pending = false;
  const request = readRequest();
  updateShareUrl(request);
  clearFieldErrors();
  state.controller?.abort();
  const generation = ++state.generation;
  if (request.seed === '' || request.bad.length > 0) {
    showIssues(request.seed === '' ? [{ path: 'seed', message: 'a seed is needed: type one, or press New seed' }] : request.bad);
    return setBusy(false);
  }
  const controller = new AbortController();
  state.controller = controller;
  $('status').textContent = 'Generating…';
  try {
    const svgExtra = request.heat ? { heat: 'true' } : {};
    const [jsonRes, svgRes] = await Promise.all([
      fetch(trackUrl(request), { headers: { accept: 'application/json' }, signal: controller.signal }),
      fetch(trackUrl(request, 'svg', svgExtra), { signal: controller.signal }),
    ]);
    if (generation !== state.generation) return;
    if (!jsonRes.ok) return await showErrorAnswer(jsonRes);
    if (!svgRes.ok) return await showErrorAnswer(svgRes);
    const [track, svg] = await Promise.all([jsonRes.json(), svgRes.blob()]);
    if (generation !== state.generation) return;
    await showTrack(request, track, svg, generation);
  } catch (err) {
    if (err && err.name === 'AbortError') return;
    showProblem({ title: 'The service did not answer', message: 'Check that the lapwright service is still running, then change a value to try again.' });
  } finally {
    if (generation === state.generation && !state.pending) setBusy(false);
  }
}

function setBusy(busy) {
  $('preview').setAttribute('aria-busy', busy ? 'true' : 'false');
}

// the drawing is decoded before anything changes, so the figures never run ahead of the picture
async function showTrack(request, track, svg, generation) {
  const m = track.metrics;
  const image = $('preview-image');
  const url = URL.createObjectURL(svg);
  const next = new Image();
  next.src = url;
  await next.decode().catch(() => undefined);
  if (generation !== state.generation) return URL.revokeObjectURL(url);
  if (state.imageUrl) URL.revokeObjectURL(state.imageUrl);
  state.imageUrl = url;
  image.src = url;
  image.alt = `Drawing of track ${track.id.slice(0, 8)}: ${number.format(m.lengthM)} m, ${m.cornerCount} corners, seen from above with the start line and direction of travel.`;
  image.hidden = false;
  $('problem').hidden = true;
  const figure = $('preview');
  figure.dataset.state = 'ready';
  figure.dataset.trackId = track.id;
  $('status').textContent = `Track ${track.id.slice(0, 8)} · seed ${track.seed} · ${number.format(m.lengthM)} m · ${m.cornerCount} corners`;
  $('facts-empty').hidden = true;
  $('corners-section').hidden = false;
  showMetrics(track);
  showCorners(track.corners);
  setDownloads(request);
}

function showMetrics(track) {
  const m = track.metrics;
  const left = track.corners.filter((c) => c.direction === 'left').length;
  const rows = [
    ['lengthM', 'Length', `${number.format(m.lengthM)} m`],
    ['cornerCount', 'Corners', `${m.cornerCount} (${left} left, ${m.cornerCount - left} right)`],
    ['totalTurningDeg', 'Total turning', `${number.format(m.totalTurningDeg)}°`],
    ['netTurningDeg', 'Net turning', `${m.netTurningDeg > 0 ? '+' : ''}${number.format(m.netTurningDeg)}° (${m.netTurningDeg > 0 ? 'counter-clockwise' : 'clockwise'})`],
    ['rightCornerShare', 'Right-hand corners', `${Math.round(m.rightCornerShare * 100)} %`],
    ['minRadiusM', 'Tightest radius', `${number.format(m.minRadiusM)} m`],
    ['width', 'Road width', `${number.format(m.width.min)}–${number.format(m.width.max)} m`],
    ['minClearanceM', 'Closest wall gap', `${number.format(m.minClearanceM)} m`],
    ['gateCount', 'Gates', String(m.gateCount)],
    ['spawns', 'Start poses', String(track.spawns.length)],
    ['difficulty', 'Difficulty', `${number.format(m.difficulty)} of 10`],
    ['attempts', 'Layouts tried', String(track.attempts)],
    ['id', 'Id', track.id.slice(0, 12)],
    ['generatorVersion', 'Generator', track.generatorVersion],
  ];
  const list = $('metrics');
  list.replaceChildren();
  for (const [key, term, value] of rows) {
    const dd = el('dd', { id: `metric-${key}` }, [value]);
    if (key === 'id') dd.title = track.id;
    list.append(el('div', { class: 'metric' }, [el('dt', {}, [term]), dd]));
  }
}

function showCorners(corners) {
  const body = $('corners').tBodies[0];
  body.replaceChildren();
  corners.forEach((c, i) => {
    const turn = c.direction === 'left' ? '↰ left' : '↱ right';
    body.append(
      el('tr', { class: c.direction }, [
        el('td', {}, [String(i + 1)]),
        el('td', {}, [turn]),
        el('td', {}, [`${number.format(c.angleDeg)}°`]),
        el('td', {}, [`${number.format(c.minRadiusM)} m`]),
        el('td', {}, [`${Math.round(c.sStart)}–${Math.round(c.sEnd)}`]),
      ]),
    );
  });
}

function setDownloads(request) {
  for (const link of document.querySelectorAll('.downloads a')) {
    const extra = {};
    if (link.dataset.table) extra.table = link.dataset.table;
    if (link.dataset.format === 'svg' && request.heat) extra.heat = 'true';
    link.href = trackUrl(request, link.dataset.format, extra);
    link.removeAttribute('aria-disabled');
  }
}

function disableDownloads() {
  for (const link of document.querySelectorAll('.downloads a')) {
    link.removeAttribute('href');
    link.setAttribute('aria-disabled', 'true');
  }
}

// an error answer of the service: { statusCode, code, message, reason?, hint?, issues? }
async function showErrorAnswer(res) {
  const body = await res.json().catch(() => null);
  if (body === null) return showProblem({ title: `The service answered ${res.status}`, message: 'Change a value to try again.' });
  if (res.status === 400) return showIssues(body.issues ?? [], body);
  if (res.status === 422) {
    return showProblem({
      title: body.code === 'ERR_DEADLINE_EXCEEDED' ? 'This request takes too long' : 'No track meets these values',
      message: body.message,
      hint: body.hint,
      issues: (body.issues ?? []).slice(0, 5).map((i) => i.message),
      code: [body.code, body.reason].filter(Boolean).join(' · '),
    });
  }
  if (res.status === 503) {
    const wait = Number(res.headers.get('retry-after') ?? '1');
    state.retryTimer = setTimeout(refresh, Math.max(1, wait) * 1000);
    return showProblem({ title: 'The service is busy', message: `${body.message} Trying again in ${Math.max(1, wait)} s.`, code: body.code });
  }
  return showProblem({ title: `The service answered ${res.status}`, message: body.message, code: body.code });
}

// malformed values: each next to its field, and all of them in the preview's place
function showIssues(issues, body) {
  for (const issue of issues) {
    for (const name of fieldsOf(issue.path)) {
      const error = $(name === 'seed' ? 'seed-error' : `${fieldId(name)}-error`);
      error.textContent = issue.message;
      error.hidden = false;
      (name === 'seed' ? $('seed') : fieldInput(name)).setAttribute('aria-invalid', 'true');
    }
  }
  showProblem({
    title: 'Some values are not accepted',
    message: 'Change the values marked in the form; each says what is allowed.',
    issues: issues.map((i) => `${i.path}: ${i.message}`),
    code: body?.code,
  });
}

// the fields an issue's path names: itself, or every field under it (widthM → widthM.min, widthM.max)
function fieldsOf(path) {
  if (path === 'seed') return ['seed'];
  const names = state.params.map((p) => p.name);
  if (names.includes(path)) return [path];
  return names.filter((n) => n.startsWith(`${path}.`));
}

function clearFieldErrors() {
  for (const error of document.querySelectorAll('.field-error')) {
    error.textContent = '';
    error.hidden = true;
  }
  for (const input of document.querySelectorAll('[aria-invalid]')) input.removeAttribute('aria-invalid');
}

function showProblem({ title, message, hint, issues = [], code }) {
  const figure = $('preview');
  figure.dataset.state = 'problem';
  delete figure.dataset.trackId;
  $('preview-image').hidden = true;
  $('problem-title').textContent = title;
  $('problem-message').textContent = message ?? '';
  $('problem-hint').hidden = !hint;
  $('problem-hint').textContent = hint ? `What to change: ${hint}` : '';
  $('problem-issues').replaceChildren(...issues.map((text) => el('li', {}, [text])));
  $('problem-code').textContent = code ?? '';
  $('problem').hidden = false;
  $('status').textContent = title;
  $('metrics').replaceChildren();
  $('corners').tBodies[0].replaceChildren();
  $('facts-empty').hidden = false;
  $('corners-section').hidden = true;
  disableDownloads();
}

// the address bar holds the request, so the page's URL is the link to share
function updateShareUrl(request) {
  const query = new URLSearchParams();
  if (request.seed !== '') query.set('seed', request.seed);
  for (const [key, value] of request.params) query.set(key, value);
  if (request.heat) query.set('heat', 'true');
  const url = `${location.pathname}?${query.toString()}`;
  history.replaceState(null, '', url);
  $('share-url').value = location.href;
}

async function copyLink() {
  const field = $('share-url');
  try {
    await navigator.clipboard.writeText(field.value);
    $('status').textContent = 'Link copied.';
  } catch {
    field.select();
    $('status').textContent = 'Link selected: copy it with your keyboard.';
  }
}

function fieldId(name) {
  return `param-${name.replace(/\./g, '-')}`;
}

function fieldInput(name) {
  return $(fieldId(name));
}

function el(tag, attributes, children = []) {
  const node = document.createElement(tag);
  for (const [key, value] of Object.entries(attributes)) node.setAttribute(key, value);
  node.append(...children);
  return node;
}
