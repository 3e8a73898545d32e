import { isDeepStrictEqual } from 'node:util';

import { and, asc, eq, sql } from 'drizzle-orm';
import { z } from 'zod';

import type { Database, Reader, Tx } from '@/db/client';
import { candidate, user } from '@/db/schema';
import {
  candidateColours,
  candidateParametersSchema,
  statusLabels,
  type CandidateParameters,
  type candidateParametersPatch,
  type CandidatePreset,
  type CandidateStatus,
  type CandidateWire,
} from '@/server/contracts/board';
import type { ActivityKind } from '@/server/contracts/team';
import { violatedUnique } from '@/server/http/database-errors';
import { ApiError, parse } from '@/server/http/errors';

import { recordActivity } from './activity';
import type { Broadcast } from './broadcast';
import { computeCandidate, coreOf, lockBasis, type BasisCore } from './design-basis';
import { parametersOf } from './presets';
import { reviewOf } from './reviews';

export type CandidateContext = {
  db: Database;
  broadcast: Broadcast;
  actorId: string;
  /** Known to the route from its access check and the session: saves two queries per edit. */
  teamId?: string;
  actorName?: string;
};

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A review holds at most one candidate per colour of the series, kept for life. */
export const maxCandidates = candidateColours.length;

const columns = {
  row: candidate,
  updatedByName: user.name,
};

function selectCandidates(db: Reader) {
  return db.select(columns).from(candidate).leftJoin(user, eq(user.id, candidate.updatedById));
}

type Selected = Awaited<ReturnType<typeof selectCandidates>>[number];

function toCandidate({ row, updatedByName }: Selected): CandidateWire {
  return {
    id: row.id,
    reviewId: row.reviewId,
    name: row.name,
    colour: candidateColours[row.colourIndex] ?? candidateColours[0],
    status: row.status,
    preset: row.preset,
    parameters: row.parameters,
    input: row.input,
    revision: row.revision,
    results: row.results,
    error: row.error,
    updatedAt: row.updatedAt.toISOString(),
    updatedBy: row.updatedById ? { id: row.updatedById, name: updatedByName ?? '' } : null,
  };
}

/** The candidates of a review in board order (oldest first). */
export async function listCandidates(db: Reader, reviewId: string): Promise<CandidateWire[]> {
  const rows = await selectCandidates(db)
    .where(eq(candidate.reviewId, reviewId))
    .orderBy(asc(candidate.position), asc(candidate.createdAt));
  return rows.map(toCandidate);
}

async function getCandidate(db: Reader, reviewId: string, candidateId: string): Promise<CandidateWire | null> {
  const [row] = await selectCandidates(db)
    .where(and(eq(candidate.id, candidateId), eq(candidate.reviewId, reviewId)))
    .limit(1);
  return row ? toCandidate(row) : null;
}

const candidateNotFound = () => ApiError.notFound('The Candidate');

const isNameTaken = (error: unknown) => violatedUnique(error) === 'candidate_review_name_key';

const nameTaken = (name: string) =>
  new ApiError(409, 'conflict', `A candidate named "${name}" already exists in this Review.`, {
    field: 'name',
    fieldErrors: { name: ['This Review already has a candidate with this name.'] },
  });

/** The next free colour of the series: the lowest index no candidate of the review holds. */
function nextColour(taken: number[]): number | null {
  const used = new Set(taken);
  for (let i = 0; i < candidateColours.length; i++) if (!used.has(i)) return i;
  return null;
}

export type CreateCandidate = { name: string; preset?: CandidatePreset; copyOf?: string };

/**
 * Adds a candidate from a preset's common-practice parameters or as a copy of another
 * candidate of the same review, computed with the review's basis, in one transaction with
 * its Activity line; then tells the room. The colour is the next free one of the series; a
 * review with all of them taken refuses a ninth (409): colours are kept for life, so none is
 * reused while its candidate exists.
 */
