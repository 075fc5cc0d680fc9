import Box from '@mui/material/Box';
import Card from '@mui/material/Card';
import CardActionArea from '@mui/material/CardActionArea';
import CardContent from '@mui/material/CardContent';
import Typography from '@mui/material/Typography';
import { navSectionsFor } from '@quietglass/shared';
import { Link as RouterLink } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { HealthStatus } from '../../features/health/components/health-status';
import { ROLE_LABELS } from '../../lib/roles';
import { SECTION_SUMMARIES } from '../sections';

export function HomeRoute() {
  const user = useSignedInUser();
  const sections = navSectionsFor(user.role);

  return (
    <>
      <PageHeader
        title={`Welcome, ${user.displayName}`}
        description={`Signed in as ${ROLE_LABELS[user.role]}. These are the sections your role can use.`}
      />
      <Box
        component="ul"
        aria-label="Your sections"
        sx={{
          listStyle: 'none',
          p: 0,
          m: 0,
          mb: 4,
          display: 'grid',
          gap: 2,
          gridTemplateColumns: 'repeat(auto-fill, minmax(240px, 1fr))',
        }}
      >
        {sections.map((section) => (
          <li key={section.key}>
            <Card sx={{ height: '100%' }}>
              <CardActionArea component={RouterLink} to={section.path} sx={{ height: '100%' }}>
                <CardContent>
                  <Typography variant="h3" component="h2" gutterBottom>
                    {section.label}
                  </Typography>
                  <Typography variant="body2" color="text.secondary">
                    {SECTION_SUMMARIES[section.key]}
                  </Typography>
                </CardContent>
              </CardActionArea>
            </Card>
          </li>
        ))}
      </Box>
      <HealthStatus />
    </>
  );
}
