/** Upload of points, an optional study area and no-data zones, with the coordinate system choice. */
import { api, ApiError, type StoredDataset } from '../api/api-client.js';
import { el, field, message } from '../ui/dom.js';

export function uploadForm(onUploaded: (dataset: StoredDataset) => void): HTMLElement {
  const points = el('input', { type: 'file', name: 'points', required: true, accept: '.csv,.txt,.geojson,.json,.gpkg' });
  const area = el('input', { type: 'file', name: 'area', accept: '.geojson,.json,.gpkg' });
  const noData = el('input', { type: 'file', name: 'noData', multiple: true, accept: '.geojson,.json,.gpkg' });
  const crs = el(
    'select',
    { name: 'crsChoice' },
    el('option', { value: '' }, 'as the file says (GeoJSON: longitude/latitude)'),
    el('option', { value: 'planar' }, 'planar metres (already projected)'),
    el('option', { value: 'EPSG:4326' }, 'longitude/latitude, EPSG:4326'),
    el('option', { value: 'other' }, 'another EPSG code...'),
  );
  const epsg = el('input', { type: 'text', name: 'epsg', inputmode: 'numeric', placeholder: 'e.g. 3035', disabled: true });
  crs.addEventListener('change', () => {
    epsg.disabled = crs.value !== 'other';
  });
  const name = el('input', { type: 'text', name: 'name', maxlength: 200 });
  const x = el('input', { type: 'text', name: 'x', maxlength: 100, placeholder: 'found by name' });
  const y = el('input', { type: 'text', name: 'y', maxlength: 100, placeholder: 'found by name' });
  const skipBadRows = el('input', { type: 'checkbox', name: 'skipBadRows', id: 'upload-skip-bad-rows' });
  const feedback = el('div', { 'aria-live': 'polite' });
  const submit = el('button', { type: 'submit', class: 'button' }, 'Upload and check');
  const form = el(
    'form',
    { class: 'upload-form', 'aria-label': 'Upload your own data' },
    field('Points (CSV, GeoJSON or GeoPackage)', points),
    field('Study area (optional)', area, 'Without it the bounding box of the points is used, with a warning.'),
    field('No-data zones (optional, several files allowed)', noData, 'Water, closed land: places where points cannot occur.'),
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
