import { Platform, StyleSheet, View } from 'react-native';

import { isApiError } from '@/components/data/api-error';
import { useBoardQuery, useReviewLiveUpdates } from '@/components/data/board';
import {
  useDeleteSiteYear,
  useSiteYearLiveUpdates,
  useSiteYearQuery,
  useUploadSiteYear,
  type ProfileFile,
} from '@/components/data/site-year';
import { RatingCurve } from '@/components/diagrams/rating-curve';
import { BackLink } from '@/components/ui/back-link';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { CautionLine } from '@/components/ui/caution-line';
import { formatDateTime, siteTemperature, type UnitSystem } from '@/components/ui/format';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Heading, Quantity, Text } from '@/components/ui/text';
import { useTheme } from '@/components/ui/theme';
import { space } from '@/components/ui/tokens';
import { useUnitSystem } from '@/components/ui/unit-system';
import type { CandidateWire } from '@/server/contracts/board';
import { roleAllows } from '@/server/contracts/roles';
import type { CandidateYear, SiteYearSummary } from '@/server/contracts/site-year';

import { FiredHoursForm } from './fired-hours-form';
import { annualRows, capacity, firstOrderLine, powerCapLine } from './site-year-format';

/** Opens the browser's file picker for one CSV (web only). */
function pickCsv(onFile: (file: ProfileFile) => void) {
  if (Platform.OS !== 'web' || typeof document === 'undefined') return;
  const input = document.createElement('input');
  input.type = 'file';
  input.accept = '.csv,text/csv,text/plain';
  input.setAttribute('data-testid', 'site-year-file-input');
  input.style.display = 'none';
  input.addEventListener('change', () => {
    const file = input.files?.[0];
    input.remove();
    if (file) onFile(file);
  });
  document.body.appendChild(input);
  input.click();
}

/**
 * The site's year: the hourly ambient profile on the design basis (upload a CSV, replace,
 * remove), and per candidate its fixed machine's rating curve, hot- and cold-day capacity
 * against the required power and its year at the basis's fired hours.
 */
export function SiteYearScreen({ reviewId }: { reviewId: string }) {
  const { system } = useUnitSystem();
  const board = useBoardQuery(reviewId);
  const year = useSiteYearQuery(reviewId);
  useReviewLiveUpdates(reviewId);
  useSiteYearLiveUpdates(reviewId);
  const upload = useUploadSiteYear(reviewId);
  const remove = useDeleteSiteYear(reviewId);
  const canEdit = !!board.data && roleAllows(board.data.myRole, { basis: ['update'] });
  const eyebrow = board.data ? `Review · ${board.data.review.name}` : 'Review';
  const back = (
    <BackLink
      href={`/reviews/${encodeURIComponent(reviewId)}`}
      to="Board"
      label="Back to the board"
      testID="back-to-board"
    />
  );

  let body;
  if (year.error) body = <ErrorState error={year.error} onRetry={() => void year.refetch()} />;
  else if (board.error) body = <ErrorState error={board.error} onRetry={() => void board.refetch()} />;
  else if (!year.data || !board.data) body = <LoadingState label="Loading the site year…" />;
  else {
    const y = year.data;
    const b = board.data;
    const uploadError = upload.error && isApiError(upload.error) ? upload.error : null;
    const rowLines = uploadError?.fieldErrors.file ?? [];
    body = (
      <View style={styles.stack}>
        <View style={styles.notes} testID="site-year-notes">
          <Text size="small" tone="soft" testID="site-year-first-order">
            {firstOrderLine}
          </Text>
          <Text size="small" tone="soft">
            {powerCapLine}
          </Text>
        </View>
        <Card style={styles.card} testID="site-year-profile">
          <Heading level={2}>Hourly ambient profile</Heading>
          {y.profile ? (
            <ProfileSummary profile={y.profile} system={system} />
          ) : (
            <Text tone="soft" testID="site-year-no-profile">
              No profile yet: each candidate shows its rating curve alone. Upload a CSV with one row per hour (time or
              hour, dry-bulb temperature in °C or K, relative humidity in % or as a fraction, pressure in kPa optional),
              8760 or 8784 rows, or fewer with an hours column saying what each stands for.
            </Text>
          )}
          <Text size="small" tone="soft" testID="site-year-fired-hours">
            Fired hours per year (design basis): <Quantity size="small" value={String(y.firedHoursPerYear)} unit="h" />
          </Text>
          {canEdit ? <FiredHoursForm key={b.designBasis.revision} reviewId={reviewId} basis={b.designBasis} /> : null}
          {canEdit ? (
            <View style={styles.actions}>
              <Button
                label={y.profile ? 'Replace with a CSV' : 'Upload a CSV'}
                busy={upload.isPending}
                onPress={() => pickCsv((file) => upload.mutate(file))}
                testID="site-year-upload"
              />
              {y.profile ? (
                <Button
                  label="Remove the profile"
                  variant="danger"
                  busy={remove.isPending}
                  onPress={() => remove.mutate()}
                  testID="site-year-remove"
                />
              ) : null}
            </View>
          ) : (
            <Text size="caption" tone="muted">
              The Lead or the Owner uploads the profile.
            </Text>
          )}
          {upload.error ? (
            <View style={styles.errors} testID="site-year-errors" role="alert">
              <Text weight="medium" tone="danger">
                The file was not stored.{' '}
                {uploadError && rowLines.length > 1 ? 'Fix these rows and upload it again:' : ''}
              </Text>
              {rowLines.length > 0 ? (
                rowLines.map((line, i) => (
                  <Text key={i} size="small" tone="danger" testID="site-year-error-row">
                    {line}
                  </Text>
                ))
              ) : (
                <Text size="small" tone="danger">
                  {upload.error.message}
                </Text>
              )}
              {uploadError && rowLines.length > 0 && uploadError.message.match(/more not listed/) ? (
                <Text size="caption" tone="muted">
                  {uploadError.message.replace(/^.*— /, '')}
                </Text>
              ) : null}
            </View>
          ) : null}
        </Card>
        {y.candidates.length === 0 ? (
          <EmptyState title="No candidates yet" testID="site-year-empty">
            Add a candidate on the board; its rating curve and year appear here.
          </EmptyState>
        ) : (
          y.candidates.map((c) => {
            const candidate = b.candidates.find((x) => x.id === c.candidateId);
            return candidate ? (
              <CandidateYearCard
                key={c.candidateId}
                year={c}
                candidate={candidate}
                profile={y.profile}
                designK={b.designBasis.ambient.temperatureK}
                system={system}
              />
            ) : null;
          })
        )}
      </View>
    );
  }
  return (
    <Screen title="Site year" eyebrow={eyebrow} footer={<CautionLine />} testID="site-year-screen">
      {back}
      {body}
    </Screen>
  );
}

