import { deckPositions } from '../../lib/section-fields';
import { LiveSection, ReadingTable, unitShort, type SectionContext } from './section-kit';

/** The deck's straightedge readings by position (generated from the cylinder count) and the deck height at the four corners. */
export function DeckPositionFields({ ctx }: { ctx: SectionContext }) {
  const positions = deckPositions(ctx.job.cylinders);
  const u = unitShort(ctx);
  return (
    <>
      <ReadingTable
        ctx={ctx}
        caption={`Straightedge readings by position (${u}); positions left empty are left out`}
        rows={positions.map(({ position }) => position.charAt(0).toUpperCase() + position.slice(1))}
        columns={[{ label: 'Thickest feeler', path: (i) => `deck.straightedge.${positions[i].position}` }]}
      />
      <ReadingTable
        ctx={ctx}
        caption={`Deck height, crank centreline to deck (${u}), optional`}
        rows={['Front', 'Rear']}
        columns={[
          { label: 'Left', path: (i) => `deck.heights.${i === 0 ? 'frontLeft' : 'rearLeft'}` },
          { label: 'Right', path: (i) => `deck.heights.${i === 0 ? 'frontRight' : 'rearRight'}` },
        ]}
      />
      <LiveSection ctx={ctx} operation="deck" />
    </>
  );
}
