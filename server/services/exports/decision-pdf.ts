import { scaleLinear } from 'd3-scale';
import PDFDocument from 'pdfkit';

import type { Database } from '@/db/client';
import type { CandidateWire } from '@/server/contracts/board';
import type { DecisionRevision, DecisionSnapshot } from '@/server/contracts/decision';
import { exportCaution, type Matrix, type MatrixCell } from '@/server/contracts/matrix';
import type { Listener } from '@/server/contracts/news';

import { getDecision, getRevision, takeSnapshot } from '../decision';
import { reviewFileSlug } from '../matrix-exports';
import { reviewOf } from '../reviews';

/** The caution line of the product (components/ui/caution-line.tsx), on every page. */
const pdfCautionText = exportCaution;

const fonts = {
  sans: require.resolve('@expo-google-fonts/ibm-plex-sans/400Regular/IBMPlexSans_400Regular.ttf'),
  sansBold: require.resolve('@expo-google-fonts/ibm-plex-sans/600SemiBold/IBMPlexSans_600SemiBold.ttf'),
  mono: require.resolve('@expo-google-fonts/ibm-plex-mono/400Regular/IBMPlexMono_400Regular.ttf'),
};

const ink = '#1E2327';
const muted = '#5B6166';
const hairline = '#D9D3C7';
const brick = '#A8322D';
const moss = '#4F7A35';

const margin = 48;
const footerSpace = 44;

type Doc = PDFKit.PDFDocument;

/**
 * The mono face here has no usable word space or thin space (the font reader refuses the one,
 * the other has no outline): a cell goes in the mono face only when it is a bare figure.
 */
const monoFits = (text: string) => /^[0-9.,%()\-\u2212\u2013]+$/.test(text);

/** 3–4 significant figures with a thin grouping space, as on the screens. */
function fig(value: unknown, significant = 4): string {
  if (typeof value !== 'number' || !Number.isFinite(value)) return '—';
  const rounded = Number(value.toPrecision(significant));
  const [int, frac] = String(Math.abs(rounded) >= 1e21 ? rounded.toExponential() : rounded).split('.');
  const digits = int!.replace('-', '');
  const grouped = digits.length > 4 ? int!.replace(/\B(?=(\d{3})+(?!\d))/g, '\u2009') : int!;
  return frac ? `${grouped}.${frac}` : grouped;
}

const pct = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? `${fig(v * 100, 3)} %` : '—');

