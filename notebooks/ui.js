// Page furniture shared by the dotspec notebooks: the curve picker (bundled samples, a file
// picker and a drop zone), download buttons, plain tables and message boxes. No analysis
// happens here: the notebooks call the library (lib/core.ts) for that.
import { html } from "htl";

/** Where the chosen curve is kept between the notebooks: this tab's session storage (never sent). */
const REMEMBER_KEY = "dotspec-notebooks-curve";
/** Files larger than this are not remembered between pages (session storage is small). */
const REMEMBER_MAX_BYTES = 2_000_000;

function toBase64(bytes) {
  let text = "";
  for (let i = 0; i < bytes.length; i += 0x8000) text += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(text);
}

function fromBase64(b64) {
  return Uint8Array.from(atob(b64), (c) => c.charCodeAt(0));
}

/** The curve chosen last in this tab, if any: a sample index or a file's name and bytes. */
function remembered() {
  try {
    const saved = JSON.parse(sessionStorage.getItem(REMEMBER_KEY) ?? "null");
    return saved && (typeof saved.sample === "number" || (typeof saved.name === "string" && typeof saved.bytes === "string")) ? saved : null;
  } catch {
    return null;
  }
}

function remember(saved) {
  try {
    sessionStorage.setItem(REMEMBER_KEY, JSON.stringify(saved));
  } catch {
    // Storage full or disabled: the next page starts from the first sample.
  }
}

/**
 * Makes an element a drop zone: files dropped on it go to `take` (a non-empty list), and it is
 * highlighted while something is dragged over it.
 *
 * @param {HTMLElement} zone
 * @param {(files: File[]) => void} take
 */
function onDrop(zone, take) {
  zone.addEventListener("dragover", (event) => {
    event.preventDefault();
    zone.classList.add("dotspec-drop-over");
  });
  zone.addEventListener("dragleave", () => zone.classList.remove("dotspec-drop-over"));
  zone.addEventListener("drop", (event) => {
    event.preventDefault();
    zone.classList.remove("dotspec-drop-over");
    const dropped = event.dataTransfer && event.dataTransfer.files;
    if (dropped && dropped.length) take([...dropped]);
  });
}

/**
 * How a picker shows its value: `show` sets the zone's value and the "Showing:" line; `set` also
 * tells the notebook (an input event, as any Inputs control sends).
 *
 * @param {HTMLElement & {value?: unknown}} zone
 * @param {HTMLElement} status
 * @param {(value: any) => string} describe
 */
function pickerValue(zone, status, describe) {
  const show = (value) => {
    zone.value = value;
    status.textContent = describe(value);
  };
  const set = (value) => {
    show(value);
    zone.dispatchEvent(new Event("input", { bubbles: true }));
  };
  return { show, set };
}

/**
 * A picker for one curve: a bundled sample, a file chosen with the file picker, or a file
 * dropped on the zone. Its value is whichever was chosen last: an object with `name` and
 * `arrayBuffer()` (a bundled sample or a File). Files are read in the page only; the choice is
 * kept in this tab's session storage, so the other notebook opens on the same curve.
 *
 * @param {{name: string, file: {arrayBuffer(): Promise<ArrayBuffer>}}[]} samples - bundled curves
 *   under their own names (a built page renames its files).
 * @param {{label?: string}} [options]
 */
export function curvePicker(samples, { label = "Curve" } = {}) {
  const select = html`<select data-testid="sample-select" aria-label="bundled sample">${samples.map(
    (s, i) => html`<option value=${i}>${s.name}</option>`,
  )}</select>`;
  const file = html`<input type="file" data-testid="file-input" accept=".csv,.tsv,.txt,.dat,text/plain,text/csv" aria-label="open a curve file">`;
  const status = html`<span class="dotspec-picked" data-testid="picked"></span>`;
  const zone = html`<div class="dotspec-drop" data-testid="drop-zone">
    <div><strong>${label}</strong>: a bundled sample ${select} or your own file ${file}</div>
    <div class="dotspec-hint">…or drop a file here. Files are read in this page only; nothing is sent anywhere.</div>
    <div>Showing: ${status}</div>
  </div>`;
  const { show, set } = pickerValue(zone, status, (value) => value.name);
  const sample = (i) => ({ name: samples[i].name, arrayBuffer: () => samples[i].file.arrayBuffer() });
  const chooseFile = (f) => {
    set(f);
    f.arrayBuffer().then((buffer) => {
      if (buffer.byteLength <= REMEMBER_MAX_BYTES) remember({ name: f.name, bytes: toBase64(new Uint8Array(buffer)) });
    }, () => {});
  };
  select.addEventListener("change", () => {
    set(sample(Number(select.value)));
    remember({ sample: Number(select.value) });
  });
  file.addEventListener("change", () => {
    if (file.files && file.files.length) chooseFile(file.files[0]);
  });
  onDrop(zone, (files) => chooseFile(files[0]));
  const saved = remembered();
  if (saved && typeof saved.sample === "number" && saved.sample < samples.length) {
    select.value = String(saved.sample);
    show(sample(saved.sample));
  } else if (saved && typeof saved.name === "string") {
    const bytes = fromBase64(saved.bytes);
    show({ name: saved.name, arrayBuffer: async () => bytes.buffer });
  } else show(sample(0));
  return zone;
}

