import { useQuery } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { useParams, useSearchParams } from 'react-router';
import type { FormulaDetail, Me } from '#shared/api';
import type { Catalog, Formula, Plan } from '#shared/model';
import { scaleFormula, type ScaleResult, type ScaleTarget } from '#shared/scale';
import { Button, ButtonLink } from '../../components/button.tsx';
import { PanelBoundary } from '../../components/error-boundary.tsx';
import { Badge, Notice, PageHeading, Panel, statusTone, statusWord } from '../../components/panel.tsx';
import { QueryState } from '../../components/query-state.tsx';
import { useMe } from '../../features/auth/api/get-me.ts';
import { useFormula } from '../../features/formulas/api/get-formula.ts';
import { AllergensPanel } from '../../features/formulas/components/allergens-panel.tsx';
import { Cautions, cautionsWithIce } from '../../features/formulas/components/cautions.tsx';
import { CostPanel } from '../../features/formulas/components/cost-panel.tsx';
import { BuildTable, DerivedFigures, FinalDoughTable, OverallTable } from '../../features/formulas/components/formula-tables.tsx';
import { FinishesTable } from '../../features/formulas/components/finishes-table.tsx';
import { LabelPanel } from '../../features/formulas/components/label-panel.tsx';
import { ProcessSteps } from '../../features/formulas/components/process-steps.tsx';
import { ScaleControl } from '../../features/formulas/components/scale-control.tsx';
import { WaterTemperatureHelper, type UseFriction } from '../../features/formulas/components/water-temperature.tsx';
import { useFrictionProposal } from '../../features/records/api/get-friction.ts';
import { getPlanQueryOptions } from '../../features/plans/api/get-plan.ts';
import { usePlans } from '../../features/plans/api/get-plans.ts';
import { searchFromTarget, targetFromSearch } from '../../features/formulas/scale-target.ts';
import { getErrorMessage } from '../../lib/errors.ts';
import { shortDateTime } from '../../lib/format.ts';
import { useUnits } from '../../lib/units.ts';
import { paths } from '../paths.ts';

export default function FormulaRoute() {
  const { id = '' } = useParams();
  const query = useFormula(id);
  const me = useMe().data;
  return (
    <QueryState query={query} label="Fetching the formula…">
      {(detail) => <FormulaPage detail={detail} me={me} />}
    </QueryState>
  );
}

