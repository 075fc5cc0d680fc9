import { describe, expect, it } from 'vitest';
import { isCustomerSpecification, specMaskLabel, SPEC_MASK_KINDS } from './customers.js';

describe('spec mask kinds', () => {
  it('only customer specifications may stand in reports and quotes', () => {
    expect(SPEC_MASK_KINDS.filter((kind) => isCustomerSpecification({ kind }))).toEqual(['customer']);
  });

  it('an internal design target says so wherever it is named', () => {
    expect(specMaskLabel({ name: 'HVS-2210 lens AR', revision: 'A', kind: 'customer' })).toBe(
      'HVS-2210 lens AR rev A',
    );
    expect(specMaskLabel({ name: 'HVS-2210 tight', revision: 'T', kind: 'internal' })).toBe(
      'HVS-2210 tight rev T (internal design target)',
    );
  });
});
