import { useParams } from 'react-router';
import { Button, buttonClass } from '../../components/button.tsx';
import { PanelBoundary } from '../../components/error-boundary.tsx';
import { Notice } from '../../components/panel.tsx';
import { QueryState } from '../../components/query-state.tsx';
import type { Sheet } from '#shared/sheet/types';
import { usePlan } from '../../features/plans/api/get-plan.ts';
import { BakeDay } from '../../features/plans/components/bake-day.tsx';
import { minuteOnPlan } from '../../features/plans/lib/bake-days.ts';
import { useClock } from '../../features/plans/lib/use-clock.ts';
import { useDayRecords } from '../../features/records/components/day-records.tsx';
import { OutboxStatus } from '../../features/records/components/outbox-status.tsx';
import { paths } from '../paths.ts';

export default function PlanRoute() {
  const { date = '' } = useParams();
  const query = usePlan(date);
  return (
    <QueryState query={query} label="Working out the batch sheet…">
      {({ sheet }) => (
        <PanelBoundary title="Bake day" resetKeys={[sheet.date]}>
          <PlanPage sheet={sheet} />
        </PanelBoundary>
      )}
    </QueryState>
  );
}

function PlanPage({ sheet }: { sheet: Sheet }) {
  const clock = useClock();
  const records = useDayRecords(sheet.date);
  return (
    <BakeDay
      sheet={sheet}
      now={minuteOnPlan(sheet.date, clock)}
      mixExtra={records.forMix}
      buildExtra={records.forBuild}
      top={
        <>
          <OutboxStatus date={sheet.date} />
          {records.problem && <Notice title="The bench's records could not be fetched">{records.problem}</Notice>}
        </>
      }
      actions={
        <>
          <Button tone="primary" onClick={() => window.print()}>
            Print
          </Button>
          <a href={paths.planPdf.getHref(sheet.date)} download={`panform-${sheet.date}.pdf`} className={buttonClass('plain')}>
            Download PDF
          </a>
        </>
      }
    />
  );
}
