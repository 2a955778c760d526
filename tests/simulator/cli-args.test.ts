import { describe, expect, it } from 'vitest';
import { describeIssues, simArgsSchema, splitArgs } from '../../simulator/cli/args';

const parse = (argv: string[], env: NodeJS.ProcessEnv = {}) => simArgsSchema(env).safeParse(splitArgs(argv).named);

describe('the simulator command line', () => {
  it('reads a scenario run with its defaults from the environment', () => {
    const r = parse(['--scenario', 'weekend', '--units', '200', '--speed', 'max', '--seed', '7'], { PORT: '3100', MQTT_PORT: '1884' });
    expect(r.success && r.data).toMatchObject({ scenario: 'weekend', units: 200, speed: 'max', seed: '7', api: 'http://127.0.0.1:3100', mqtt: 'mqtt://127.0.0.1:1884', 'data-dir': '.data' });
  });

  it('takes a numeric speed and the demo with real time by default', () => {
    const r = parse(['--scenario', 'demo']);
    expect(r.success && r.data.speed).toBe(1);
    const f = parse(['--scenario', 'weekday', '--speed=60']);
    expect(f.success && f.data.speed).toBe(60);
  });

  it('explains what is wrong with bad arguments', () => {
    const r = parse(['--scenario', 'holiday', '--units', 'many', '--speed', '-3', '--colour', 'red']);
    expect(r.success).toBe(false);
    const text = describeIssues(r.error!);
    expect(text).toContain('--units must be a whole number');
    expect(text).toContain('--speed must be a number (1 = real time) or "max"');
    expect(text).toContain('unknown option --colour');
    expect(text).toContain('--scenario');
  });

  it('needs a gateway for a replay and no scenario with it', () => {
    const r = parse(['--replay', 'bus.log', '--scenario', 'weekday']);
    const text = describeIssues(r.error!);
    expect(text).toContain('--replay needs --gateway <id>');
    expect(text).toContain('--replay and --scenario do not go together');
    expect(parse(['--replay', 'bus.log', '--telemetry', 'gw.jsonl', '--gateway', 'GW-1']).success).toBe(true);
    expect(describeIssues(parse(['--replay', 'bus.log', '--gateway', 'bad id!']).error!)).toContain('--gateway is not a valid gateway id');
  });

  it('refuses an API or broker address that is not a URL of the right kind', () => {
    const text = describeIssues(parse(['--scenario', 'weekday', '--api', 'localhost:3000', '--mqtt', 'http://x']).error!);
    expect(text).toContain('--api must be a URL starting with http:// or https://');
    expect(text).toContain('--mqtt must be a URL starting with mqtt:// or tcp://');
  });
});
