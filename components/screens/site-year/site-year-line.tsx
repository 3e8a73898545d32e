import { useSiteYearQuery } from '@/components/data/site-year';
import { PressableLink } from '@/components/ui/pressable-link';
import { Text } from '@/components/ui/text';
import { useUnitSystem } from '@/components/ui/unit-system';

import { siteYearLineText } from './site-year-format';

/**
 * One line for a candidate's board card: its year on the site ("Year: 41.2 GWh · 3 h short"),
 * a link to the Site year screen. Nothing while loading or for a candidate the year does not
 * hold yet. Call useSiteYearLiveUpdates(reviewId) once on the screen that shows these lines.
 */
export function SiteYearLine({ reviewId, candidateId }: { reviewId: string; candidateId: string }) {
  const { system } = useUnitSystem();
  const year = useSiteYearQuery(reviewId);
  const c = year.data?.candidates.find((x) => x.candidateId === candidateId);
  if (!c) return null;
  return (
    <PressableLink
      href={`/reviews/${encodeURIComponent(reviewId)}/site-year`}
      accessibilityLabel="Open the site year"
      testID={`site-year-line-${candidateId}`}
    >
      <Text size="caption" tone="soft" numberOfLines={1}>
        {siteYearLineText(c, system)}
      </Text>
    </PressableLink>
  );
}
