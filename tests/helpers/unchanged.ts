import { expect } from 'vitest';

export type Reply = { status: number; body: any };

/**
 * A security test's `expectUnchanged(act, status, expected?)`: runs `act`, expects `status`
 * (and, when given, `expected` as the error's `detail`: its code or its field), and expects
 * `snapshot()`, everything the routes under attack could change, to read the same after as before.
 */
export function refusalsChangeNothing(snapshot: () => Promise<string>, detail: 'code' | 'field' = 'code') {
  return async function expectUnchanged<R extends Reply>(
    act: () => PromiseLike<R>,
    status: number,
    expected?: string,
  ): Promise<R> {
    const before = await snapshot();
    const res = await act();
    expect(res.status, JSON.stringify(res.body)).toBe(status);
    if (expected) expect(res.body.error[detail]).toBe(expected);
    expect(await snapshot()).toBe(before);
    return res;
  };
}
