import { describe, expect, it } from 'vitest';
import { VERSION_STATUSES, isApprovedForCustomers } from './designs.js';

describe('isApprovedForCustomers', () => {
  it('lets quotes and compliance reports use approved and released versions only', () => {
    // The four-eyes lifecycle: a customer sees a version only after a second engineer approved it.
    expect(VERSION_STATUSES.filter(isApprovedForCustomers)).toEqual(['approved', 'released']);
  });
});
