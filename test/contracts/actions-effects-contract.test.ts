/**
 * Contract (not validation): the design effects of @platesmith/actions are assignable to the
 * check library's Effects both ways, so the search can pass them on without conversion.
 * Checked by the type-check pass (`pnpm typecheck`); the runtime part keeps the file a test.
 */
import { expect, expectTypeOf, test } from 'vitest';
import { analyse, designEffects, type DesignEffects } from '@platesmith/actions';
import type { Effects } from '@platesmith/checks';

test('DesignEffects and Effects are mutually assignable', () => {
  expectTypeOf<DesignEffects>().toExtend<Effects>();
  expectTypeOf<Effects>().toExtend<DesignEffects>();
  const e: Effects = designEffects(analyse({ spans: [20000], actions: [{ kind: 'permanent', load: 'udl', value: 10 }], combination: '6.10' }), 2);
  expect(Object.keys(e).sort()).toEqual(['forces', 'reactions', 'sls', 'stations']);
});
