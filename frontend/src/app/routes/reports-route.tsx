import { NAV_SECTIONS } from '@quietglass/shared';
import { SectionNotAvailableRoute } from './section-not-available-route';

// Placeholder until the page is built.
export function ReportsRoute() {
  return <SectionNotAvailableRoute section={NAV_SECTIONS.find((s) => s.key === 'reports')!} />;
}
