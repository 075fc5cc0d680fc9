import { NAV_SECTIONS } from '@quietglass/shared';
import { SectionNotAvailableRoute } from './section-not-available-route';

// Placeholder until the page is built.
export function ChambersRoute() {
  return <SectionNotAvailableRoute section={NAV_SECTIONS.find((s) => s.key === 'chambers')!} />;
}
