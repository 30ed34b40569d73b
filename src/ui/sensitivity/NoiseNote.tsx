import type { PlanResult } from '../../core/types';
import { SENSITIVITY_DEFAULTS, SKY_MODEL_LABEL, SKY_MODEL_NOTE } from '../../core/stats';
import { kelvin, sig } from '../format';

// The sensitivity model behind the noise figures, stated beside them: the
// radiometer equation with the sky along the drift, the inputs used, the sky
// model's label and what it leaves out (texts from summary.json's sensitivity).

/** One paragraph for a figure caption: the noise model, its inputs and the galactic-plane warning. */
export function noiseCaption(result: PlanResult, freqIndex: number): string {
  const sens = result.summary.sensitivity;
  const bw = sens?.bandwidth_mhz ?? result.scenario.telescope.bandwidth_mhz ?? SENSITIVITY_DEFAULTS.bandwidth_mhz;
  const rx = sens?.receiver_temp_k ?? result.scenario.telescope.receiver_temp_k ?? SENSITIVITY_DEFAULTS.receiver_temp_k;
  const f = result.summary.frequencies[freqIndex];
  const t = f && f.t_sys_k !== undefined ? ` (median T_sys = ${kelvin(f.t_sys_k, 4)} at ${sig(f.mhz, 6)} MHz)` : '';
  return `Noise: radiometer equation with T_sys(t) = T_ant(t) + T_receiver along the drift, samples combined by inverse-variance weighting, bandwidth ${sig(bw, 4)} MHz, receiver ${sig(rx, 4)} K${t}; ` +
    `sky model: ${sens?.sky_model ?? SKY_MODEL_LABEL}. ${sens?.note ?? SKY_MODEL_NOTE}`;
}

export function NoiseNote({ result, freqIndex }: { result: PlanResult; freqIndex: number }) {
  const sens = result.summary.sensitivity;
  const bw = sens?.bandwidth_mhz ?? result.scenario.telescope.bandwidth_mhz ?? SENSITIVITY_DEFAULTS.bandwidth_mhz;
  const rx = sens?.receiver_temp_k ?? result.scenario.telescope.receiver_temp_k ?? SENSITIVITY_DEFAULTS.receiver_temp_k;
  const f = result.summary.frequencies[freqIndex];
  return (
    <div className="noise-note" data-testid="noise-note" style={{ fontSize: '0.82rem', color: 'var(--ink-2)', margin: '6px 0 0' }}>
      <p style={{ margin: '2px 0' }}>
        Noise: radiometer equation with T_sys(t) = T_ant(t) + T_receiver along the drift, each pixel's samples
        combined by inverse-variance weighting (σ_T = 1 / √(bandwidth × Σ B dt / T_sys²)), with a bandwidth of{' '}
        {sig(bw, 4)} MHz and a receiver temperature of {sig(rx, 4)} K
        {f && f.t_sky_k !== undefined && f.t_sys_k !== undefined
          ? `; at ${sig(f.mhz, 6)} MHz median T_ant = ${kelvin(f.t_sky_k, 4)}, median T_sys = ${kelvin(f.t_sys_k, 4)}`
          : ''}
        . Sky model: {sens?.sky_model ?? SKY_MODEL_LABEL}.
      </p>
      <p className="warn" role="note" data-testid="noise-warning" style={{ margin: '2px 0' }}>⚠ {sens?.note ?? SKY_MODEL_NOTE}</p>
    </div>
  );
}
