// Page furniture shared by the dotspec notebooks: the curve picker (bundled samples, a file
// picker and a drop zone), download buttons, plain tables and message boxes. No analysis
// happens here: the notebooks call the library (lib/core.ts) for that.
import { html } from "htl";

/**
 * A picker for one curve: a bundled sample, a file chosen with the file picker, or a file
 * dropped on the zone. Its value is whichever was chosen last: an object with `name` and
 * `arrayBuffer()` (a bundled sample or a File). Files are read in the page only.
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
  const set = (value) => {
    zone.value = value;
    status.textContent = value.name;
    zone.dispatchEvent(new Event("input", { bubbles: true }));
  };
  const sample = (i) => ({ name: samples[i].name, arrayBuffer: () => samples[i].file.arrayBuffer() });
  select.addEventListener("change", () => set(sample(Number(select.value))));
  file.addEventListener("change", () => {
    if (file.files && file.files.length) set(file.files[0]);
  });
  zone.addEventListener("dragover", (event) => {
    event.preventDefault();
    zone.classList.add("dotspec-drop-over");
  });
  zone.addEventListener("dragleave", () => zone.classList.remove("dotspec-drop-over"));
  zone.addEventListener("drop", (event) => {
    event.preventDefault();
    zone.classList.remove("dotspec-drop-over");
    const dropped = event.dataTransfer && event.dataTransfer.files;
    if (dropped && dropped.length) set(dropped[0]);
  });
  zone.value = sample(0);
  status.textContent = samples[0].name;
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

/** SVG markup (from the library's figure code) as an element. */
export function figure(svgMarkup, testid) {
  const div = html`<div class="dotspec-figure"></div>`;
  if (testid) div.dataset.testid = testid;
  div.innerHTML = svgMarkup;
  return div;
}

/** Nothing to show (an empty, invisible element: a cell that has nothing to say stays blank). */
export function nothing() {
  return html`<span hidden></span>`;
}
