import type { NavSection } from '@quietglass/shared';

/** One line per section for the home page's cards. */
export const SECTION_SUMMARIES: Readonly<Record<NavSection['key'], string>> = {
  designs: 'Layer stacks and their versions.',
  materials: 'Refractive-index data of the coating materials in use.',
  customers: 'Customers, their contacts and everything on record for them.',
  masks: "Customers' reflectance and transmittance limits.",
  queue: 'Calculations that are running or waiting.',
  recipes: 'Designs released for the chamber.',
  runs: 'Deposition runs and their measured results.',
  chambers: 'Coating chambers: tooling factors, rates and monitor wavelengths.',
  reports: 'Spec-compliance PDFs for customers.',
  quotes: 'Prices and lead times offered to customers.',
  outbox: 'E-mail sent by Quietglass, with its attachments.',
  audit: 'Who submitted, approved, released and retired which version.',
  users: 'Accounts, roles and passwords.',
};
