import { iceCaution, mergeCautions, type Caution } from '#shared/cautions';

/** The server's cautions for the formula (shared/cautions.ts), with ice once the water helper weighs some in. */
export function cautionsWithIce(fromServer: Caution[], ice: boolean): Caution[] {
  return ice ? mergeCautions(fromServer, [iceCaution()]) : fromServer;
}

export function Cautions({ items }: { items: Caution[] }) {
  return (
    <ul className="space-y-2 print:space-y-0" data-testid="cautions">
      {items.map((c) => (
        <li key={c.topic} className="flex gap-2" data-topic={c.topic}>
          <span aria-hidden="true" className="mt-0.5 font-bold text-ember">
            ▲
          </span>
          <span>{c.text}</span>
        </li>
      ))}
    </ul>
  );
}
