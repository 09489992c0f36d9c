// The message of the InputError a call throws, checked to be one line; fails the test when the call returns.

import { expect } from 'vitest';
import { InputError } from '../../src/errors.js';

export function inputErrorMessage(run: () => unknown): string {
  try {
    run();
  } catch (error) {
    expect(error).toBeInstanceOf(InputError);
    expect((error as Error).message.split('\n')).toHaveLength(1);
    return (error as Error).message;
  }
  throw new Error('expected an InputError');
}
