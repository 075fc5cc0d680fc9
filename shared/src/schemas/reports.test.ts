import { describe, expect, it } from 'vitest';
import { createReportSchema } from './reports.js';
import { problems } from './__tests__/problems.js';

const reportProblems = (body: unknown) => problems(createReportSchema, body);

describe('compliance report schema', () => {
  it("shows the layers unless asked, and leaves the mask to the design's own when not named", () => {
    expect(createReportSchema.parse({ designId: 12, versionNumber: 3 })).toEqual({
      designId: 12,
      versionNumber: 3,
      hideLayers: false,
    });
  });

  it.each([
    [{ designId: 'twelve' }, 'designId: Choose the design'],
    [{ versionNumber: 0 }, 'versionNumber: Choose an approved version'],
    [{ specMaskId: 2.5 }, "specMaskId: Choose one of the customer's spec masks"],
    [{ hideLayers: 'yes' }, 'hideLayers: hideLayers must be true or false'],
    [{ runId: Number.NaN, spectrumId: 4 }, 'runId: Enter the run number'],
    [{ runId: 7 }, 'spectrumId: Give the run and its spectrum together'],
    [{ spectrumId: 4 }, 'runId: Give the run and its spectrum together'],
    [{ pages: 2 }, 'Unrecognized key: "pages"'],
  ])('refuses %j', (patch, line) => {
    expect(reportProblems({ designId: 12, versionNumber: 3, ...patch })).toContain(line);
  });

  it('takes a run and its spectrum together', () => {
    expect(reportProblems({ designId: 12, versionNumber: 3, runId: 7, spectrumId: 4 })).toEqual([]);
  });
});
