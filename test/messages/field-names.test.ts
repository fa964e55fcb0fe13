import { describe, expect, it } from 'vitest';
import { FIELD_NAMES, fieldRef, renderMessage, twoWays, referencedFields } from '../../server/messages/field-names.js';
import { GridshakeError } from '../../server/errors.js';
import { loadDataset } from '../../server/inputs/index.js';
import { file, thrown } from '../inputs/input-helpers.js';

// One message source, two phrasings: the page (and the HTTP API) names its fields, the command line its flags.
describe('field references in messages', () => {
  it('render as the page label or the command-line flag', () => {
    const text = `${fieldRef('x')} names no column; ${fieldRef('cells', 1)} is too small; ${twoWays('add --skip-bad-rows', 'tick the box')}`;
    expect(renderMessage(text, 'page')).toBe('the "x / longitude column" field names no column; cell side 2 is too small; tick the box');
    expect(renderMessage(text, 'cli')).toBe('--x names no column; --cells value 2 is too small; add --skip-bad-rows');
    expect(referencedFields(text)).toEqual(['x', 'cells']);
  });

  it('give every page label without command-line syntax and every flag with it', () => {
    for (const [name, entry] of Object.entries(FIELD_NAMES)) {
      expect(entry.label, name).not.toMatch(/--|plan\./);
      expect(entry.flag, name).toMatch(/^--[a-z-]+$/);
    }
  });

  it('reach both audiences through one error', () => {
    const error = new GridshakeError('GS_ERR_INPUT', `give ${fieldRef('area')}`);
    expect(error.message).toBe('give the "Study area" field');
    expect(error.cliMessage).toBe('give --area');
  });

  it('word a CSV without coordinate columns for each audience', () => {
    const error = thrown(() => loadDataset({ points: file('pts.csv', 'id,colour\n1,red\n') }, { crs: 'planar' }));
    expect(error.message).toMatch(/name them in the "x \/ longitude column" and "y \/ latitude column" fields$/);
    expect(error.message).not.toContain('--');
    expect(error.cliMessage).toMatch(/name them with --x COL --y COL$/);
  });

  it('never leaves a marker character in either phrasing', () => {
    const error = thrown(() => loadDataset({ points: file('pts.csv', 'x,y\n1,2\n3,4\n') }));
    for (const text of [error.message, error.cliMessage]) expect(text).not.toMatch(/[\uE000-\uE004]/);
  });
});
