import type { Activity } from '@/server/contracts/team';

const str = (v: unknown) => (typeof v === 'string' ? v : typeof v === 'number' ? String(v) : '');
const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : 0);
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * A sentence for each kind of Activity entry, after the actor's name; unknown kinds still read
 * as plain words. On the Team's timeline (`where: 'team'`) a line names its Review; on a
 * Review's own timeline it does not.
 */
export function describeActivity(a: Activity, where: 'team' | 'review'): string {
  const d = a.detail;
  const inReview = where === 'team' && str(d.reviewName) ? ` in “${str(d.reviewName)}”` : '';
  switch (a.kind) {
    case 'review:created':
      return where === 'team' ? `started the Review “${str(d.name)}”` : `started this Review as “${str(d.name)}”`;
    case 'review:renamed':
      return `renamed the Review “${str(d.from)}” to “${str(d.to)}”`;
    case 'review:summary-changed':
      return where === 'team' ? `changed the summary of “${str(d.name)}”` : 'changed the summary';
    case 'review:archived':
      return where === 'team' ? `archived the Review “${str(d.name)}”` : 'archived the Review';
    case 'review:restored':
      return where === 'team' ? `restored the Review “${str(d.name)}”` : 'restored the Review';
    case 'basis:updated':
      return `changed the design basis${where === 'team' ? ` of “${str(d.reviewName)}”` : ''}`;
    case 'candidate:added':
      return `added the candidate “${str(d.name)}”${where === 'team' ? ` to “${str(d.reviewName)}”` : ''}`;
    case 'candidate:renamed':
      return `renamed the candidate “${str(d.from)}” to “${str(d.to)}”`;
    case 'candidate:status-changed':
      return `marked the candidate “${str(d.name)}” ${str(d.statusLabel).toLowerCase()}`;
    case 'candidate:recomputed':
      return `changed the parameters of “${str(d.name)}”`;
    case 'round:opened':
      return `opened preference round ${str(d.number)}${inReview}`;
    case 'round:closed':
      return `closed preference round ${str(d.number)}${inReview}`;
    case 'comment:posted':
      return `commented${inReview}`;
    case 'score:changed': {
      const changed = num(d.scored) + num(d.withdrawn);
      const names = Array.isArray(d.candidates) ? d.candidates.map(str).filter(Boolean) : [];
      return `changed ${plural(changed, 'score', 'scores')}${names.length ? ` of ${names.map((n) => `“${n}”`).join(', ')}` : ''}${inReview}`;
    }
    case 'file:added':
      return `attached “${str(d.name)}”${d.candidateName ? ` to “${str(d.candidateName)}”` : ''}${inReview}`;
    case 'file:removed':
      return `removed the file “${str(d.name)}”${inReview}`;
    case 'site-year:updated':
      return `${d.replaced ? 'replaced' : 'stored'} the site year “${str(d.name)}”${inReview}`;
    case 'site-year:removed':
      return `removed the site year “${str(d.name)}”${inReview}`;
    case 'robustness:started':
      return `started a robustness check of ${plural(num(d.samples), 'draw', 'draws')} (seed ${str(d.seed)})${inReview}`;
    case 'robustness:finished':
      return `finished a robustness check of ${plural(num(d.samples), 'draw', 'draws')} (seed ${str(d.seed)})${inReview}`;
    case 'decision:updated':
      return `edited the draft of decision record revision ${str(d.number)}${inReview}`;
    case 'decision:signed':
      return `signed decision record revision ${str(d.number)}${d.chosenName ? `, choosing “${str(d.chosenName)}”` : ''}${inReview}`;
    case 'decision:reopened':
      return `reopened the decision record as revision ${str(d.number)}${inReview}`;
    default: {
      const name = str(d.name);
      return (a.kind as string).replace(/[:._-]+/g, ' ') + (name ? ` “${name}”` : '');
    }
  }
}
