import type { UnitSystem } from '#shared/units';
import { Segmented } from '../../../components/segmented.tsx';
import { getErrorMessage } from '../../../lib/errors.ts';
import { useUnitSystem } from '../../../lib/units.ts';
import { useUpdatePreferences } from '../api/update-preferences.ts';

const SYSTEMS = [
  ['metric', 'Metric: g, kg, °C'],
  ['us', 'US: oz, lb, °F'],
] as const;

/** The person's units for every weight and temperature on screen and in prints. */
export function UnitsSetting() {
  const system = useUnitSystem();
  const update = useUpdatePreferences();
  return (
    <div data-testid="units-setting">
      <Segmented<UnitSystem> label="Units" options={SYSTEMS} value={system} onChange={(unitSystem) => update.mutate({ unitSystem })} optionClassName="flex-1" />
      <p className="mt-2 text-muted">
        Kept on this device and on your account. US weights use the exact pound (453.592 37 g) and ounce, °F = 1.8 × °C + 32, as the
        command line does.
      </p>
      {update.isError && <p className="mt-2 text-ember">Not saved on your account: {getErrorMessage(update.error)}</p>}
    </div>
  );
}
