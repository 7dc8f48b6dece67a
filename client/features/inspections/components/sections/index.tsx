/**
 * The record's sections beyond the bore grid, deck, finish and crosshatch:
 * one per kind of work the job orders (several honing operations share one).
 */
import type { ReactNode } from 'react';
import { findOperation } from '@shared/catalogue';
import { SECTION_KEYS } from '../../lib/section-fields';
import { BalanceSection } from './balance';
import { CamBoreSection } from './cam-bore';
import { CleanSection } from './clean';
import { CrackTestSection } from './crack-test';
import { CrankGrindSection } from './crank-grind';
import { HeadResurfaceSection } from './head-resurface';
import { HoneSection } from './hone';
import { LineHoneSection } from './line-hone';
import type { SectionContext } from './section-kit';
import { SleeveSection } from './sleeve';
import { ValveJobSection } from './valve-job';

export type { SectionContext } from './section-kit';
export { DeckPositionFields } from './deck';

const RENDER: Record<string, (ctx: SectionContext, code: string) => ReactNode> = {
  clean: (ctx) => <CleanSection ctx={ctx} />,
  crackTest: (ctx) => <CrackTestSection ctx={ctx} />,
  hone: (ctx, code) => <HoneSection ctx={ctx} operation={code} title={findOperation(code)?.name ?? 'Hone'} />,
  lineHone: (ctx) => <LineHoneSection ctx={ctx} />,
  camBore: (ctx) => <CamBoreSection ctx={ctx} />,
  sleeve: (ctx) => <SleeveSection ctx={ctx} />,
  headResurface: (ctx) => <HeadResurfaceSection ctx={ctx} />,
  valveJob: (ctx) => <ValveJobSection ctx={ctx} />,
  crankGrind: (ctx) => <CrankGrindSection ctx={ctx} />,
  balance: (ctx) => <BalanceSection ctx={ctx} />,
};

/** The sections of the job's ordered operations, in the job's order, each input section once; `only` narrows to some. */
export function OrderedSections({ ctx, only, except }: { ctx: SectionContext; only?: readonly string[]; except?: readonly string[] }) {
  const seen = new Set<string>();
  return (
    <>
      {ctx.job.spec.operations.map(({ code }) => {
        const key = SECTION_KEYS[code as keyof typeof SECTION_KEYS];
        if (!key || seen.has(key) || (only && !only.includes(key)) || except?.includes(key)) return null;
        seen.add(key);
        return <div key={key}>{RENDER[key](ctx, code)}</div>;
      })}
    </>
  );
}