/**
 * A button that saves text as a file in the browser (no request leaves the page).
 *
 * @param {string} label - the button's text.
 * @param {string} filename - the name offered to the user.
 * @param {string} type - the MIME type.
 * @param {() => string} text - called on click.
 */
export function downloadButton(label, filename, type, text) {
  const button = html`<button type="button" class="dotspec-download">${label}</button>`;
  button.dataset.filename = filename;
  button.addEventListener("click", () => {
    const url = URL.createObjectURL(new Blob([text()], { type }));
    const a = html`<a href=${url} download=${filename} hidden></a>`;
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  });
  return button;
}

/**
 * A plain table.
 *
 * @param {string[]} headers
 * @param {(string|number|Node)[][]} rows
 * @param {{testid?: string, rowData?: (i: number) => Record<string, string>, align?: ("left"|"right")[]}} [options]
 */
export function table(headers, rows, { testid, rowData, align = [] } = {}) {
  const cell = (tag, content, i) => {
    const el = document.createElement(tag);
    el.append(content instanceof Node ? content : String(content));
    if (align[i] === "right") el.style.textAlign = "right";
    return el;
  };
  const t = html`<table class="dotspec-table"><thead><tr>${headers.map((h, i) => cell("th", h, i))}</tr></thead><tbody></tbody></table>`;
  if (testid) t.dataset.testid = testid;
  const body = t.querySelector("tbody");
  rows.forEach((row, r) => {
    const tr = document.createElement("tr");
    for (const [k, v] of Object.entries(rowData ? rowData(r) : {})) tr.dataset[k] = v;
    row.forEach((c, i) => tr.append(cell("td", c, i)));
    body.append(tr);
  });
  return t;
}

/** A one-line problem (a file that cannot be read or analysed), shown in place of results. */
export function problem(text) {
  return html`<div class="dotspec-problem" role="alert" data-testid="problem">${text}</div>`;
}

/** A quiet note. */
export function note(text) {
  return html`<div class="dotspec-note">${text}</div>`;
}

/**
 * SVG markup (from the library's figure code) as an element. When the figure says how its panels
 * map bias to px (its `data-*` axis attributes), a line follows the pointer across the panels and
 * a line of text below reads the bias, the energy after η and whatever `describe(biasV)` adds.
 *
 * @param {string} svgMarkup
 * @param {string} [testid]
 * @param {{describe?: (biasV: number) => string}} [options]
 */
