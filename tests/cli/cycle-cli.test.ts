import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { describe, expect, it } from 'vitest';

import { irrCombustion, variant } from '@/tests/engine/cases';

const root = join(__dirname, '..', '..');
// The 2+2 combustion case, burning methane.
const input = variant(irrCombustion, (c) => (c.fuel.hydrogenVolumeFraction = 0));

function run(args: string[], stdin?: string) {
  const result = spawnSync(process.execPath, ['--import', 'tsx', 'server/cli/cycle.ts', ...args], {
    cwd: root,
    input: stdin,
    encoding: 'utf8',
  });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

describe('cycle CLI', () => {
  const dir = mkdtempSync(join(tmpdir(), 'cycle-cli-'));
  const file = join(dir, 'cycle.json');
  writeFileSync(file, JSON.stringify(input));

  it('evaluates a file', () => {
    const { code, stdout } = run([file]);
    expect(code).toBe(0);
    const result = JSON.parse(stdout);
    expect(result.states[0].label).toBe('compressor inlet');
    expect(result.thermalEfficiency).toBeGreaterThan(0.3);
    expect(result.thermalEfficiency).toBeLessThan(0.7);
    expect(result.paths.length).toBe(result.states.length);
  });

  it('reads stdin and answers an array with an array', () => {
    const { code, stdout } = run(['-'], JSON.stringify([input, { ...input, regenerator: null }]));
    expect(code).toBe(0);
    const results = JSON.parse(stdout);
    expect(results).toHaveLength(2);
    expect(results[0].thermalEfficiency).toBeGreaterThan(results[1].thermalEfficiency);
  });

  it('prints one CSV row per input', () => {
    const { code, stdout } = run(['--csv', '-'], JSON.stringify([input, input, input]));
    expect(code).toBe(0);
    const lines = stdout.trim().split('\n');
    expect(lines).toHaveLength(4);
    expect(lines[0].split(',')).toContain('thermalEfficiency');
    expect(lines[1].split(',')[0]).toBe('1');
  });

  it('exits 2 with the error JSON on a string where a number belongs', () => {
    const { code, stdout } = run(
      ['-'],
      JSON.stringify({ ...input, compressor: { ...input.compressor, pressureRatio: '12' } }),
    );
    expect(code).toBe(2);
    expect(JSON.parse(stdout).error).toMatchObject({ code: 'invalid_input', field: 'compressor.pressureRatio' });
  });

  it('exits 2 naming the field of a physically impossible input', () => {
    const { code, stdout } = run(
      ['-'],
      JSON.stringify({ ...input, turbine: { ...input.turbine, inletTemperatureK: 3500 } }),
    );
    expect(code).toBe(2);
    const error = JSON.parse(stdout).error;
    expect(error.field).toBe('turbine.inletTemperatureK');
    expect(error.message).toMatch(/fuel/);
  });

  it('names the array element of a bad input', () => {
    const { code, stdout } = run(
      ['-'],
      JSON.stringify([input, { ...input, regenerator: { ...input.regenerator, effectiveness: 2 } }]),
    );
    expect(code).toBe(2);
    expect(JSON.parse(stdout).error.field).toBe('1.regenerator.effectiveness');
  });

  it('exits 2 on text that is not JSON', () => {
    const { code, stdout } = run(['-'], '{ not json');
    expect(code).toBe(2);
    expect(JSON.parse(stdout).error.field).toBe('(body)');
  });
});
