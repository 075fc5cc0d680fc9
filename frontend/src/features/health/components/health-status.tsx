import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { useHealth, type HealthReport } from '../api/get-health';

const PARTS: readonly { key: Exclude<keyof HealthReport, 'status'>; label: string }[] = [
  { key: 'database', label: 'Database' },
  { key: 'redis', label: 'Redis' },
  { key: 'queue', label: 'Queue' },
  { key: 'worker', label: 'Worker' },
];

function Dot({ ok }: { ok: boolean }) {
  return (
    <Box
      component="span"
      aria-hidden
      sx={{
        display: 'inline-block',
        width: 8,
        height: 8,
        borderRadius: '50%',
        mr: 0.75,
        bgcolor: ok ? 'success.main' : 'error.main',
      }}
    />
  );
}

/** One line of service status: each part up or down. */
export function HealthStatus() {
  const health = useHealth();

  let text: ReactNode;
  if (health.isPending) text = 'Checking service status…';
  else if (health.isError) text = `Service status unknown: ${health.error.message}`;
  else {
    const report = health.data;
    const allUp = report.status === 'ok' && PARTS.every(({ key }) => report[key].ok);
    text = (
      <>
        <Dot ok={allUp} />
        {allUp ? 'All services running' : 'Some services are down'}
        {PARTS.map(({ key, label }) => (
          <span key={key}>
            {' · '}
            {label} {report[key].ok ? 'ok' : 'down'}
          </span>
        ))}
      </>
    );
  }

  return (
    <Typography variant="body2" color="text.secondary" role="status" aria-label="Service status">
      {text}
    </Typography>
  );
}
