// Column mappings given on the command line.

import { describe, expect, it } from 'vitest';
import { parseColumnMapping } from '../../src/io/columns.js';
import { InputError } from '../../src/errors.js';

describe('parseColumnMapping', () => {
  it('reads name=theirs pairs, trimming spaces', () => {
    expect(parseColumnMapping('width_left_m=w_tr_left_m, width_right_m = w_tr_right_m', '--columns')).toEqual({
      width_left_m: 'w_tr_left_m',
      width_right_m: 'w_tr_right_m',
    });
  });

  it.each([['width_left_m'], ['a=b=c'], ['=b'], ['a='], [','], ['a=b,a=c']])(
    'refuses %j with a one-line InputError naming the option',
    (text) => {
      expect(() => parseColumnMapping(text, '--columns')).toThrow(InputError);
      expect(() => parseColumnMapping(text, '--columns')).toThrow(/^option --columns: [^\n]+$/);
    },
  );
});
