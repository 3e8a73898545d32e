import { eq } from 'drizzle-orm';
import type { z } from 'zod';

import type { Reader, Tx } from '@/db/client';
import { designBasis } from '@/db/schema';
import {
  DEFAULT_FIRED_HOURS_PER_YEAR,
  type CandidateParameters,
  type Criterion,
  type DesignBasis,
  type designBasisInput,
} from '@/server/contracts/board';
import { evaluateRequestSchema } from '@/server/contracts/cycle';
import { EngineInputError } from '@/server/engine';

import { evaluate } from './cycles';
import { defaultCriteria, defaultDesignBasis } from './presets';

/** The basis without its criteria: what the engine input takes from it. */
export type BasisCore = Omit<z.output<typeof designBasisInput>, 'criteria'>;

type BasisRow = typeof designBasis.$inferSelect;

/** The revision a review's basis has before anyone stores it (the default, as GET board shows it). */
const defaultRevision = 1;

/** The stored basis of a review, or null when nobody has written one yet. */
export async function readBasis(db: Reader, reviewId: string): Promise<BasisRow | null> {
  const [row] = await db.select().from(designBasis).where(eq(designBasis.reviewId, reviewId)).limit(1);
  return row ?? null;
}

/**
 * The basis row of a review inside a change, stored first (as the default) when there is
 * none, and locked: `update` for a change of the basis itself, `share` for a change that
 * only reads it (a candidate's). Every change takes this lock before any candidate lock, so
 * a basis change and candidate changes never wait on each other in a circle, and a
 * candidate is never computed from a basis that is being replaced.
 */
export async function lockBasis(tx: Tx, reviewId: string, mode: 'update' | 'share'): Promise<BasisRow> {
  const locked = () => tx.select().from(designBasis).where(eq(designBasis.reviewId, reviewId)).for(mode);
  // Nearly always there: one round trip. A review without one gets the default first.
  const [row] = await locked();
  if (row) return row;
  await tx
    .insert(designBasis)
    .values({
      reviewId,
      basis: structuredClone(defaultDesignBasis) as Record<string, unknown>,
      criteria: structuredClone(defaultCriteria),
      revision: defaultRevision,
    })
    .onConflictDoNothing({ target: designBasis.reviewId });
  const [made] = await locked();
  return made;
}

export function coreOf(row: BasisRow): BasisCore {
  return row.basis as BasisCore;
}

/** The basis as the API carries it; the default (not yet stored) when `row` is null. */
export function toDesignBasis(row: BasisRow | null, defaultUpdatedAt: string): DesignBasis {
  const core = (row?.basis ?? defaultDesignBasis) as BasisCore;
  return {
    ambient: core.ambient,
    fuel: core.fuel,
    fluid: core.fluid,
    netPowerKW: core.netPowerKW,
    generatorEfficiency: core.generatorEfficiency,
    limits: core.limits,
    // A basis stored before fired hours existed reads as the default.
    firedHoursPerYear: core.firedHoursPerYear ?? DEFAULT_FIRED_HOURS_PER_YEAR,
    criteria: (row?.criteria ?? defaultCriteria) as Criterion[],
    revision: row?.revision ?? defaultRevision,
    updatedAt: row ? row.updatedAt.toISOString() : defaultUpdatedAt,
  };
}

/**
 * The whole engine input a candidate makes with the basis: exactly the body
 * POST /api/cycles/evaluate accepts (site, fuel, power and property model from the basis,
 * the cycle from the candidate).
 */
export function engineInputOf(core: BasisCore, parameters: CandidateParameters): Record<string, unknown> {
  return {
    ambient: core.ambient,
    fluid: core.fluid,
    fuel: core.fuel,
    compressor: parameters.compressor,
    regenerator: parameters.regenerator,
    combustorPressureLoss: parameters.combustorPressureLoss,
    turbine: parameters.turbine,
    generatorEfficiency: core.generatorEfficiency,
    netPowerKW: core.netPowerKW,
    limits: core.limits,
  };
}

const parameterGroups = new Set(['compressor', 'regenerator', 'combustorPressureLoss', 'turbine']);

/**
 * Where an engine field lives for the people who set it: a candidate's parameter
 * (`compressor.pressureRatio` → `parameters.compressor.pressureRatio`) or the design basis
 * (`ambient.temperatureK` → `designBasis.ambient.temperatureK`).
 */
export function fieldOnBoard(engineField: string): string {
  const [head] = engineField.split('.');
  return parameterGroups.has(head) ? `parameters.${engineField}` : `designBasis.${engineField}`;
}

export type Computed = {
  input: Record<string, unknown>;
  results: Record<string, unknown> | null;
  error: { field: string; message: string } | null;
};

/**
 * Computes a candidate with the basis through the one engine caller. A refusal of the
 * combination is kept as the candidate's field error (no results), not thrown: the
 * candidate keeps its parameters until someone mends them. The results are stored as the
 * evaluate route sends them (JSON), paths included with the engine's default points.
 */
export function computeCandidate(core: BasisCore, parameters: CandidateParameters): Computed {
  const input = engineInputOf(core, parameters);
  const parsed = evaluateRequestSchema.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { input, results: null, error: { field: fieldOnBoard(issue.path.join('.')), message: issue.message } };
  }
  try {
    return { input, results: JSON.parse(JSON.stringify(evaluate(parsed.data))), error: null };
  } catch (error) {
    if (error instanceof EngineInputError) {
      return { input, results: null, error: { field: fieldOnBoard(error.field), message: error.message } };
    }
    throw error;
  }
}
