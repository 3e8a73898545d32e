import { TsDiagram, TsOverlay, type DiagramCycle } from '@/components/diagrams';
import type { CandidateWire } from '@/server/contracts/board';

/** The engine's states and paths of a candidate, when its results carry them. */
function cycleOf(candidate: CandidateWire): DiagramCycle | null {
  const r = candidate.results;
  if (!r || !Array.isArray(r.states) || !Array.isArray(r.paths)) return null;
  return { states: r.states as DiagramCycle['states'], paths: r.paths as DiagramCycle['paths'] };
}

/** The small T-s diagram of a card, drawn from the candidate's own results. */
export function CardDiagram({ candidate, colour }: { candidate: CandidateWire; colour: string }) {
  const cycle = cycleOf(candidate);
  if (!cycle) return null;
  return (
    <TsDiagram name={candidate.name} cycle={cycle} size="small" colour={colour} testID={`card-ts-${candidate.id}`} />
  );
}

/** Every candidate's loop on one T-s diagram, each in its own colour. */
export function OverlayDiagram({ candidates }: { candidates: CandidateWire[] }) {
  const drawn = candidates.flatMap((candidate) => {
    const cycle = cycleOf(candidate);
    return cycle ? [{ id: candidate.id, name: candidate.name, colour: candidate.colour, cycle }] : [];
  });
  return <TsOverlay candidates={drawn} size="large" testID="overlay-ts" />;
}
