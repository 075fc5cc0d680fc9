import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { STAFF } from '../../../test/fixtures';
import { mockApi } from '../../../test/mock-api';
import { renderApp } from '../../../test/render';
import type { OutboxMessageView } from '../api/get-outbox';
import { formatSize } from '../components/outbox-message';

// The outbox API (backend/src/mail/outbox.controller.ts): messages the local SMTP fake received,
// newest first, with their attachments; each attachment at /outbox/:id/attachments/:aid.

const MESSAGE: OutboxMessageView = {
  id: 8,
  from: 'Larkmoor Optics <quotes@larkmoor-optics.example>',
  to: 'buyer@fenwick.example',
  subject: 'Quote Q-21: Ø25 mm lens, AR one side',
  text: 'Dear Fenwick Optics Lab,\n\nplease find our quote Q-21.\n\n  from 100 pcs: 31.00 EUR per part',
  receivedAt: '2026-12-02T09:30:00.000Z',
  attachments: [
    { id: 13, filename: 'compliance-report-4.pdf', contentType: 'application/pdf', size: 48_213 },
  ],
};
const OTHER: OutboxMessageView = {
  ...MESSAGE,
  id: 7,
  to: 'lab@marlow.example',
  subject: 'Password reset',
  text: 'Hello',
  receivedAt: '2026-12-01T09:30:00.000Z',
  attachments: [],
};

describe('outbox', () => {
  it('lists the message with its quote, and shows its body and attachment link', async () => {
    const api = mockApi({
      'GET /api/auth/session': { status: 200, body: { user: STAFF.admin } },
      'GET /api/outbox': { status: 200, body: [MESSAGE, OTHER] },
      'GET /api/outbox/8': { status: 200, body: MESSAGE },
    });
    const { user } = renderApp('/admin/outbox');

    const grid = await screen.findByRole('grid', { name: 'Outbox' });
    await waitFor(() => expect(within(grid).getAllByRole('row')).toHaveLength(3));
    const row = within(grid)
      .getByText('Quote Q-21: Ø25 mm lens, AR one side')
      .closest('[role="row"]') as HTMLElement;
    expect(within(row).getByText('buyer@fenwick.example')).toBeTruthy();
    expect(within(row).getByRole('link', { name: 'Q-21' }).getAttribute('href')).toBe('/quotes/21');
    expect(within(row).getByText('1')).toBeTruthy();
    const other = within(grid).getByText('Password reset').closest('[role="row"]') as HTMLElement;
    expect(within(other).queryByRole('link')).toBeNull();

    await user.click(within(row).getByText('buyer@fenwick.example'));
    const message = await screen.findByRole('article', {
      name: 'Message: Quote Q-21: Ø25 mm lens, AR one side',
    });
    expect(message.textContent).toContain('from 100 pcs: 31.00 EUR per part');
    const link = within(message).getByRole('link', { name: 'compliance-report-4.pdf' });
    expect(link.getAttribute('href')).toBe('/api/outbox/8/attachments/13');
    expect(link.getAttribute('download')).toBe('compliance-report-4.pdf');
    // 48 213 B / 1024 = 47.08 KiB.
    expect(message.textContent).toContain('application/pdf, 47.1 KiB');
    expect(api.unexpected).toEqual([]);
  });

  it('states sizes in B, KiB and MiB (1 KiB = 1024 B)', () => {
    expect(formatSize(900)).toBe('900 B');
    expect(formatSize(1536)).toBe('1.5 KiB');
    expect(formatSize(3 * 1024 * 1024)).toBe('3.0 MiB');
  });
});
