import { describe, expect, it } from 'vitest';
import { jobScope, keepInScope } from '../../client/features/jobs/components/job-scope';
import { jobInputSchema } from '../../shared/schemas/jobs';
import { jobInput } from '../factories';

describe('what the job form asks for, from the parts sent and the work ordered', () => {
  it('when only heads are sent for a valve job, then no bore spec is asked, the material is the heads’ and the valve job limits apply', () => {
    const scope = jobScope({ parts: ['heads'], operations: [{ code: 'valve-job' }] });
    expect(scope).toMatchObject({ boreWork: false, deckWork: false, needsMaterial: true, materialLabel: 'Block or head material', limitGroups: ['valveJob'] });
  });

  it('when a job posted before parts were named is opened, then it is a block', () => {
    expect(jobScope({ operations: [{ code: 'bore' }, { code: 'deck' }] })).toMatchObject({ parts: ['block'], boreWork: true, deckWork: true, materialLabel: 'Block material', limitGroups: ['deck'] });
  });

  it('when bore work and a line hone are taken off after their figures were typed, then what is sent leaves them out and passes the schema', () => {
    const typed = jobInput({
      parts: ['crankshaft'],
      operations: [{ code: 'crank-grind', quantity: 1 }],
      limits: { lineHone: { maxTaper: 0.0004 }, crankGrind: { mainStandard: 2.4995, rodStandard: undefined } },
    });
    const sent = keepInScope(typed);
    expect(sent).toMatchObject({ stockBore: undefined, pistonType: undefined, blockMaterial: undefined, limits: { crankGrind: { mainStandard: 2.4995 } } });
    expect(sent.limits).not.toHaveProperty('lineHone');
    expect(jobInputSchema.safeParse(typed).success).toBe(false);
    expect(jobInputSchema.safeParse(sent).success).toBe(true);
    expect(keepInScope({ ...typed, limits: { crankGrind: { rodStandard: undefined } } }).limits).toBeUndefined();
  });
});