export function figure(svgMarkup, testid, { describe } = {}) {
  const div = html`<div class="dotspec-figure"></div>`;
  if (testid) div.dataset.testid = testid;
  div.innerHTML = svgMarkup;
  const svg = div.querySelector(":scope > svg");
  if (!svg || !svg.hasAttribute("data-bias-range-v")) return div;
  const numbers = (name) => svg.getAttribute(name).split(" ").map(Number);
  const [v0, v1] = numbers("data-bias-range-v");
  const [x0, x1] = numbers("data-plot-x-px");
  const [y0, y1] = numbers("data-panels-y-px");
  const eta = Number(svg.getAttribute("data-eta"));
  const line = document.createElementNS("http://www.w3.org/2000/svg", "line");
  for (const [k, v] of Object.entries({ y1: y0, y2: y1, stroke: "#5c5c60", "stroke-dasharray": "3,3", visibility: "hidden", "pointer-events": "none" })) line.setAttribute(k, String(v));
  svg.append(line);
  const hint = "Point at the figure to read the bias and the energy.";
  const readout = html`<div class="dotspec-note" data-testid="readout">${hint}</div>`;
  div.append(readout);
  svg.addEventListener("pointermove", (event) => {
    const box = svg.getBoundingClientRect();
    const px = ((event.clientX - box.left) * svg.viewBox.baseVal.width) / box.width;
    if (px < x0 || px > x1) return;
    const biasV = v0 + ((px - x0) / (x1 - x0)) * (v1 - v0);
    line.setAttribute("x1", String(px));
    line.setAttribute("x2", String(px));
    line.setAttribute("visibility", "visible");
    const more = describe ? describe(biasV) : "";
    readout.textContent = `bias ${biasV.toFixed(3)} V · energy ${(eta * biasV).toFixed(3)} eV (η = ${eta})${more ? ` · ${more}` : ""}`;
  });
  svg.addEventListener("pointerleave", () => {
    line.setAttribute("visibility", "hidden");
    readout.textContent = hint;
  });
  return div;
}

/** Nothing to show (an empty, invisible element: a cell that has nothing to say stays blank). */
export function nothing() {
  return html`<span hidden></span>`;
}

/** A file as the series picker hands it on: a bundled attachment or a File, under its own name. */
function entry(name, file) {
  return { name, arrayBuffer: () => file.arrayBuffer(), text: () => file.text() };
}

/** The size table and optical table are told from curves by name when dropped: META.* and optical.*. */
const DROPPED_TABLE = { meta: /^meta\b.*\.(csv|tsv|txt)$/i, optical: /^optical\b.*\.(csv|tsv|txt)$/i };

/**
 * A picker for a size series: many curve files (file picker or drag-and-drop), an optional size
 * table (META.csv) and an optional optical table, or the bundled demo series. Its value is null
 * until something is chosen, then `{ label, demo, curves, meta, optical }`: `curves` a list and
 * `meta`/`optical` null or one file, each `{ name, arrayBuffer(), text() }`. Files are read in
 * the page only. For the demo series the value also carries `material`, the demo's material.
 *
 * @param {{curves: {name: string, file: object}[], meta: {name: string, file: object}, optical: {name: string, file: object}, label: string, material?: string}} demo -
 *   the bundled series under the files' own names (a built page renames its files), a line
 *   describing it and its material.
 */
export function seriesPicker(demo) {
  const demoButton = html`<button type="button" class="dotspec-download" data-testid="demo-series">Load the demo series</button>`;
  const curvesInput = html`<input type="file" multiple data-testid="curve-files" accept=".csv,.tsv,.txt,.dat,text/plain,text/csv" aria-label="open curve files">`;
  const metaInput = html`<input type="file" data-testid="meta-file" accept=".csv,.tsv,.txt,text/plain,text/csv" aria-label="open a size table">`;
  const opticalInput = html`<input type="file" data-testid="optical-file" accept=".csv,.tsv,.txt,text/plain,text/csv" aria-label="open an optical table">`;
  const status = html`<span class="dotspec-picked" data-testid="picked">nothing yet</span>`;
  const zone = html`<div class="dotspec-drop" data-testid="drop-zone">
    <div>${demoButton} <span class="dotspec-hint">${demo.label}</span></div>
    <div><strong>Curves</strong> ${curvesInput}</div>
    <div><strong>Size table</strong> (optional: file, dot, radius_nm or diameter_nm, eta, notes) ${metaInput}</div>
    <div><strong>Optical table</strong> (optional: radius_nm, peak_ev_1, peak_ev_2, …) ${opticalInput}</div>
    <div class="dotspec-hint">…or drop files here (a file named META.* is taken as the size table, optical.* as the optical table). Files are read in this page only; nothing is sent anywhere.</div>
    <div>Showing: ${status}</div>
  </div>`;
  zone.value = null;
  let state = { demo: false, curves: [], meta: null, optical: null };
  const describe = (s) =>
    `${s.demo ? "the demo series: " : ""}${s.curves.length} curve file${s.curves.length === 1 ? "" : "s"}` +
    (s.meta ? `, size table ${s.meta.name}` : ", no size table") +
    (s.optical ? `, optical table ${s.optical.name}` : "");
  const set = (next) => {
    state = next;
    zone.value = { label: describe(next), ...next };
    status.textContent = describe(next);
    zone.dispatchEvent(new Event("input", { bubbles: true }));
  };
  // Own files replace the demo series (its tables go with it).
  const own = (s) => (s.demo ? { demo: false, curves: [], meta: null, optical: null } : s);
  // A table of one's own makes the series one's own (the demo's material no longer applies).
  const mine = (s) => {
    const { material, ...rest } = s;
    return { ...rest, demo: false };
  };
  const addFiles = (files) => {
    const s = { ...own(state) };
    const curves = [];
    for (const f of files) {
      if (DROPPED_TABLE.meta.test(f.name)) s.meta = entry(f.name, f);
      else if (DROPPED_TABLE.optical.test(f.name)) s.optical = entry(f.name, f);
      else curves.push(entry(f.name, f));
    }
    if (curves.length) s.curves = curves;
    set(s);
  };
  demoButton.addEventListener("click", () =>
    set({
      demo: true,
      material: demo.material ?? null,
      curves: demo.curves.map((c) => entry(c.name, c.file)),
      meta: entry(demo.meta.name, demo.meta.file),
      optical: entry(demo.optical.name, demo.optical.file),
    }),
  );
  curvesInput.addEventListener("change", () => {
    if (curvesInput.files && curvesInput.files.length) set({ ...own(state), curves: [...curvesInput.files].map((f) => entry(f.name, f)) });
  });
  metaInput.addEventListener("change", () => {
    if (metaInput.files && metaInput.files.length) set({ ...mine(state), meta: entry(metaInput.files[0].name, metaInput.files[0]) });
  });
  opticalInput.addEventListener("change", () => {
    if (opticalInput.files && opticalInput.files.length) set({ ...mine(state), optical: entry(opticalInput.files[0].name, opticalInput.files[0]) });
  });
  onDrop(zone, addFiles);
  return zone;
}

