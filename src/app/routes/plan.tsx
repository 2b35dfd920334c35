import { useParams } from 'react-router';
import type { PlanDetail } from '#shared/api';
import { Button, buttonClass } from '../../components/button.tsx';
import { PanelBoundary } from '../../components/error-boundary.tsx';
import { Notice, PageHeading, Panel } from '../../components/panel.tsx';
import { QueryState } from '../../components/query-state.tsx';
import { usePlan } from '../../features/plans/api/get-plan.ts';
import { useDayRecords } from '../../features/records/components/day-records.tsx';
import { OutboxStatus } from '../../features/records/components/outbox-status.tsx';
import { FrictionProposals } from '../../features/records/components/friction-proposals.tsx';
import type { FrictionProposal } from '../../features/records/api/types.ts';
import { BuildCard, Conditions, FormulaTotals, MixCard, PickList } from '../../features/plans/components/plan-sheet.tsx';
import { TimelineChart } from '../../features/plans/components/timeline-chart.tsx';
import { longDate } from '../../lib/format.ts';
import { paths } from '../paths.ts';

export default function PlanRoute() {
  const { date = '' } = useParams();
  const query = usePlan(date);
  return (
    <QueryState query={query} label="Working out the batch sheet…">
      {(detail) => <PlanPage detail={detail} />}
    </QueryState>
  );
}

function PlanPage({ detail }: { detail: PlanDetail }) {
  const { sheet } = detail;
  const builds = [...sheet.preferments, ...sheet.soakers].sort((a, b) => (a.mixFrom ?? a.mixUntil).localeCompare(b.mixFrom ?? b.mixUntil));
  const titles = new Map(sheet.formulas.map((f) => [f.formula, f.title]));
  const titleOf = (id: string) => titles.get(id) ?? id;
  const mixes = [...sheet.mixes].sort((a, b) => a.start.localeCompare(b.start));
  const records = useDayRecords(sheet.date);
  return (
    <article data-plan={sheet.date}>
      <PageHeading kicker={`Bake day · first bake out by ${sheet.readyBy.slice(11)}`} title={longDate(sheet.date)}>
        <Button tone="primary" onClick={() => window.print()}>
          Print
        </Button>
        <a href={paths.planPdf.getHref(sheet.date)} download={`panform-${sheet.date}.pdf`} className={buttonClass('plain')}>
          Download PDF
        </a>
      </PageHeading>

      <div className="space-y-4 print:space-y-2">
        <OutboxStatus date={sheet.date} />
        {records.problem && <Notice title="The bench's records could not be fetched">{records.problem}</Notice>}
        {(sheet.notes || sheet.warnings.length > 0) && (
          <div className="space-y-2">
            {sheet.notes && <Notice tone="info">{sheet.notes}</Notice>}
            {sheet.warnings.length > 0 && (
              <Notice title="Check before you start">
                <ul className="list-disc pl-5">
                  {sheet.warnings.map((w) => (
                    <li key={w}>{w}</li>
                  ))}
                </ul>
              </Notice>
            )}
          </div>
        )}
        <Panel title="Conditions" id="conditions">
          <Conditions sheet={sheet} />
          <FrictionProposals proposals={(sheet as { frictionProposals?: FrictionProposal[] }).frictionProposals ?? []} />
        </Panel>
        <PanelBoundary title="Timeline" resetKeys={[sheet.date]}>
          <Panel title="The night at a glance" id="timeline">
            <TimelineChart sheet={sheet} />
          </Panel>
        </PanelBoundary>
        {builds.length > 0 && (
          <Panel title="Builds to make ahead" id="builds">
            <div className="grid gap-3 lg:grid-cols-2 print:grid-cols-2">
              {builds.map((b) => (
                <BuildCard key={`${b.formula}-${b.name}-${b.batch}`} build={b} date={sheet.date} titleOf={titleOf}>
                  {records.forBuild(b)}
                </BuildCard>
              ))}
            </div>
          </Panel>
        )}
        <Panel title="Mixes" id="mixes">
          <div className="grid gap-3 lg:grid-cols-2 print:grid-cols-2">
            {mixes.map((m) => (
              <MixCard key={`${m.order}-${m.mixNumber}`} mix={m} date={sheet.date}>
                {records.forMix(m)}
              </MixCard>
            ))}
          </div>
        </Panel>
        <div className="grid gap-4 lg:grid-cols-2 print:grid-cols-2">
          <Panel title="Pick list" id="pick">
            <PickList sheet={sheet} />
          </Panel>
          <Panel title="Products" id="products">
            <FormulaTotals sheet={sheet} />
          </Panel>
        </div>
        <Panel title="Take care" id="cautions">
          <ul className="space-y-2" data-testid="cautions">
            {sheet.cautions.map((c) => (
              <li key={c.topic + c.text} className="flex gap-2">
                <span aria-hidden="true" className="mt-0.5 font-bold text-ember">
                  ▲
                </span>
                <span>{c.text}</span>
              </li>
            ))}
          </ul>
        </Panel>
      </div>
    </article>
  );
}
