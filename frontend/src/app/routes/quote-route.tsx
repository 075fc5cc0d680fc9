import { NAV_SECTIONS } from '@quietglass/shared';
import { SectionNotAvailableRoute } from './section-not-available-route';

// Placeholder until the page is built.
export function QuoteRoute() {
  return <SectionNotAvailableRoute section={NAV_SECTIONS.find((s) => s.key === 'quotes')!} />;
}