/**
 * A picker for one grid: the bundled demo grid, or files chosen with the file picker or dropped on
 * the zone — an `.npy` with its JSON sidecar (both at once), or one long-table file. Its value is
 * whichever was chosen last: `{ label, demo, files, eta }`, `files` a list of `{ name,
 * arrayBuffer(), text() }` (read in the page only), `eta` the demo's η (null for files of one's
 * own). It starts on the demo grid.
 *
 * @param {{label: string, eta: number, files: {name: string, file: object}[]}} demo - the bundled
 *   grid under its files' own names (a built page renames its files), a line describing it and the
 *   η it was made with.
 */
export function gridPicker(demo) {
  const demoButton = html`<button type="button" class="dotspec-download" data-testid="demo-grid">Load the demo grid</button>`;
  const input = html`<input type="file" multiple data-testid="grid-files" accept=".npy,.json,.csv,.tsv,.txt,.dat,text/plain,text/csv,application/json" aria-label="open a grid: an .npy with its .json sidecar, or a long table">`;
  const status = html`<span class="dotspec-picked" data-testid="picked"></span>`;
  const zone = html`<div class="dotspec-drop" data-testid="drop-zone">
    <div>${demoButton} <span class="dotspec-hint">${demo.label}</span></div>
    <div><strong>Your grid</strong>: an <code>.npy</code> together with its <code>.json</code> sidecar, or one long table (x, y, bias, current) ${input}</div>
    <div class="dotspec-hint">…or drop the files here. Files are read in this page only; nothing is sent anywhere.</div>
    <div>Showing: ${status}</div>
  </div>`;
  const { show, set } = pickerValue(zone, status, (value) => value.label);
  const demoValue = () => ({ label: `the demo grid (${demo.files.map((f) => f.name).join(" + ")})`, demo: true, eta: demo.eta, files: demo.files.map((f) => entry(f.name, f.file)) });
  const own = (files) => set({ label: files.map((f) => f.name).join(" + "), demo: false, eta: null, files: files.map((f) => entry(f.name, f)) });
  demoButton.addEventListener("click", () => set(demoValue()));
  input.addEventListener("change", () => {
    if (input.files && input.files.length) own([...input.files]);
  });
  onDrop(zone, own);
  show(demoValue());
  return zone;
}

/**
 * A progress bar with a line of text, for work the page does in steps.
 *
 * @param {number} fraction - done, from 0 to 1.
 * @param {string} text
 */
export function progress(fraction, text) {
  return html`<div class="dotspec-note" data-testid="progress"><progress max="1" value=${fraction}></progress> ${text}</div>`;
}
