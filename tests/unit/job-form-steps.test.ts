import { describe, expect, it } from 'vitest';
import { jobFieldsSchema } from '../../shared/schemas/jobs';
import { jobFormSteps, stepOfPath } from '../../client/features/jobs/components/job-form-steps';

describe('the job form steps', () => {
  it('hold every top-level field of the shared job schema exactly once, and no other', () => {
    // The form reads its list of fields from the steps (so the page need not load zod to know them).
    const fields = jobFormSteps.flatMap((step) => step.fields);
    expect(new Set(fields).size).toBe(fields.length);
    expect([...fields].sort()).toEqual(Object.keys(jobFieldsSchema.shape).sort());
  });

  it('open the step holding a nested path, and the first step for an unknown one', () => {
    expect(stepOfPath('limits.lineHone.housingMax')).toBe(1);
    expect(stepOfPath('operations.0.quantity')).toBe(0);
    expect(stepOfPath('neededBy')).toBe(2);
    expect(stepOfPath('nothing')).toBe(0);
  });
});
