import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { seriesSchema } from '../../pipeline/core/config/series-schema.js';
import { seriesYamlText } from '../../pipeline/simulate/series-yaml-text.js';
import { simulationSpecSchema } from '../../pipeline/simulate/simulation-spec.js';
import { smallSpec } from './small-spec.js';

describe('simulated series.yaml keeps a layer\'s role (DESIGN.md, "Keys the later issues add": role: reference)', () => {
  it('a sample target with a gold reference layer writes role: reference, and ingest\'s schema reads it back on that layer only', () => {
    const spec = simulationSpecSchema.parse(
      smallSpec({
        targets: [
          { id: 'au-ref', layers: [{ composition: { '197Au': 1 }, areal_density_1e15_per_cm2: 60, areal_density_unc_rel: 0.03 }] },
          {
            id: 'c12-foil',
            layers: [
              { composition: { '12C': 1 }, areal_density_1e15_per_cm2: 150, areal_density_unc_rel: 0.05 },
              { composition: { '197Au': 1 }, areal_density_1e15_per_cm2: 8, areal_density_unc_rel: 0.02, role: 'reference' },
            ],
          },
        ],
      }),
    );
    const text = seriesYamlText(spec);
    expect(text).toContain('role: reference');
    const cfg = seriesSchema.parse(parse(text));
    expect(cfg.targets[1]!.layers.map((l) => l.role)).toEqual([undefined, 'reference']);
    expect(cfg.targets[0]!.layers[0]!.role).toBeUndefined();
  });
});
