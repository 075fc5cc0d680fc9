/*
 * What the customer form sends and the API accepts: a customer's name, quote e-mail, notes and
 * contact people, and the version token of an archive or restore.
 */
import { z } from 'zod';
import { CUSTOMER_LIMITS as L, type CustomerContact } from '../customers.js';
import { optionalText, requiredText, versionToken } from './common.js';
import { emailField } from './users.js';

/** Short optional text, trimmed; left out when empty. */
function optionalLine(max: number) {
  return z
    .string({ error: 'Must be text' })
    .trim()
    .max(max, { error: `At most ${max} characters` })
    .optional();
}

/** A contact person; empty role and phone are left out, as they are stored. */
export const customerContactSchema = z
  .strictObject({
    name: requiredText("Enter the contact's name", L.contactName),
    email: emailField,
    role: optionalLine(L.contactRole),
    phone: optionalLine(L.contactPhone),
  })
  .transform(({ role, phone, ...contact }): CustomerContact => ({
    ...contact,
    ...(role ? { role } : {}),
    ...(phone ? { phone } : {}),
  }));

/** Where quotes go by default: an address, or null (empty text) for none. */
export const quoteEmailField = z
  .string({ error: 'Enter an e-mail address, or leave it empty' })
  .trim()
  .transform((text) => (text === '' ? null : text))
  .pipe(emailField.nullable())
  .nullable();

const customerName = requiredText('Enter a customer name', L.name);
const contactsField = z
  .array(customerContactSchema, { error: 'contacts must be a list of contacts' })
  .max(L.contacts, { error: `At most ${L.contacts} contacts` });

/** A new customer; what is left out is empty. */
export const customerInputSchema = z.strictObject({
  name: customerName,
  contactEmail: quoteEmailField.default(null),
  notes: optionalText(L.notes),
  contacts: contactsField.default([]),
});
export type CustomerInput = z.output<typeof customerInputSchema>;

/** An edit from the version it started from; of e-mail, notes and contacts, what is left out stays. */
export const customerUpdateSchema = z.strictObject({
  name: customerName,
  contactEmail: quoteEmailField.optional(),
  notes: optionalText(L.notes).unwrap().optional(),
  contacts: contactsField.optional(),
  version: versionToken,
});
export type CustomerUpdate = z.output<typeof customerUpdateSchema>;

/** Archiving or restoring names the version it was decided on, like every edit. */
export const customerVersionSchema = z.strictObject({ version: versionToken });
export type CustomerVersionInput = z.output<typeof customerVersionSchema>;
