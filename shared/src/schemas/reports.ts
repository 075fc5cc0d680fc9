/*
 * What the new-report form sends and the API accepts for a compliance report: an approved or
 * released design version, the mask to judge it against, and optionally a run's measured spectrum.
 */
import { z } from 'zod';
import { recordId } from './common.js';

export const createReportSchema = z
  .strictObject({
    designId: recordId('Choose the design'),
    versionNumber: recordId('Choose an approved version'),
    /** The design's own spec mask when left out. */
    specMaskId: recordId("Choose one of the customer's spec masks").optional(),
    /** Shops often do not disclose the design: hide the layer table. */
    hideLayers: z.boolean({ error: 'hideLayers must be true or false' }).default(false),
    /** Report a run's measured spectrum instead of the designed values: both or neither. */
    runId: recordId('Enter the run number').optional(),
    spectrumId: recordId('Enter the spectrum number').optional(),
  })
  .superRefine(({ runId, spectrumId }, ctx) => {
    if ((runId === undefined) !== (spectrumId === undefined))
      ctx.addIssue({
        code: 'custom',
        path: [runId === undefined ? 'runId' : 'spectrumId'],
        message: 'Give the run and its spectrum together',
      });
  });
export type CreateReportInput = z.output<typeof createReportSchema>;
