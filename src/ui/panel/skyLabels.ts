import type { SkySpec } from '../../core/types';

// Names of the sky models as the app shows them (README "Sky models" states each model).

export const SKY_MODEL_LABELS: Record<SkySpec['model'], string> = {
  galaxy: 'galaxy (analytic)',
  uniform: 'uniform (high-latitude average)',
  map: 'your HEALPix map',
};

export function skyLabel(model: SkySpec['model']): string {
  return SKY_MODEL_LABELS[model];
}
