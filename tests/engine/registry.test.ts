import { describe, expect, it } from 'vitest';
import { blockCatalog, evaluateSheet, hashDataset, type SheetBlock } from '@/lib/engine';
import { coerceBlockInput, defaultValue } from '@/lib/engine/block-run';
import { BLOCK_TYPES } from '@/lib/engine/registry';
import { unitTemplate } from '@/lib/engine/unit-format';
import { isClose } from '../support/approx';
import { sheet } from '../support/engine-sheets';

// The contract (CONTRACT.md §4): every type documents itself as data, and its worked example
// evaluates to the stated result.
describe('registry', () => {
  it('should list the contract block types, each once', () => {
    expect(BLOCK_TYPES.map((t) => t.id).sort()).toEqual(
      [
        'quantities', 'formula', 'note', 'hillslope_diffusion', 'hilltop_erosion', 'scarp_forward', 'scarp_age',
        'transport_capacity', 'net_change', 'peclet_number', 'advective_geotherm', 'stream_power',
        'steady_state_channel', 'isostatic_response', 'denudation_conversion', 'channel_march', 'profile_evolution', 'scarp_fit',
        // CONTRACT §4b
        'radiogenic_geotherm', 'strength_envelope', 'orogen_flux_balance', 'plate_flexure', 'cosmogenic_denudation',
        'closure_exhumation',
      ].sort(),
    );
  });

  for (const type of BLOCK_TYPES) {
    describe(type.id, () => {
      it('should carry a title, purpose, sources, help for each input, validity and cautions', () => {
        expect(type.title.length).toBeGreaterThan(0);
        expect(type.purpose.length).toBeGreaterThan(0);
        if (type.id === 'note') return;
        expect(type.sources.length).toBeGreaterThan(0);
        expect(type.cautions.some((c) => /licensed professional practice/.test(c))).toBe(true);
        expect(type.validity.length).toBeGreaterThan(0);
        for (const input of type.inputs) {
          expect(input.help.length, input.name).toBeGreaterThan(10);
          if (input.dimension === 'slope') expect(input.help, input.name).toMatch(/tan/);
          if (input.unitHint && !input.unitHint.includes('(')) expect(unitTemplate(input.unitHint), input.unitHint).not.toBeNull();
        }
      });

      it('should declare output units that parse', () => {
        for (const output of type.outputs) {
          if (output.unit) expect(unitTemplate(output.unit), output.unit).not.toBeNull();
        }
        for (const series of type.series ?? []) {
          expect(unitTemplate(series.xUnit)).not.toBeNull();
          expect(unitTemplate(series.yUnit)).not.toBeNull();
        }
      });

      it('should have defaults that pass their own checks', () => {
        for (const input of type.inputs.filter((i) => i.default !== undefined)) {
          if (input.dimension === 'text') expect(input.choices).toContain(defaultValue(input));
          else if (input.dimension === 'boolean') expect(typeof defaultValue(input)).toBe('boolean');
          else expect(() => coerceBlockInput(input, defaultValue(input))).not.toThrow();
        }
      });

      if (type.example) {
        const example = type.example;
        it(`should evaluate its worked example to the stated result (${example.source})`, () => {
          const block: SheetBlock = { id: 'ex', name: 'example', type: type.id, inputs: example.inputs };
          const datasets = new Map(Object.entries(example.datasets ?? {}));
          for (const [sha256, canonical] of datasets) expect(hashDataset(canonical)).toBe(sha256);
          const result = evaluateSheet(sheet([block]), { datasets }).blocks.example!;
          expect(result.status, result.error).toBe('ok');
          const output = result.outputs[example.output]!;
          expect(output.unit).toBe(example.expected.unit);
          expect(isClose(output.value as number, example.expected.value, example.expected.relTol)).toBe(true);
        });
      }
    });
  }

  it('should give the catalog as plain JSON data', () => {
    const catalog = blockCatalog();
    expect(JSON.parse(JSON.stringify(catalog))).toEqual(catalog);
    expect(catalog.find((t) => t.id === 'scarp_age')!.expressionFunction!.signature).toBe(
      'scarp_age(vertical_offset, [far_field_slope], max_slope, diffusivity)',
    );
  });
});