export async function createCandidate(
  { db, broadcast, actorId }: CandidateContext,
  reviewId: string,
  input: CreateCandidate,
): Promise<CandidateWire> {
  if (input.copyOf !== undefined && !uuidPattern.test(input.copyOf)) throw copyNotFound();
  let id: string;
  try {
    id = await db.transaction(async (tx) => {
      // The basis lock (for update) also makes creates in one review take turns: two cannot
      // pick the same colour or position.
      const basis = await lockBasis(tx, reviewId, 'update');
      const { teamId, name: reviewName } = await reviewOf(tx, reviewId);
      const existing = await tx
        .select({ colourIndex: candidate.colourIndex, position: candidate.position })
        .from(candidate)
        .where(eq(candidate.reviewId, reviewId));
      const colourIndex = nextColour(existing.map((c) => c.colourIndex));
      if (colourIndex === null) {
        throw new ApiError(
          409,
          'candidate_limit',
          `A Review holds at most ${maxCandidates} candidates, one per colour, and this one has ${maxCandidates}. ` +
            'Mark one set aside and reuse it, or start another Review.',
        );
      }
      let parameters: CandidateParameters;
      let preset: CandidatePreset | null;
      if (input.copyOf !== undefined) {
        const [source] = await tx
          .select({ parameters: candidate.parameters, preset: candidate.preset })
          .from(candidate)
          .where(and(eq(candidate.id, input.copyOf), eq(candidate.reviewId, reviewId)))
          .limit(1);
        if (!source) throw copyNotFound();
        parameters = structuredClone(source.parameters) as CandidateParameters;
        preset = source.preset;
      } else {
        preset = input.preset!;
        parameters = parametersOf(preset);
      }
      const computed = computeCandidate(coreOf(basis), parameters);
      const [created] = await tx
        .insert(candidate)
        .values({
          reviewId,
          name: input.name,
          colourIndex,
          preset,
          parameters: parameters as Record<string, unknown>,
          ...computed,
          position: Math.max(-1, ...existing.map((c) => c.position)) + 1,
          createdById: actorId,
          updatedById: actorId,
        })
        .returning({ id: candidate.id });
      await recordActivity(tx, {
        teamId,
        reviewId,
        actorId,
        kind: 'candidate:added',
        detail: { name: input.name, reviewName, candidateId: created.id, preset },
      });
      return created.id;
    });
  } catch (error) {
    if (isNameTaken(error)) throw nameTaken(input.name);
    throw error;
  }
  const created = (await getCandidate(db, reviewId, id))!;
  broadcast.toReview(reviewId, 'candidate:added', { candidate: created });
  return created;
}

const copyNotFound = () =>
  new ApiError(404, 'not_found', 'copyOf: the candidate to copy was not found in this Review.', { field: 'copyOf' });

/** A PATCH whose `ifRevision` is no longer current: 409 with the candidate as it is now. */
export class CandidateConflict extends ApiError {
  constructor(readonly candidate: CandidateWire) {
    const by = candidate.updatedBy ? ` by ${candidate.updatedBy.name}` : '';
    super(
      409,
      'conflict',
      `This candidate was changed${by} since you opened it (now revision ${candidate.revision}). ` +
        'Look at the current values and apply your change again.',
      { field: 'ifRevision' },
    );
    this.name = 'CandidateConflict';
  }
}

type ParametersPatch = z.output<typeof candidateParametersPatch>;

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * One group merged field by field: the patch's fields replace the stored ones and a field
 * sent as null is removed (an optional one then takes its default again). Built with
 * Object.fromEntries, so no key can reach an object's prototype.
 */
function mergeGroup(stored: unknown, patch: Record<string, unknown>): Record<string, unknown> {
  const kept = Object.entries(isObject(stored) ? stored : {}).filter(([key]) => !Object.hasOwn(patch, key));
  const sent = Object.entries(patch).filter(([, value]) => value !== null);
  return Object.fromEntries([...kept, ...sent]);
}

/**
 * A partial change of the parameters merged into the stored ones: compressor and turbine
 * field by field; the regenerator likewise, or removed by null (a regenerator added to a
 * candidate without one needs all its fields); the combustor loss replaced.
 */
export function mergeParameters(stored: Record<string, unknown>, patch: ParametersPatch): Record<string, unknown> {
  const next: Record<string, unknown> = { ...stored };
  if (patch.compressor !== undefined) next.compressor = mergeGroup(stored.compressor, patch.compressor);
  if (patch.turbine !== undefined) next.turbine = mergeGroup(stored.turbine, patch.turbine);
  if (patch.regenerator === null) next.regenerator = null;
  else if (patch.regenerator !== undefined) next.regenerator = mergeGroup(stored.regenerator, patch.regenerator);
  if (patch.combustorPressureLoss !== undefined) next.combustorPressureLoss = patch.combustorPressureLoss;
  return next;
}

/** The merged parameters checked whole; an error names the field as `parameters.<group>.<field>`. */
const mergedParameters = z.object({ parameters: candidateParametersSchema });

export type UpdateCandidate = {
  name?: string;
  status?: CandidateStatus;
  parameters?: ParametersPatch;
  ifRevision?: number;
};

/**
 * Changes a candidate's name, status or parameters under a row lock, so two changes made on
 * the same revision cannot both pass `ifRevision`. New parameters are recomputed with the
 * basis; an engine refusal is stored as the candidate's field error (answered 200) and the
 * parameters are kept. One row revision, one Activity line per kind of change, then the room
 * hears `candidate:recomputed` with the whole candidate (for a rename or status too).
 */
