/**
 * `npm run bench queue`: the Redis queue executor against the local pool on this machine. Starts its own
 * redis-server (Debian's) and `gridshake worker` processes (one thread each), then measures
 *  - throughput of one sweep with 1, 2 and 3 worker processes, against the local pool with 1 and 2 threads;
 *  - overhead per task: many tiny tasks (60 points) through one worker vs the local pool with one thread;
 *  - bytes per task and per result, and Redis commands per task (INFO stats: total_commands_processed).
 * Every row carries the 1-minute load average at its end: figures taken on a busy machine say so beside them.
 * On a 2-core machine at most two processes compute at once, so 3 worker processes cannot beat 2 there.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { availableParallelism, loadavg } from 'node:os';
import { join } from 'node:path';
import { parseQueueUrl } from '../../server/queue/queue-url.js';
import { QueueExecutor } from '../../server/queue/queue-executor.js';
import { encodePlacements } from '../../server/queue/task-codec.js';
import { PACKAGE_ROOT } from '../../server/services/project-paths.js';
import { normalizePlan } from '../../server/sweeps/plan.js';
import { SweepPool } from '../../server/sweeps/sweep-pool.js';
import { ExecutorSweepRunner } from '../../server/sweeps/sweep-runner.js';
import { chunkPlacements, estimateSweep } from '../../server/sweeps/sweep-budget.js';
import { chunkResultLength } from '../../workers/sweep/sweep-task.js';
import { cellSideForExpected, clusteredDataset } from './bench-data.js';
import { printTable } from './bench-table.js';
import { redisCommand, startRedis, stopProcess } from './redis-server.js';

async function startWorkers(url: string, count: number): Promise<ChildProcess[]> {
  const cli = join(PACKAGE_ROOT, 'bin', 'gridshake.js');
  return Promise.all(
    Array.from({ length: count }, () =>
      new Promise<ChildProcess>((resolve, reject) => {
        const child = spawn(process.execPath, [cli, 'worker', '--queue', url, '--threads', '1'], { stdio: ['ignore', 'ignore', 'pipe'] });
        let text = '';
        child.stderr?.on('data', (data: Buffer) => {
          text += data.toString();
          if (text.includes('connected to ')) resolve(child);
        });
        child.once('exit', (code) => reject(new Error(`worker exited ${code}: ${text}`)));
      }),
    ),
  );
}

async function commandsProcessed(port: number): Promise<number> {
  const info = await redisCommand(port, 'INFO stats');
  return Number(/total_commands_processed:(\d+)/.exec(info)?.[1] ?? Number.NaN);
}

/** The 1-minute load average, to print beside a figure. */
function load(): string {
  return loadavg()[0].toFixed(2);
}

async function seconds(fn: () => Promise<unknown>): Promise<number> {
  const start = process.hrtime.bigint();
  await fn();
  return Number(process.hrtime.bigint() - start) / 1e9;
}

export async function runQueueBench(): Promise<void> {
  const redis = await startRedis();
  try {
    const n = 2e5;
    const dataset = clusteredDataset(n, 4);
    const plan = normalizePlan({ cells: [cellSideForExpected(5, n)], placements: 384, sims: 4, seed: 2, alpha: 0.5 });
    const tasks = estimateSweep(plan, n).tasks;
    const work = n * plan.placements * (1 + plan.sims);
    const rows: (string | number)[][] = [];
    for (const threads of [1, 2]) {
      const pool = new SweepPool({ threads });
      await pool.runSweep(dataset, { ...plan, placements: 8 });
      const wall = await seconds(() => pool.runSweep(dataset, plan));
      rows.push([`local pool, ${threads} thread(s)`, wall, tasks / wall, (wall * 1e9) / work, load()]);
      await pool.destroy();
    }
    let perTaskCommands = Number.NaN;
    for (const count of [1, 2, 3]) {
      const workers = await startWorkers(redis.url, count);
      const runner = new ExecutorSweepRunner(new QueueExecutor({ connection: parseQueueUrl(redis.url), prefix: 'bench' }));
      try {
        await runner.runSweep(dataset, { ...plan, placements: 8 * count }); // every worker fetches the dataset and draws the simulations
        const before = await commandsProcessed(redis.port);
        const wall = await seconds(() => runner.runSweep(dataset, plan));
        const commands = (await commandsProcessed(redis.port)) - before;
        if (count === 1) perTaskCommands = commands / tasks;
        rows.push([`queue, ${count} worker process(es) x 1 thread`, wall, tasks / wall, (wall * 1e9) / work, load()]);
      } finally {
        await runner.destroy();
        await Promise.all(workers.map((child) => stopProcess(child)));
      }
    }
    printTable(
      `Q1. Redis queue vs local pool: ${n} points x ${plan.placements} placements x 1 size x (1 + ${plan.sims} sims), ${tasks} tasks; ` +
        `${availableParallelism()} cores (more busy processes than cores only share them)`,
      ['executor', 'seconds', 'tasks/s', 'ns/point-placement', 'load avg 1 min'],
      rows,
    );

    // overhead per task: tiny tasks, where the time is almost all dispatch
    const tiny = clusteredDataset(60, 5);
    const tinyPlan = normalizePlan({ cells: [cellSideForExpected(5, 60)], placements: 4096, sims: 0 });
    const tinyTasks = estimateSweep(tinyPlan, 60).tasks;
    const pool = new SweepPool({ threads: 1 });
    await pool.runSweep(tiny, { ...tinyPlan, placements: 64 });
    const localWall = await seconds(() => pool.runSweep(tiny, tinyPlan));
    const localLoad = load();
    await pool.destroy();
    const [worker] = await startWorkers(redis.url, 1);
    const runner = new ExecutorSweepRunner(new QueueExecutor({ connection: parseQueueUrl(redis.url), prefix: 'bench-tiny' }));
    let queueWall = Number.NaN;
    let queueLoad = '';
    try {
      await runner.runSweep(tiny, { ...tinyPlan, placements: 64 });
      queueWall = await seconds(() => runner.runSweep(tiny, tinyPlan));
    } finally {
      queueLoad = load();
      await runner.destroy();
      await stopProcess(worker);
    }
    const perChunk = chunkPlacements(n, plan.sims);
    const taskBytes = JSON.stringify({ format: 1, prefix: 'data-0123456789ab', dataset: 'f'.repeat(64), pointCount: n, seed: 2, sims: plan.sims, cellSize: 12.345678, minCoverage: 0.5, alpha: 0.05, placements: encodePlacements(new Float64Array(3 * perChunk)) }).length;
    printTable(
      `Q2. Per task: ${tinyTasks} tiny tasks (60 points, 64 placements each), one worker process vs the local pool with one thread`,
      ['measure', 'value'],
      [
        [`local pool, ms per task (load avg ${localLoad})`, (localWall * 1000) / tinyTasks],
        [`queue, ms per task (load avg ${queueLoad})`, (queueWall * 1000) / tinyTasks],
        ['queue overhead, ms per task', ((queueWall - localWall) * 1000) / tinyTasks],
        [`task data, bytes (${perChunk} placements)`, taskBytes],
        [`result, bytes (${perChunk} placements, ${plan.sims} sims)`, chunkResultLength(perChunk, plan.sims) * 8],
        ['Redis commands per task (measured in Q1, 1 worker)', perTaskCommands],
      ],
    );
  } finally {
    await redis.stop();
  }
}
