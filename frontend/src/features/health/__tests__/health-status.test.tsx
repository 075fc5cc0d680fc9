import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { HEALTH_OK } from '../../../test/fixtures';
import { mockApi } from '../../../test/mock-api';
import { renderWithProviders } from '../../../test/render';
import { HealthStatus } from '../components/health-status';

// Report shape: GET /api/health in the Foundation issue's API contract.

describe('HealthStatus', () => {
  it('names every part when all are up', async () => {
    mockApi({ 'GET /api/health': { status: 200, body: HEALTH_OK } });
    renderWithProviders(<HealthStatus />);

    await screen.findByText(/All services running/);
    expect(screen.getByRole('status', { name: 'Service status' }).textContent).toBe(
      'All services running · Database ok · Redis ok · Queue ok · Worker ok',
    );
  });

  it('reads a degraded report sent with a 503 and says which part is down', async () => {
    mockApi({
      'GET /api/health': { status: 503, body: { ...HEALTH_OK, status: 'degraded', worker: { ok: false } } },
    });
    renderWithProviders(<HealthStatus />);

    await screen.findByText(/Some services are down/);
    expect(screen.getByRole('status', { name: 'Service status' }).textContent).toBe(
      'Some services are down · Database ok · Redis ok · Queue ok · Worker down',
    );
  });

  it('says the status is unknown when the answer has another shape', async () => {
    mockApi({ 'GET /api/health': { status: 200, body: { status: 'ok' } } });
    renderWithProviders(<HealthStatus />);

    expect((await screen.findByText(/Service status unknown/)).textContent).toBe(
      'Service status unknown: The status answer has an unexpected shape.',
    );
  });
});
