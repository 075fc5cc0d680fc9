import Box from '@mui/material/Box';
import { useState } from 'react';
import { PageHeader } from '../../components/page-header';
import { OutboxGrid } from '../../features/outbox/components/outbox-grid';
import { OutboxMessage } from '../../features/outbox/components/outbox-message';

export function OutboxRoute() {
  const [selectedId, setSelectedId] = useState<number | null>(null);
  return (
    <>
      <PageHeader
        title="Outbox"
        description="Every e-mail the local SMTP fake received (it stands in when no mail server is configured), with its attachments."
      />
      <Box sx={{ display: 'grid', gap: 3 }}>
        <OutboxGrid selectedId={selectedId} onSelect={setSelectedId} />
        {selectedId !== null && <OutboxMessage id={selectedId} />}
      </Box>
    </>
  );
}
