import { describe, expect, it } from 'vitest';
import { customerInputSchema, customerUpdateSchema, customerVersionSchema } from './customers.js';
import { problems } from './__tests__/problems.js';

describe('customer schemas', () => {
  it('fills a new customer with no e-mail, notes or contacts', () => {
    expect(customerInputSchema.parse({ name: ' Quillon Optics ' })).toEqual({
      name: 'Quillon Optics',
      contactEmail: null,
      notes: '',
      contacts: [],
    });
  });

  it('keeps addresses trimmed and in lower case; an empty quote e-mail means none', () => {
    const parsed = customerInputSchema.parse({
      name: 'Tessaly Lens Works',
      contactEmail: '  ',
      contacts: [
        { name: ' Ona Vell ', email: ' Ona@Tessaly.example ', role: ' purchasing ', phone: '' },
        { name: 'Pim Arro', email: 'pim@tessaly.example', role: ' ' },
      ],
    });
    expect(parsed.contactEmail).toBeNull();
    expect(parsed.contacts).toEqual([
      { name: 'Ona Vell', email: 'ona@tessaly.example', role: 'purchasing' },
      { name: 'Pim Arro', email: 'pim@tessaly.example' },
    ]);
    expect(customerInputSchema.parse({ name: 'Q', contactEmail: 'Buyer@Q.example' }).contactEmail).toBe(
      'buyer@q.example',
    );
  });

  it.each([
    [{ name: '  ' }, 'name: Enter a customer name'],
    [{ name: 'x'.repeat(161) }, 'name: At most 160 characters'],
    [{ contactEmail: 'nope' }, 'contactEmail: Enter a valid e-mail address'],
    [{ contactEmail: 7 }, 'contactEmail: Enter an e-mail address, or leave it empty'],
    [{ notes: 'x'.repeat(4001) }, 'notes: At most 4000 characters'],
    [
      { contacts: [{ name: 'Ona', email: 'ona at tessaly' }] },
      'contacts.0.email: Enter a valid e-mail address',
    ],
    [{ contacts: [{ name: ' ', email: 'ona@t.example' }] }, "contacts.0.name: Enter the contact's name"],
    [
      { contacts: [{ name: 'Ona', email: 'ona@t.example', role: 'r'.repeat(81) }] },
      'contacts.0.role: At most 80 characters',
    ],
    [
      { contacts: [{ name: 'Ona', email: 'ona@t.example', phone: '1'.repeat(41) }] },
      'contacts.0.phone: At most 40 characters',
    ],
    [
      { contacts: [{ name: 'Ona', email: 'ona@t.example', fax: '1' }] },
      'contacts.0: Unrecognized key: "fax"',
    ],
    [{ contacts: Array(21).fill({ name: 'Ona', email: 'ona@t.example' }) }, 'contacts: At most 20 contacts'],
    [{ contacts: 'Ona' }, 'contacts: contacts must be a list of contacts'],
  ])('refuses %j', (patch, line) => {
    expect(problems(customerInputSchema, { name: 'Quillon Optics', ...patch })).toContain(line);
  });

  it('an edit leaves out what stays, clears the e-mail with null, and needs the version', () => {
    expect(customerUpdateSchema.parse({ name: 'Quillon Optics', version: 3 })).toEqual({
      name: 'Quillon Optics',
      version: 3,
    });
    expect(customerUpdateSchema.parse({ name: 'Q', contactEmail: null, version: 3 }).contactEmail).toBeNull();
    expect(problems(customerUpdateSchema, { name: 'Q' })).toEqual([
      'version: version must be the version number last read',
    ]);
    expect(problems(customerVersionSchema, { version: 0 })).toEqual(['version: version must be at least 1']);
  });
});
