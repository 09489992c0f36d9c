// Column mappings given on the command line ("ours=theirs,ours2=theirs2"), so files with other headers read
// as they are.

import { InputError } from '../errors.js';

/** Parses "name=theirs,name2=theirs2" into { name: 'theirs', name2: 'theirs2' }; optionName goes into messages. */
export function parseColumnMapping(text: string, optionName: string): Record<string, string> {
  const mapping: Record<string, string> = {};
  const pairs = text.split(',').map((pair) => pair.trim());
  for (const pair of pairs) {
    if (pair === '') continue;
    const parts = pair.split('=');
    const ours = parts[0]?.trim() ?? '';
    const theirs = parts[1]?.trim() ?? '';
    if (parts.length !== 2 || ours === '' || theirs === '') {
      throw new InputError(
        `option ${optionName}: '${pair}' is not of the form name=column (e.g. width_left_m=w_tr_left_m)`,
      );
    }
    if (Object.hasOwn(mapping, ours)) throw new InputError(`option ${optionName}: '${ours}' is mapped twice`);
    mapping[ours] = theirs;
  }
  if (Object.keys(mapping).length === 0)
    throw new InputError(`option ${optionName}: no name=column pairs in '${text}'`);
  return mapping;
}