function FormulaPage({ detail, me }: { detail: FormulaDetail; me: Me | undefined }) {
  const { weight, pieceWeight } = useUnits();
  const { formula, catalog } = detail;
  const [params, setParams] = useSearchParams();
  const target = targetFromSearch(params, formula);
  const canSeeCost = me?.permissions.includes('read:cost') ?? false;
  const canSeeHistory = me?.permissions.includes('read:history') ?? false;
  const [ice, setIce] = useState(false);

  const targetKey = JSON.stringify(target);
  const { scaled, problem } = useMemo((): { scaled: ScaleResult; problem: string | null } => {
    try {
      return { scaled: scaleFormula(formula, catalog, target), problem: null };
    } catch (error) {
      return { scaled: detail.scaled, problem: getErrorMessage(error) };
    }
    // The target is rebuilt from the URL on every render: its JSON is what identifies it.
  }, [formula, catalog, detail.scaled, targetKey]);

  const setTarget = (t: ScaleTarget) => setParams(searchFromTarget(t, formula), { replace: true, preventScrollReset: true });
  const builds = [...scaled.preferments, ...scaled.soakers];
  const batchLine =
    scaled.pieces !== null && scaled.pieceGrams !== null
      ? `${scaled.pieces} × ${pieceWeight(scaled.pieceGrams)} · mixed dough ${weight(scaled.mixedDough)}`
      : `mixed dough ${weight(scaled.mixedDough)}`;
  const currency = detail.cost?.currency ?? '';

  return (
    <article data-formula={formula.id}>
      <PageHeading
        kicker={
          <span className="inline-flex items-center gap-2">
            {formula.category}
            {formula.status !== 'active' && <Badge tone={statusTone(formula.status)}>{statusWord(formula.status)}</Badge>}
          </span>
        }
        title={formula.title}
      >
        <Button tone="primary" onClick={() => window.print()}>
          Print
        </Button>
        {canSeeHistory && (
          <ButtonLink to={paths.formulaChanges.getHref(formula.id)} tone="plain">
            Changes
          </ButtonLink>
        )}
      </PageHeading>

      {formula.description && <p className="-mt-3 mb-4 max-w-3xl text-lg text-muted print:mb-1 print:text-[9pt]">{formula.description}</p>}

      <p className="mb-4 rounded-xl bg-crumb px-4 py-2 text-lg print:mb-2 print:rounded-none print:border-y print:border-ink print:px-0 print:py-0.5 print:text-[10pt]" data-testid="batch-line">
        <span className="font-semibold">Batch: </span>
        <span className="figure font-bold">{batchLine}</span>
        {scaled.loss > 0 && <span className="text-muted"> · {scaled.loss} % loss allowed</span>}
        <span className="hidden print:inline text-muted"> · revision {detail.revision}, loaded {shortDateTime(detail.updatedAt)}</span>
      </p>

      {/* Below lg the two columns dissolve (display: contents) so `order` can put the batch first and the tables next. */}
      <div className="flex flex-col gap-4 lg:grid lg:grid-cols-[minmax(0,1fr)_24rem] lg:items-start print:block">
        <div className="contents lg:col-start-2 lg:row-start-1 lg:block lg:space-y-4 print:block print:space-y-2">
          <Panel title="Batch size" className="order-1 print:hidden" id="scale">
            <ScaleControl formula={formula} target={target} mixedDough={scaled.mixedDough} onChange={setTarget} />
            {problem && (
              <div className="mt-3">
                <Notice title="Cannot scale to that">{problem}</Notice>
              </div>
            )}
          </Panel>
          <Panel title="Key figures" id="figures" className="order-4 print:mb-2">
            <DerivedFigures scaled={scaled} formula={formula} />
          </Panel>
          <PanelBoundary title="Water for the mix" resetKeys={[formula.id]}>
            <Panel title="Water for the mix" className="order-5 print:mb-2" id="water">
              <WaterPanel formula={formula} scaled={scaled} catalog={catalog} onIce={setIce} />
            </Panel>
          </PanelBoundary>
          {canSeeCost && (
            <PanelBoundary title="Cost" resetKeys={[formula.id]}>
              <Panel title="Ingredient cost" className="order-6 print:hidden" id="cost">
                <CostPanel scaled={scaled} catalog={catalog} currency={currency} />
              </Panel>
            </PanelBoundary>
          )}
        </div>

        <div className="contents lg:col-start-1 lg:row-start-1 lg:block lg:space-y-4 print:block print:space-y-2">
          <div className="order-2 grid gap-4 xl:grid-cols-2 print:grid-cols-2 print:gap-4">
            <Panel title="Whole formula" id="overall">
              <OverallTable scaled={scaled} />
            </Panel>
            <Panel title="Final mix" id="final">
              <FinalDoughTable scaled={scaled} />
            </Panel>
          </div>
          {builds.length > 0 && (
            <Panel title={builds.length === 1 ? 'Build ahead' : 'Builds ahead'} id="builds" className="order-3">
              <div className={`grid gap-4 ${builds.length > 1 ? 'xl:grid-cols-2 print:grid-cols-2' : ''}`}>
                {builds.map((b) => (
                  <BuildTable key={`${b.kind}-${b.name}`} build={b} formula={formula} />
                ))}
              </div>
            </Panel>
          )}
          <Panel title="How it is made" id="process" className="order-7">
            <ProcessSteps steps={formula.process} />
            {formula.finishes.length > 0 && <FinishesTable formula={formula} pieces={scaled.pieces ?? Math.floor(scaled.dividedDough / formula.yield.pieceGrams)} />}
            {formula.notes && <p className="mt-3 text-muted">{formula.notes}</p>}
          </Panel>
          <div className="order-8 grid gap-4 print:grid-cols-[2fr_3fr]">
            <PanelBoundary title="Allergens" resetKeys={[formula.id]}>
              <Panel title="Allergens" id="allergens">
                <AllergensPanel summary={detail.allergens} />
              </Panel>
            </PanelBoundary>
            <Panel title="Take care" id="cautions">
              <Cautions items={cautionsWithIce(detail.cautions, ice)} />
            </Panel>
          </div>
          {detail.label && (
            <PanelBoundary title="Label" resetKeys={[formula.id]}>
              <Panel title="Label: ingredients and nutrition" id="label" className="order-9">
                <LabelPanel label={detail.label} />
              </Panel>
            </PanelBoundary>
          )}
        </div>
      </div>
    </article>
  );
}

/** A bake day's plan for the water helper: fetched once chosen, nothing while none is. */
function useBakeDay(date: string): Plan | undefined {
  return useQuery({ ...getPlanQueryOptions(date), enabled: date !== '' }).data?.plan;
}

/** The water helper wired to the plans: the bake days to start from and their conditions. */
function WaterPanel({ formula, scaled, catalog, onIce }: { formula: Formula; scaled: ScaleResult; catalog: Catalog; onIce: (ice: boolean) => void }) {
  const dates = usePlans().data?.plans.map((p) => p.date) ?? [];
  return <WaterTemperatureHelper formula={formula} scaled={scaled} catalog={catalog} days={{ dates, usePlan: useBakeDay }} onIce={onIce} useFriction={useBenchFriction} />;
}

/** The friction learned from the bench's records, for those who may read records. */
const useBenchFriction: UseFriction = (mixer, formula, date) => {
  const canRead = useMe().data?.permissions.includes('read:record') ?? false;
  return useFrictionProposal(mixer, formula, date, canRead);
};