export async function updateCandidate(
  { db, broadcast, actorId, teamId: knownTeamId, actorName }: CandidateContext,
  reviewId: string,
  candidateId: string,
  input: UpdateCandidate,
): Promise<CandidateWire> {
  if (!uuidPattern.test(candidateId)) throw candidateNotFound();
  let outcome: { changed: boolean; written: CandidateWire | null };
  try {
    outcome = await db.transaction(async (tx) => {
      const basis = await lockBasis(tx, reviewId, 'share');
      const [locked] = await selectCandidates(tx)
        .where(and(eq(candidate.id, candidateId), eq(candidate.reviewId, reviewId)))
        .for('update', { of: candidate });
      if (!locked) throw candidateNotFound();
      const row = locked.row;
      if (input.ifRevision !== undefined && input.ifRevision !== row.revision) {
        throw new CandidateConflict(toCandidate(locked));
      }
      const changes: Partial<typeof candidate.$inferInsert> = {};
      const events: Array<{ kind: ActivityKind; detail: Record<string, unknown> }> = [];
      if (input.name !== undefined && input.name !== row.name) {
        changes.name = input.name;
        events.push({ kind: 'candidate:renamed', detail: { from: row.name, to: input.name, candidateId } });
      }
      if (input.status !== undefined && input.status !== row.status) {
        changes.status = input.status;
        events.push({
          kind: 'candidate:status-changed',
          detail: {
            name: input.name ?? row.name,
            from: row.status,
            status: input.status,
            statusLabel: statusLabels[input.status],
            candidateId,
          },
        });
      }
      if (input.parameters !== undefined) {
        const merged = mergeParameters(row.parameters, input.parameters);
        const { parameters } = parse(mergedParameters, { parameters: merged });
        if (!isDeepStrictEqual(parameters, row.parameters)) {
          Object.assign(changes, { parameters, ...computeCandidate(coreOf(basis), parameters) });
          events.push({
            kind: 'candidate:recomputed',
            detail: { name: input.name ?? row.name, candidateId, fields: changedFields(row.parameters, parameters) },
          });
        }
      }
      if (events.length === 0) return { changed: false, written: null };
      const [written] = await tx
        .update(candidate)
        .set({ ...changes, revision: row.revision + 1, updatedById: actorId, updatedAt: sql`now()` })
        .where(eq(candidate.id, candidateId))
        .returning();
      const teamId = knownTeamId ?? (await reviewOf(tx, reviewId)).teamId;
      for (const e of events) await recordActivity(tx, { teamId, reviewId, actorId, ...e });
      return {
        changed: true,
        written: actorName === undefined ? null : toCandidate({ row: written!, updatedByName: actorName }),
      };
    });
  } catch (error) {
    if (isNameTaken(error)) throw nameTaken(input.name ?? '');
    throw error;
  }
  // Unchanged (or written without the actor's name at hand): read it as it is now.
  const after = outcome.written ?? (await getCandidate(db, reviewId, candidateId))!;
  if (outcome.changed) broadcast.toReview(reviewId, 'candidate:recomputed', { candidate: after });
  return after;
}

/** The dotted parameter fields that differ between two parameter sets (for the Activity line). */
function changedFields(before: Record<string, unknown>, after: Record<string, unknown>): string[] {
  const fields: string[] = [];
  for (const group of ['compressor', 'regenerator', 'combustorPressureLoss', 'turbine']) {
    const a = before[group];
    const b = after[group];
    if (isObject(a) && isObject(b)) {
      for (const key of new Set([...Object.keys(a), ...Object.keys(b)]))
        if (!isDeepStrictEqual(a[key], b[key])) fields.push(`${group}.${key}`);
    } else if (!isDeepStrictEqual(a, b)) fields.push(group);
  }
  return fields;
}

/**
 * Recomputes every candidate of a review with a new basis inside the basis change's
 * transaction (the basis row is locked for update by then), each one a new row revision.
 * A refusal that names a field of the basis itself (humid air outside the property range)
 * is the basis's fault, not the candidate's: it refuses the change with 422 at that field
 * of the basis body and, thrown inside the transaction, stores nothing. A refusal of a
 * combination (at a parameter) is stored as that candidate's error.
 */
export async function recomputeAll(tx: Tx, reviewId: string, basisCore: BasisCore, actorId: string) {
  const rows = await tx
    .select({ id: candidate.id, parameters: candidate.parameters, revision: candidate.revision })
    .from(candidate)
    .where(eq(candidate.reviewId, reviewId))
    .orderBy(asc(candidate.id))
    .for('update');
  const computed = rows.map((row) => computeCandidate(basisCore, row.parameters as CandidateParameters));
  const basisError = computed.find((c) => c.error?.field.startsWith(basisPrefix))?.error;
  if (basisError) throw ApiError.invalidField(basisError.field.slice(basisPrefix.length), basisError.message);
  for (const [i, row] of rows.entries()) {
    await tx
      .update(candidate)
      .set({ ...computed[i], revision: row.revision + 1, updatedById: actorId, updatedAt: sql`now()` })
      .where(eq(candidate.id, row.id));
  }
  return rows.length;
}

const basisPrefix = 'designBasis.';
