/** Upload of points, an optional study area and no-data zones, with the coordinate system choice. */
import { api, ApiError, type StoredDataset } from '../api/api-client.js';
import { el, field, message, select } from '../ui/dom.js';
import { numericProperties } from './numeric-properties.js';

/** True when the file starts like an SQLite database (a GeoPackage is one): its layer is read by the server. */
async function isSqlite(file: File): Promise<boolean> {
  const head = new Uint8Array(await file.slice(0, 16).arrayBuffer());
  return String.fromCharCode(...head) === 'SQLite format 3\u0000';
}

export function uploadForm(onUploaded: (dataset: StoredDataset) => void): HTMLElement {
  const points = el('input', { type: 'file', name: 'points', required: true, accept: '.csv,.txt,.geojson,.json,.gpkg' });
  const area = el('input', { type: 'file', name: 'area', accept: '.geojson,.json,.gpkg' });
  const noData = el('input', { type: 'file', name: 'noData', multiple: true, accept: '.geojson,.json,.gpkg' });
  const crs = select({ name: 'crsChoice' }, [
    ['', 'as the file says (GeoJSON: longitude/latitude)'],
    ['planar', 'planar metres (already projected)'],
    ['EPSG:4326', 'longitude/latitude, EPSG:4326'],
    ['other', 'another EPSG code...'],
  ]);
  const epsg = el('input', { type: 'text', name: 'epsg', inputmode: 'numeric', placeholder: 'e.g. 3035', disabled: true });
  crs.addEventListener('change', () => {
    epsg.disabled = crs.value !== 'other';
  });
  const name = el('input', { type: 'text', name: 'name', maxlength: 200 });
  const x = el('input', { type: 'text', name: 'x', maxlength: 100, placeholder: 'found by name' });
  const y = el('input', { type: 'text', name: 'y', maxlength: 100, placeholder: 'found by name' });
  const skipBadRows = el('input', { type: 'checkbox', name: 'skipBadRows', id: 'upload-skip-bad-rows' });
  // population at risk (optional): polygons with a count field, or control points
  const riskKind = select({ name: 'baselineKind' }, [
    ['', 'none: expected counts follow area (complete spatial randomness)'],
    ['polygons', 'polygons with a count (residents, households, visits)'],
    ['controls', 'control points'],
  ]);
  const riskFile = el('input', { type: 'file', name: 'baseline', accept: '.geojson,.json,.gpkg,.csv,.txt', disabled: true });
  const riskField = el('select', { name: 'baselineField', disabled: true }, el('option', { value: '' }, 'choose the polygons first'));
  const riskFieldStatus = el('span', { class: 'field-hint', 'aria-live': 'polite', 'data-testid': 'baseline-field-status' });
  let fieldRequest = 0;
  // the picker lists the numeric properties of every feature: GeoJSON is read here, a GeoPackage layer by the server
  const refreshRiskField = async (): Promise<void> => {
    const request = (fieldRequest += 1);
    const file = riskFile.files?.[0];
    riskFieldStatus.textContent = '';
    if (riskKind.value !== 'polygons' || file === undefined) {
      riskField.replaceChildren(el('option', { value: '' }, 'choose the polygons first'));
      riskField.disabled = true;
      return;
    }
    riskField.replaceChildren(el('option', { value: '' }, 'reading the file...'));
    riskField.disabled = true;
    let names: string[];
    try {
      names = (await isSqlite(file)) ? (await api.baselineFields(file)).fields : numericProperties(await file.text());
    } catch (error) {
      if (request !== fieldRequest) return;
      riskField.replaceChildren(el('option', { value: '' }, 'no field could be read'));
      riskFieldStatus.replaceChildren(message('error', error instanceof Error ? error.message : String(error)));
      return;
    }
    if (request !== fieldRequest) return;
    riskField.replaceChildren(
      ...(names.length === 0 ? [el('option', { value: '' }, 'no numeric property in every feature')] : names.map((n) => el('option', { value: n }, n))),
    );
    riskField.disabled = names.length === 0;
  };
  riskKind.addEventListener('change', () => {
    riskFile.disabled = riskKind.value === '';
    void refreshRiskField();
  });
  riskFile.addEventListener('change', () => void refreshRiskField());
  const feedback = el('div', { 'aria-live': 'polite' });
  const submit = el('button', { type: 'submit', class: 'button' }, 'Upload and check');
  const form = el(
    'form',
    { class: 'upload-form', 'aria-label': 'Upload your own data' },
    field('Points (CSV, GeoJSON or GeoPackage)', points),
    field('Study area (optional)', area, 'Without it the bounding box of the points is used, with a warning.'),
    field('No-data zones (optional, several files allowed)', noData, 'Water, closed land: places where points cannot occur.'),
    el(
      'fieldset',
      { class: 'population-at-risk' },
      el('legend', {}, 'Population at risk (optional)'),
      field('Expected counts follow', riskKind, 'Crime and disease records follow where people are: test clustering beyond them, not beyond area.'),
      field('Population file (polygons: GeoJSON or GeoPackage; controls: as the points)', riskFile),
      field('Count field', riskField, 'The numeric property holding each polygon\'s population at risk (GeoJSON or GeoPackage).'),
      riskFieldStatus,
    ),
    field('Coordinate system', crs),
    field('EPSG code', epsg),
    field('Dataset name', name),
    el('div', { class: 'field-row' }, field('x / longitude column', x), field('y / latitude column', y)),
    el(
      'div',
      { class: 'check-row' },
      skipBadRows,
      el('label', { for: skipBadRows.id }, 'Skip rows without coordinates'),
      el('span', { class: 'field-hint' }, 'CSV rows whose coordinates are blank or n/a are left out and listed in a warning.'),
    ),
    submit,
    feedback,
  );
  form.addEventListener('submit', async (event) => {
    event.preventDefault();
    const file = points.files?.[0];
    if (!file) {
      feedback.replaceChildren(message('error', 'Choose a points file first.'));
      return;
    }
    const body = new FormData();
    body.append('points', file, file.name);
    if (area.files?.[0]) body.append('area', area.files[0], area.files[0].name);
    for (const zone of Array.from(noData.files ?? [])) body.append('noData', zone, zone.name);
    const crsValue = crs.value === 'other' ? `EPSG:${epsg.value.trim()}` : crs.value;
    if (crsValue) body.append('crs', crsValue);
    for (const [key, input] of [['name', name], ['x', x], ['y', y]] as const) if (input.value.trim()) body.append(key, input.value.trim());
    if (skipBadRows.checked) body.append('skipBadRows', 'true');
    const riskUpload = riskFile.files?.[0];
    if (riskKind.value !== '' && riskUpload !== undefined) {
      body.append(riskKind.value === 'controls' ? 'controls' : 'baseline', riskUpload, riskUpload.name);
      if (riskKind.value === 'polygons' && riskField.value !== '') body.append('baselineField', riskField.value);
    }
    submit.disabled = true;
    feedback.replaceChildren(message('info', 'Reading and checking the files...'));
    try {
      const dataset = await api.upload(body);
      feedback.replaceChildren(message('info', `Loaded ${dataset.name}: ${dataset.n} points.`));
      onUploaded(dataset);
    } catch (error) {
      feedback.replaceChildren(message('error', error instanceof Error ? error.message : String(error)));
      // rows without coordinates: the way out is the checkbox, so take the keyboard there
      if (error instanceof ApiError && error.code === 'GS_ERR_BAD_ROWS' && !skipBadRows.checked) skipBadRows.focus();
    } finally {
      submit.disabled = false;
    }
  });
  return form;
}
