import Alert from '@mui/material/Alert';
import type { NavSection } from '@quietglass/shared';
import { PageHeader } from '../../components/page-header';

/** Placeholder for a section this release does not have yet: says so, offers nothing. */
export function SectionNotAvailableRoute({ section }: { section: NavSection }) {
  return (
    <>
      <PageHeader title={section.label} />
      <Alert severity="info" sx={{ maxWidth: 640 }}>
        {section.label} is not available yet in this release.
      </Alert>
    </>
  );
}
