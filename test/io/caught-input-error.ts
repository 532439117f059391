import { InputError } from '../../src/io/errors.js';

/** The InputError `p` rejects with; anything else (or no error at all) fails the test. */
export async function caught(p: Promise<unknown>): Promise<InputError> {
  try {
    await p;
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('no error raised');
}
