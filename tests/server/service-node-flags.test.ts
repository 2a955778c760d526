// The service's Node flags are given where it starts: `npm start` (package.json), `npm run dev`, and the
// bench, which reads them from scripts/lib/service-node-flags.ts, so that its figures are those of the
// process `npm start` runs. And the flag does what it is there for: V8's young generation takes the size
// given (a flag given at run time would not: see the module's note).
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { SERVICE_NODE_FLAGS } from '../../scripts/lib/service-node-flags';

describe("the service's Node flags", () => {
  it('npm start runs the service with them', () => {
    const pkg = JSON.parse(readFileSync('package.json', 'utf8')) as { scripts: Record<string, string> };
    expect(pkg.scripts.start).toContain(`node ${SERVICE_NODE_FLAGS.join(' ')} --import tsx scripts/start.ts`);
  });

  it('npm run dev starts its back end with them', () => {
    expect(readFileSync('scripts/dev.ts', 'utf8')).toContain("[...SERVICE_NODE_FLAGS, '--import', 'tsx', 'scripts/start.ts']");
  });

  it("give V8 a young generation of the size asked for (V8's heap statistics, new space)", () => {
    // "The new space consists of two semi-spaces" (V8's own text for --max-semi-space-size, `node --v8-options`);
    // Node's v8.getHeapSpaceStatistics() gives new_space's size. Short-lived objects enough to grow it to its most.
    const newSpaceMax = (flags: string[]) => {
      const script = "const a=[];for(let i=0;i<4e6;i++){a.push({i});if(a.length>1e5)a.length=0}const s=require('v8').getHeapSpaceStatistics().find(x=>x.space_name==='new_space');console.log(s.space_size)";
      return Number(execFileSync(process.execPath, [...flags, '-e', script], { encoding: 'utf8' }).trim());
    };
    const mb = Number(/--max-semi-space-size=(\d+)/.exec(SERVICE_NODE_FLAGS.join(' '))![1]);
    const withFlags = newSpaceMax(SERVICE_NODE_FLAGS);
    const without = newSpaceMax([]);
    expect(withFlags).toBeLessThan(without);
    expect(withFlags).toBe(2 * mb * 1024 * 1024);
  });

  it("give the broker's worker thread the same young generation (a process-wide flag, whatever the worker's own limits)", () => {
    // The same measure inside a worker started as broker/threaded-broker.ts starts it (execArgv: []).
    const inWorker = (flags: string[]) => {
      const measure = "const a=[];for(let i=0;i<4e6;i++){a.push({i});if(a.length>1e5)a.length=0}require('worker_threads').parentPort.postMessage(require('v8').getHeapSpaceStatistics().find(x=>x.space_name==='new_space').space_size)";
      const script = `const {Worker}=require('worker_threads');const w=new Worker(${JSON.stringify(measure)},{eval:true,execArgv:[]});w.on('message',(n)=>{console.log(n);process.exit(0)})`;
      return Number(execFileSync(process.execPath, [...flags, '-e', script], { encoding: 'utf8' }).trim());
    };
    const mb = Number(/--max-semi-space-size=(\d+)/.exec(SERVICE_NODE_FLAGS.join(' '))![1]);
    expect(inWorker(SERVICE_NODE_FLAGS)).toBe(2 * mb * 1024 * 1024);
    expect(inWorker([])).toBeGreaterThan(inWorker(SERVICE_NODE_FLAGS));
  });
});
