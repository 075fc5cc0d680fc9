import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { AppProviders } from '../../../app/providers';
import { createQueryClient } from '../../../lib/query-client';
import { mockApi } from '../../../test/mock-api';
import { ShopSettingsPanel } from '../components/shop-settings-panel';

const VIEW = {
  shopName: 'Larkspur Thin Film Works',
  logo: null,
  targetMarginPercent: 0.1,
  version: 0,
  updatedAt: null,
};

function renderPanel() {
  const user = userEvent.setup();
  render(
    <AppProviders queryClient={createQueryClient()}>
      <ShopSettingsPanel />
    </AppProviders>,
  );
  return user;
}

describe('ShopSettingsPanel', () => {
  it('renames the shop with the version read, refusing an empty name', async () => {
    const api = mockApi({
      'GET /api/shop-settings': { status: 200, body: VIEW },
      'PUT /api/shop-settings': { status: 200, body: { ...VIEW, shopName: 'Larkspur Optics', version: 1 } },
    });
    const user = renderPanel();
    const panel = within(await screen.findByRole('region', { name: 'Shop settings' }));
    const name = (await panel.findByLabelText('Shop name')) as HTMLInputElement;
    // The field fills once the settings have loaded.
    await waitFor(() => expect(name.value).toBe('Larkspur Thin Film Works'));
    await user.clear(name);
    await user.click(panel.getByRole('button', { name: 'Save name' }));
    expect(await panel.findByText('The shop needs a name')).toBeTruthy();
    expect(api.calls('PUT', '/api/shop-settings')).toHaveLength(0);
    await user.type(name, '  Larkspur Optics ');
    await user.click(panel.getByRole('button', { name: 'Save name' }));
    await screen.findByText('Shop name saved.');
    expect(api.calls('PUT', '/api/shop-settings')[0]!.body).toEqual({
      shopName: 'Larkspur Optics',
      version: 0,
    });
  });

  it('saves the default target margin with the version read, refusing one outside 0–5 pp', async () => {
    const api = mockApi({
      'GET /api/shop-settings': { status: 200, body: VIEW },
      'PUT /api/shop-settings/target-margin': {
        status: 200,
        body: { ...VIEW, targetMarginPercent: 0.25, version: 1 },
      },
    });
    const user = renderPanel();
    const form = within(await screen.findByRole('form', { name: 'Design defaults' }));
    const field = form.getByLabelText('Default target margin (pp)') as HTMLInputElement;
    await waitFor(() => expect(field.value).toBe('0.1'));
    await user.clear(field);
    await user.type(field, '7');
    await user.click(form.getByRole('button', { name: 'Save margin' }));
    expect(await form.findByText('A number from 0 to 5 percentage points')).toBeTruthy();
    expect(api.calls('PUT', '/api/shop-settings/target-margin')).toHaveLength(0);
    await user.clear(field);
    await user.type(field, '0.25');
    await user.click(form.getByRole('button', { name: 'Save margin' }));
    await screen.findByText('Default target margin saved.');
    expect(api.calls('PUT', '/api/shop-settings/target-margin')[0]!.body).toEqual({
      targetMarginPercent: 0.25,
      version: 0,
    });
    await waitFor(() => expect(field.value).toBe('0.25'));
  });

  it('refuses a logo that is not PNG or JPEG, or too large, before sending it', async () => {
    const api = mockApi({ 'GET /api/shop-settings': { status: 200, body: VIEW } });
    const user = userEvent.setup({ applyAccept: false });
    render(
      <AppProviders queryClient={createQueryClient()}>
        <ShopSettingsPanel />
      </AppProviders>,
    );
    const input = await screen.findByLabelText('Logo file');
    await user.upload(input, new File(['GIF89a'], 'logo.gif', { type: 'image/gif' }));
    expect((await screen.findByRole('alert')).textContent).toBe('The logo must be a PNG or JPEG image');
    await user.upload(input, new File([new Uint8Array(512 * 1024 + 1)], 'big.png', { type: 'image/png' }));
    expect((await screen.findByRole('alert')).textContent).toBe('The logo must be at most 512 KB');
    expect(api.calls('PUT', '/api/shop-settings/logo')).toHaveLength(0);
  });

  it('uploads a PNG as base64 with the version read', async () => {
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    const api = mockApi({
      'GET /api/shop-settings': { status: 200, body: VIEW },
      'PUT /api/shop-settings/logo': {
        status: 200,
        body: { ...VIEW, logo: { contentType: 'image/png', bytes: 8 }, version: 1 },
      },
    });
    const user = renderPanel();
    await user.upload(
      await screen.findByLabelText('Logo file'),
      new File([png], 'logo.png', { type: 'image/png' }),
    );
    await screen.findByText('Logo uploaded.');
    expect(api.calls('PUT', '/api/shop-settings/logo')[0]!.body).toEqual({
      contentType: 'image/png',
      dataBase64: 'iVBORw0KGgo=',
      version: 0,
    });
    expect(await screen.findByRole('img', { name: 'Shop logo' })).toBeTruthy();
  });
});
