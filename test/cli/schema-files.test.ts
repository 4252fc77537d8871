import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { jsonSchemaOf } from '../../src/cli/schema-command.js';

// The published JSON Schemas are generated from the validator; a change to one without the other fails here.
describe('docs/*.schema.json', () => {
  it.each([
    ['seam', 'docs/seam-file.schema.json'],
    ['limits', 'docs/limits-file.schema.json'],
  ] as const)('the %s schema in %s matches the validator', (name, path) => {
    const committed: unknown = JSON.parse(readFileSync(path, 'utf8'));
    expect(committed).toEqual(JSON.parse(jsonSchemaOf(name)));
  });

  it('states the physical ranges, e.g. the toe angle 90–180° of the seam-file vocabulary', () => {
    const schema = JSON.parse(jsonSchemaOf('seam')) as {
      properties: {
        readings: { items: { properties: { values: { properties: Record<string, unknown> } } } };
      };
    };
    expect(schema.properties.readings.items.properties.values.properties.toeAngle).toMatchObject({
      minimum: 90,
      maximum: 180,
    });
  });
});
