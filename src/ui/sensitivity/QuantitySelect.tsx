import type { SkyQuantity } from '../skymap/SkyMap';

// What the sky map colours: exposure in hours, radiometer noise in kelvin, or the sky model's brightness temperature in kelvin.

export function QuantitySelect({ value, onChange, disabled, note, skyTemp = true }: {
  value: SkyQuantity;
  onChange: (q: SkyQuantity) => void;
  disabled?: boolean;
  /** why it is disabled, shown as the tooltip */
  note?: string;
  /** whether the result carries the sky model's brightness (PlanResult.sky_k) */
  skyTemp?: boolean;
}) {
  return (
    <span className="ctl" style={{ display: 'inline-flex', alignItems: 'center', gap: 6 }}>
      <label htmlFor="view-quantity">Map shows</label>
      <select id="view-quantity" style={{ width: 'auto' }} value={value} disabled={disabled} title={note}
        onChange={(e) => onChange(e.target.value as SkyQuantity)}>
        <option value="exposure">Exposure (h)</option>
        <option value="noise">Noise (K)</option>
        <option value="sky" disabled={!skyTemp}>Sky temperature (K)</option>
      </select>
    </span>
  );
}