function ProfileSummary({ profile, system }: { profile: SiteYearSummary; system: UnitSystem }) {
  return (
    <View style={styles.summary} testID="site-year-summary">
      <Text size="small" testID="site-year-summary-file">
        {profile.fileName} · {profile.rows === profile.hours ? `${profile.rows} hourly rows` : `${profile.rows} rows`}{' '}
        standing for <Quantity size="small" value={String(profile.hours)} unit="h" />
      </Text>
      <View style={styles.figures}>
        <Figure label="Coldest" {...siteTemperature(profile.minK, system)} testID="site-year-min" />
        <Figure label="Mean" {...siteTemperature(profile.meanK, system)} testID="site-year-mean" />
        <Figure label="Warmest" {...siteTemperature(profile.maxK, system)} testID="site-year-max" />
      </View>
      <Text size="caption" tone="muted">
        {profile.hasPressure
          ? 'Pressure from the file, hour by hour.'
          : 'Pressure: the design basis pressure every hour.'}{' '}
        {profile.uploadedBy ? `Uploaded by ${profile.uploadedBy.name}` : 'Uploaded'} ·{' '}
        {formatDateTime(profile.updatedAt)}
      </Text>
    </View>
  );
}

function Figure({ label, value, unit, testID }: { label: string; value: string; unit: string; testID?: string }) {
  return (
    <View style={styles.figure}>
      <Text size="caption" tone="muted">
        {label}
      </Text>
      <Quantity value={value} unit={unit} testID={testID} />
    </View>
  );
}

function CandidateYearCard({
  year,
  candidate,
  profile,
  designK,
  system,
}: {
  year: CandidateYear;
  candidate: CandidateWire;
  profile: SiteYearSummary | null;
  designK: number;
  system: UnitSystem;
}) {
  const t = useTheme();
  const hot = capacity(year.hotDayKW, year.requiredKW, system);
  const cold = capacity(year.coldDayKW, year.requiredKW, system);
  return (
    <Card
      style={[styles.card, { borderLeftWidth: 4, borderLeftColor: candidate.colour }]}
      testID={`site-year-candidate-${candidate.id}`}
    >
      <Heading level={2}>{candidate.name}</Heading>
      {year.error ? (
        <Text tone="danger" testID="site-year-candidate-error">
          No figures: {year.error}
        </Text>
      ) : (
        <>
          <View style={styles.figures}>
            <Figure
              label={`Hot day (${siteTemperature(year.hotDayK, system).value} ${siteTemperature(year.hotDayK, system).unit})`}
              {...hot.power}
              testID="site-year-hot-day"
            />
            <Figure
              label={`Cold day (${siteTemperature(year.coldDayK, system).value} ${siteTemperature(year.coldDayK, system).unit})`}
              {...cold.power}
              testID="site-year-cold-day"
            />
            <Figure label="Required" {...hot.required} />
          </View>
          <Text size="small" tone={hot.short ? 'danger' : 'soft'} testID="site-year-hot-day-verdict">
            {hot.short
              ? `On the hot day it gives ${hot.shareText} of the required power.`
              : 'It gives the required power on the hot day.'}
          </Text>
          {year.annual ? (
            <View style={styles.figures} testID="site-year-annual">
              {annualRows(year.annual, system).map((row) => (
                <Figure key={row.label} label={row.label} value={row.value} unit={row.unit} testID={row.testID} />
              ))}
            </View>
          ) : (
            <Text size="small" tone="muted">
              The year&apos;s figures need a profile.
            </Text>
          )}
          <RatingCurve
            curve={year.ratingCurve}
            requiredKW={year.requiredKW}
            designK={designK}
            profileRange={profile ? { minK: profile.minK, maxK: profile.maxK } : null}
            colour={candidate.colour === '#F0E442' ? t.text : candidate.colour}
            unitSystem={system}
            testID={`rating-curve-${candidate.id}`}
          />
        </>
      )}
    </Card>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space[2] },
  notes: { gap: space.half },
  card: { gap: space[1], padding: space[2] },
  summary: { gap: space.half },
  figures: { flexDirection: 'row', flexWrap: 'wrap', gap: space[2] },
  figure: { minWidth: 120, gap: 2 },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space[1] },
  errors: { gap: space.half },
});
