import { describe, expect, it } from 'vitest';
import { polygonGeoJson, run, tempFolder } from './run-cli.js';

// The command line: usage errors exit 2, user errors (GS_ERR_*) print "gridshake: <message>" and exit 1, never a
// stack trace; --help exits 0.
const write = tempFolder();
const points = write('pts.csv', 'id,x,y\na,100,100\nb,900,300\nc,400,800\nd,700,650\n');
const area = write('area.geojson', polygonGeoJson([[[0, 0], [1000, 0], [1000, 1000], [0, 1000], [0, 0]]]));
const base = ['count', '--points', points, '--area', area, '--crs', 'planar'];

describe('gridshake command line', () => {
  it('lists the commands with --help and exits 0; no command exits 2', async () => {
    const help = await run(['--help']);
    expect(help.code).toBe(0);
    expect(help.stdout).toMatch(/Commands:\n(  \w+ +.+\n)*  count +the quadrat test/);
    expect((await run([])).code).toBe(2);
  });

  it('prints the options of count with count --help', async () => {
    const help = await run(['count', '--help']);
    expect(help.code).toBe(0);
    expect(help.stdout).toMatch(/^Usage: gridshake count --points F/);
    for (const option of ['--points FILE', '--no-data FILE', '--cell M', '--offset U,V', '--min-coverage T', '--json']) {
      expect(help.stdout).toContain(option);
    }
  });

  it.each([
    [['frobnicate'], /^gridshake: unknown command 'frobnicate'; commands: (\w+, )*count\b/],
    [[...base, '--cell', '100', '--colour', 'red'], /^gridshake count: Unknown option '--colour'/],
    [[...base, '--cell'], /^gridshake count: Option '--cell <value>' argument missing/],
    [[...base, '--cell', '100', 'extra'], /^gridshake count: unexpected argument 'extra'/],
    [['count', '--points', points, '--crs', 'planar'], /^gridshake count: --cell is required/],
  ])('exits 2 on a bad command line: %j', async (argv, message) => {
    const result = await run(argv);
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(message);
    expect(result.stderr).not.toMatch(/\n\s+at /);
  });

  it.each([
    [['--cell', 'abc'], "gridshake: --cell must be a positive number of metres, got 'abc'"],
    [['--cell=-5'], "gridshake: --cell must be a positive number of metres, got '-5'"],
    [['--cell', '100', '--offset', '1,0'], "gridshake: --offset must be two numbers U,V in cell units, each in [0, 1), got '1,0'"],
    [['--cell', '100', '--offset', '0.5'], "gridshake: --offset must be two numbers U,V in cell units, each in [0, 1), got '0.5'"],
    [['--cell', '100', '--angle', 'north'], "gridshake: --angle must be an angle in degrees in [0, 90), got 'north'"],
    [['--cell', '100', '--angle', '90'], "gridshake: --angle must be an angle in degrees in [0, 90), got '90'"],
    [['--cell', '100', '--alpha', '0.6'], "gridshake: --alpha must be a significance level in (0, 0.5], got '0.6'"],
    [['--cell', '100', '--alpha', '0'], "gridshake: --alpha must be a significance level in (0, 0.5], got '0'"],
    [['--cell', '100', '--min-coverage', '0'], "gridshake: --min-coverage must be a share of the cell in (0, 1], got '0'"],
    [['--cell', '100', '--min-coverage', '1.5'], "gridshake: --min-coverage must be a share of the cell in (0, 1], got '1.5'"],
  ])('exits 1 with the parameter named: %j', async (extra, message) => {
    const result = await run([...base, ...extra]);
    expect(result.code).toBe(1);
    expect(result.stderr).toBe(`${message}\n`);
  });

  it('refuses a cell size that leaves fewer than 2 kept cells', async () => {
    const result = await run([...base, '--cell', '800']);
    expect(result.code).toBe(1);
    expect(result.stderr).toMatch(/^gridshake: --cell 800 m leaves fewer than 2 cells with coverage >= 0\.5 in the valid region \(1\.000 km²\); use smaller cells/);
  });

  it('names an unreadable file', async () => {
    const result = await run(['count', '--points', '/nonexistent/pts.csv', '--crs', 'planar', '--cell', '100']);
    expect(result.code).toBe(1);
    expect(result.stderr).toBe('gridshake: /nonexistent/pts.csv: cannot read the file (no such file)\n');
  });

  it('passes input errors through with the file and line', async () => {
    const bad = write('bad.csv', 'x,y\n1,2\n3,oops\n');
    const result = await run(['count', '--points', bad, '--crs', 'planar', '--cell', '1']);
    expect(result.code).toBe(1);
    expect(result.stderr).toBe(`gridshake: ${bad}: line 3: the 'y' value 'oops' is not a number\n`);
  });

  it('prints the default-area warning when no study area is given', async () => {
    const result = await run(['count', '--points', points, '--crs', 'planar', '--cell', '200']);
    expect(result.code).toBe(0);
    expect(result.stdout).toMatch(/Warnings:\n {2}- no study area given: the points' bounding box \(800\.0 m x 700\.0 m\) is used/);
  });
});