const utc = (iso: string) => `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;

type Path = { kind: string; temperatureK: number[]; entropyKJPerKgK: number[] };

function pathsOf(c: CandidateWire): Path[] {
  const paths = (c.results as { paths?: unknown } | null)?.paths;
  if (!Array.isArray(paths)) return [];
  return paths.filter(
    (p): p is Path => !!p && Array.isArray((p as Path).temperatureK) && Array.isArray((p as Path).entropyKJPerKgK),
  );
}

class Writer {
  readonly doc: Doc;
  readonly width: number;
  constructor(doc: Doc) {
    this.doc = doc;
    this.width = doc.page.width - 2 * margin;
  }
  get bottom() {
    return this.doc.page.height - margin - footerSpace;
  }
  /** A new page when `height` does not fit below the current line. */
  room(height: number) {
    if (this.doc.y + height > this.bottom) this.doc.addPage();
  }
  heading(text: string) {
    this.room(60);
    this.doc.moveDown(0.8).font('SansBold').fontSize(13).fillColor(ink).text(text, margin, this.doc.y);
    const y = this.doc.y + 2;
    this.doc
      .moveTo(margin, y)
      .lineTo(margin + this.width, y)
      .lineWidth(0.5)
      .strokeColor(hairline)
      .stroke();
    this.doc.moveDown(0.4);
  }
  para(text: string, options: { size?: number; colour?: string; font?: string } = {}) {
    this.doc
      .font(options.font ?? 'Sans')
      .fontSize(options.size ?? 10)
      .fillColor(options.colour ?? ink)
      .text(text, margin, this.doc.y, { width: this.width });
  }
  /** A table with a first column of labels; numbers in the mono face, right-aligned. */
  table(head: string[], rows: string[][], firstWidth = 170, numbers = true) {
    const cols = head.length - 1;
    const colWidth = cols > 0 ? (this.width - firstWidth) / cols : 0;
    const line = (cells: string[], bold: boolean): void => {
      const mono = (i: number) => numbers && i > 0 && !bold && monoFits(cells[i]!);
      const align = (i: number) => (numbers && i > 0 ? 'right' : 'left');
      const heights = cells.map((cell, i) =>
        this.doc
          .font(bold ? 'SansBold' : mono(i) ? 'Mono' : 'Sans')
          .fontSize(8.5)
          .heightOfString(cell, { width: (i === 0 ? firstWidth : colWidth) - 6 }),
      );
      const h = Math.max(...heights) + 6;
      // A table carried onto a new page starts again with its header row.
      if (!bold && this.doc.y + h > this.bottom) {
        this.doc.addPage();
        line(head, true);
      }
      this.room(h);
      const y = this.doc.y;
      cells.forEach((cell, i) => {
        const x = i === 0 ? margin : margin + firstWidth + (i - 1) * colWidth;
        this.doc
          .font(bold ? 'SansBold' : mono(i) ? 'Mono' : 'Sans')
          .fontSize(8.5)
          .fillColor(ink)
          .text(cell, x + 3, y + 3, {
            width: (i === 0 ? firstWidth : colWidth) - 6,
            align: align(i),
          });
      });
      this.doc
        .moveTo(margin, y + h)
        .lineTo(margin + this.width, y + h)
        .lineWidth(0.4)
        .strokeColor(hairline)
        .stroke();
      this.doc.x = margin;
      this.doc.y = y + h;
    };
    line(head, true);
    for (const row of rows) line(row, false);
    this.doc.moveDown(0.3);
  }
}

/** The T-s overlay: every candidate's process paths as vector polylines in its colour, axes with units. */
function drawOverlay(w: Writer, candidates: CandidateWire[]) {
  const drawn = candidates.map((c) => ({ c, paths: pathsOf(c) })).filter((x) => x.paths.length > 0);
  if (drawn.length === 0) {
    w.para('No candidate has computed results to draw.', { colour: muted });
    return;
  }
  const height = 250;
  w.room(height + 60);
  const doc = w.doc;
  const top = doc.y + 6;
  const left = margin + 44;
  const right = margin + w.width - 8;
  const bottom = top + height;
  const all = drawn.flatMap((x) => x.paths);
  const s = all.flatMap((p) => p.entropyKJPerKgK).filter(Number.isFinite);
  const t = all.flatMap((p) => p.temperatureK).filter(Number.isFinite);
  const x = scaleLinear()
    .domain([Math.min(...s), Math.max(...s)])
    .nice()
    .range([left, right]);
  const y = scaleLinear()
    .domain([Math.min(...t), Math.max(...t)])
    .nice()
    .range([bottom, top]);

  doc.save();
  doc.lineWidth(0.3).strokeColor(hairline);
  for (const tick of y.ticks(6)) doc.moveTo(left, y(tick)).lineTo(right, y(tick)).stroke();
  for (const tick of x.ticks(8)) doc.moveTo(x(tick), top).lineTo(x(tick), bottom).stroke();
  doc
    .lineWidth(0.8)
    .strokeColor(ink)
    .rect(left, top, right - left, height)
    .stroke();
  doc.font('Mono').fontSize(7).fillColor(muted);
  for (const tick of y.ticks(6)) doc.text(fig(tick), margin, y(tick) - 4, { width: 40, align: 'right' });
  for (const tick of x.ticks(8)) doc.text(fig(tick, 3), x(tick) - 20, bottom + 3, { width: 40, align: 'center' });
  doc.font('Sans').fontSize(8).fillColor(ink);
  doc.text('Specific entropy s, kJ/(kg·K)', left, bottom + 14, { width: right - left, align: 'center' });
  doc.save().rotate(-90, { origin: [margin + 4, top + height / 2] });
  doc.text('Temperature T, K', margin + 4 - 60, top + height / 2 - 4, { width: 120, align: 'center' });
  doc.restore();

  for (const { c, paths } of drawn) {
    doc.lineWidth(1.4).strokeColor(c.colour).lineJoin('round');
    for (const p of paths) {
      const n = Math.min(p.temperatureK.length, p.entropyKJPerKgK.length);
      if (n < 2) continue;
      doc.moveTo(x(p.entropyKJPerKgK[0]!), y(p.temperatureK[0]!));
      for (let i = 1; i < n; i++) doc.lineTo(x(p.entropyKJPerKgK[i]!), y(p.temperatureK[i]!));
      doc.stroke();
    }
  }
  doc.restore();

  // Legend under the chart, one swatch and name per candidate.
  let lx = left;
  let ly = bottom + 30;
  doc.font('Sans').fontSize(8.5);
  for (const { c } of drawn) {
    const label = c.name;
    const wLabel = doc.widthOfString(label) + 24;
    if (lx + wLabel > right) {
      lx = left;
      ly += 13;
    }
    doc.rect(lx, ly + 2, 12, 4).fill(c.colour);
    doc.fillColor(ink).text(label, lx + 16, ly - 1, { lineBreak: false });
    lx += wLabel;
  }
  doc.x = margin;
  doc.y = ly + 18;
}

/** A rule as one sentence, ending in one full stop. */
const sentence = (s: string) => `${s.trim().replace(/\.+$/, '')}.`;

/** A cell as text: the mean (lowest–highest, how many scored); a missing score is said, never zero. */
function cellText(cell: MatrixCell | undefined): string {
  if (!cell || cell.value === null) return 'not scored';
  if (cell.mean === null || cell.count === 0) return `${fig(cell.value, 3)} (pre-score)`;
  const spread =
    cell.min !== null && cell.max !== null ? ` (${fig(cell.min, 2)}–${fig(cell.max, 2)}, ${cell.count})` : '';
  return `${fig(cell.mean, 3)}${spread}`;
}

/** The comparison matrix: figures with units, each criterion with its weight and scores, totals, ranks. */
function drawMatrix(w: Writer, matrix: Matrix, candidates: CandidateWire[]) {
  const head = ['', ...candidates.map((c) => c.name)];
  w.table(
    ['Engine figure', ...candidates.map((c) => c.name)],
    matrix.figures.map((f) => {
      return [
        `${f.label}, ${f.unit}`,
        ...candidates.map((c) => {
          const v = f.values[c.id];
          return typeof v === 'number' ? fig(v) : '—';
        }),
      ];
    }),
  );
  if (matrix.criteria.length === 0) {
    w.para('The design basis has no criteria.', { colour: muted });
    return;
  }
  head[0] = 'Criterion (weight)';
  const rows = matrix.criteria.map((cr) => {
    const row = matrix.rows.find((r) => r.criterionId === cr.id);
    return [`${cr.name} (${fig(cr.weight, 3)})`, ...candidates.map((c) => cellText(row?.cells[c.id]))];
  });
  rows.push([
    'Weighted total (1–5)',
    ...candidates.map((c) => {
      const t = matrix.totals[c.id];
      if (!t || t.total === null) return 'no total';
      return `${fig(t.total, 3)}${t.incomplete ? ' incomplete' : ''}`;
    }),
  ]);
  rows.push([
    'Rank',
    ...candidates.map((c) => {
      const r = matrix.ranks[c.id];
      return typeof r === 'number' ? String(r) : '—';
    }),
  ]);
  w.table(head, rows, 150);
  w.para(
    `Cells: mean score 1–5 (lowest–highest, how many scored). ${sentence(matrix.rules.preScore)} ${sentence(matrix.rules.total)}`,
    {
      size: 7.5,
      colour: muted,
    },
  );
}

type PdfData = {
  reviewName: string;
  revision: DecisionRevision;
  snapshot: DecisionSnapshot;
  live: boolean;
};

/** Draws the decision record on A4 and resolves with the bytes. */
/**
 * "How sure": the site year (hot and cold days, the year's figures) and the robustness run
 * (how often each candidate ranks first, its 5–95 % bands), as the snapshot keeps them.
 */
function drawHowSure(w: Writer, snapshot: DecisionSnapshot, candidates: CandidateWire[]) {
  const year = snapshot.siteYear;
  if (year) {
    w.heading('Site year');
    w.para(
      (year.profile
        ? `Hourly profile of ${fig(year.profile.hours)} h (${fig(year.profile.minK - 273.15, 3)} to ${fig(year.profile.maxK - 273.15, 3)} °C), `
        : 'No hourly profile: rating curve only, ') +
        `${fig(year.firedHoursPerYear)} fired hours a year. A fixed machine sized at the basis ambient (same inlet volume flow, design pressure ratio and temperatures): a first-order estimate without component maps, for comparing candidates.`,
      { size: 8.5 },
    );
    const of = (id: string) => year.candidates.find((y) => y.candidateId === id);
    w.table(
      ['Figure', ...candidates.map((c) => c.name)],
      [
        ['Hot-day capacity, kW', ...candidates.map((c) => fig(of(c.id)?.hotDayKW))],
        ['Cold-day capacity, kW', ...candidates.map((c) => fig(of(c.id)?.coldDayKW))],
        ['Energy a year, MWh', ...candidates.map((c) => fig(of(c.id)?.annual?.energyMWh))],
        ['Fuel a year, t', ...candidates.map((c) => fig(of(c.id)?.annual?.fuelTonnes))],
        ['CO2 a year, t', ...candidates.map((c) => fig(of(c.id)?.annual?.co2Tonnes))],
        ['Mean heat rate, kJ/kWh', ...candidates.map((c) => fig(of(c.id)?.annual?.meanHeatRateKJPerKWh))],
        ['Fired hours short of the required power, h', ...candidates.map((c) => fig(of(c.id)?.annual?.shortfallHours))],
      ],
    );
  }
  const run = snapshot.robustness;
  w.heading('How sure is the ranking');
  if (!run || !run.firstPlace) {
    w.para('No robustness check had finished when this record was made.', { size: 9 });
    return;
  }
  w.para(
    `${fig(run.samples)} draws, seed ${run.seed}${run.stale ? ' — out of date: the board changed after this run' : ''}. ${run.method}`,
    { size: 8.5 },
  );
  const band = (b: { p5: number; p95: number } | null | undefined, scale = 1, digits = 3) =>
    b ? `${fig(b.p5 * scale, digits)}–${fig(b.p95 * scale, digits)}` : '—';
  w.table(
    ['Figure', ...candidates.map((c) => c.name)],
    [
      [
        'Ranks first',
        ...candidates.map((c) => (run.firstPlace![c.id] === undefined ? '—' : pct(run.firstPlace![c.id]))),
      ],
      ['Efficiency 5–95 %, %', ...candidates.map((c) => band(run.bands?.[c.id]?.thermalEfficiency, 100))],
      ['Net specific work 5–95 %, kJ/kg', ...candidates.map((c) => band(run.bands?.[c.id]?.netWorkKJPerKg, 1, 4))],
      ['Fuel a year 5–95 %, t', ...candidates.map((c) => band(run.bands?.[c.id]?.annualFuelTonnes, 1, 4))],
    ],
  );
}

export function drawDecisionPdf({ reviewName, revision, snapshot }: PdfData): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: margin, left: margin, right: margin, bottom: margin },
    bufferPages: true,
    info: {
      Title: `Decision record — ${reviewName} — revision ${revision.number}`,
      Author: revision.signedBy?.name ?? 'Cyclemoot',
      Subject: 'Decision record',
      Creator: 'Cyclemoot',
    },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  doc.registerFont('Sans', fonts.sans);
  doc.registerFont('SansBold', fonts.sansBold);
  doc.registerFont('Mono', fonts.mono);
  const w = new Writer(doc);
  const signed = revision.status === 'signed';
  const candidates = snapshot.candidates;
  const nameOf = (id: string | null) =>
    candidates.find((c) => c.id === id)?.name ?? 'a candidate no longer in the Review';

  doc.font('SansBold').fontSize(20).fillColor(ink).text('Decision record', margin, margin);
  w.para(reviewName, { size: 13 });
  w.para(`Revision ${revision.number} · ${signed ? 'Signed' : 'Draft'}`, { size: 10, colour: muted });
  if (!signed) {
    doc.moveDown(0.3);
    w.para('DRAFT — not signed', { font: 'SansBold', size: 14, colour: brick });
    w.para(`Figures as the board stands at ${utc(snapshot.takenAt)}; they will change until the record is signed.`, {
      size: 8.5,
      colour: muted,
    });
  } else {
    w.para(`Figures as the board stood when signed, ${utc(snapshot.takenAt)}.`, { size: 8.5, colour: muted });
  }
  doc.moveDown(0.4);
  w.para(pdfCautionText, { size: 8.5, colour: muted });

  w.heading('Chosen candidate');
  w.para(revision.chosenCandidateId ? nameOf(revision.chosenCandidateId) : 'None chosen yet.', {
    font: 'SansBold',
    size: 12,
    colour: revision.chosenCandidateId ? moss : muted,
  });

  w.heading('Rationale');
  w.para(revision.rationale || '—');
  w.heading('Assumptions');
  w.para(revision.assumptions || '—');

  // The chart's heading goes with it onto the next page when it does not fit.
  w.room(340);
  w.heading('T-s diagram of the candidates');
  drawOverlay(w, candidates);

  w.heading(signed ? 'Comparison matrix (as signed)' : 'Comparison matrix (live)');
  drawMatrix(w, snapshot.matrix, candidates);

  drawHowSure(w, snapshot, candidates);

  const basis = snapshot.designBasis;
  w.heading('Design basis');
  w.table(
    ['Quantity', 'Value'],
    [
      ['Ambient temperature, K', fig(basis.ambient.temperatureK)],
      ...(basis.ambient.pressureKPa !== undefined ? [['Ambient pressure, kPa', fig(basis.ambient.pressureKPa)]] : []),
      ...(basis.ambient.elevationM !== undefined ? [['Site elevation, m', fig(basis.ambient.elevationM)]] : []),
      ['Relative humidity', pct(basis.ambient.relativeHumidity)],
      ['Fuel hydrogen, volume fraction', pct(basis.fuel.hydrogenVolumeFraction)],
      ['Required net power, kW', fig(basis.netPowerKW)],
      ['Generator efficiency', pct(basis.generatorEfficiency)],
      ['Property model', basis.fluid],
      ['Criteria (weight)', basis.criteria.map((c) => `${c.name} (${fig(c.weight, 3)})`).join(', ')],
    ],
    200,
    false,
  );

  const closed = snapshot.rounds.filter((r) => r.tally);
  if (closed.length > 0) {
    w.heading('Preference rounds');
    w.table(
      ['Round', ...candidates.map((c) => c.name)],
      closed.map((r) => [
        `Round ${r.number}${r.status === 'open' ? ' (open)' : ''}, ${r.voters} voted`,
        ...candidates.map((c) => `${r.tally?.[c.id] ?? 0} votes`),
      ]),
    );
  }

  w.heading('Rejected alternatives');
  if (revision.rejected.length === 0) w.para('None recorded.', { colour: muted });
  for (const r of revision.rejected) {
    w.room(30);
    w.para(nameOf(r.candidateId), { font: 'SansBold' });
    w.para(r.reason);
    doc.moveDown(0.3);
  }

  w.heading('Recorded dissent');
  if (revision.dissent.length === 0) w.para('None recorded.', { colour: muted });
  for (const d of revision.dissent) {
    w.room(30);
    w.para(d.name, { font: 'SansBold' });
    w.para(d.text);
    doc.moveDown(0.3);
  }

  w.heading('Open actions');
  if (revision.actions.length === 0) w.para('None recorded.', { colour: muted });
  else
    w.table(
      ['Action', 'Owner', 'Due'],
      revision.actions.map((a) => [a.text, a.owner, a.due]),
      260,
      false,
    );

  w.heading('Signature');
  w.room(50);
  if (signed && revision.signedBy && revision.signedAt) {
    w.para(`Signed by ${revision.signedBy.name}`, { font: 'SansBold', size: 11 });
    w.para(`on ${utc(revision.signedAt)}, revision ${revision.number}`);
  } else {
    w.para('Not signed. This draft is not a decision.', { font: 'SansBold', colour: brick });
  }

  // Footer on every page: the caution line and the page number.
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottomMargin = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const y = doc.page.height - margin - 22;
    doc
      .moveTo(margin, y - 4)
      .lineTo(margin + w.width, y - 4)
      .lineWidth(0.4)
      .strokeColor(hairline)
      .stroke();
    doc
      .font('Sans')
      .fontSize(7)
      .fillColor(muted)
      .text(`${pdfCautionText}`, margin, y, { width: w.width - 60, lineBreak: true });
    doc.text(`${signed ? '' : 'DRAFT · '}Page ${i + 1} of ${range.count}`, margin + w.width - 60, y, {
      width: 60,
      align: 'right',
    });
    doc.page.margins.bottom = bottomMargin;
  }
  doc.end();
  return done;
}

/**
 * The PDF of a review's decision record: the current revision, or `revisionNumber`. A signed
 * one is drawn from its snapshot; a draft from the board as it is now, marked as a draft.
 */
export async function decisionPdfOf(
  db: Database,
  reviewId: string,
  revisionNumber: number | undefined,
  viewer: Listener,
): Promise<{ bytes: Buffer; fileName: string }> {
  const revision =
    revisionNumber === undefined
      ? (await getDecision(db, reviewId)).current
      : await getRevision(db, reviewId, revisionNumber);
  const review = await reviewOf(db, reviewId);
  const live = revision.status !== 'signed' || !revision.snapshot;
  const snapshot = live ? await takeSnapshot(db, reviewId, viewer) : revision.snapshot!;
  const bytes = await drawDecisionPdf({ reviewName: review.name, revision, snapshot, live });
  return {
    bytes,
    fileName: `decision-record-${reviewFileSlug(review.name)}-r${revision.number}${live ? '-draft' : ''}.pdf`,
  };
}
