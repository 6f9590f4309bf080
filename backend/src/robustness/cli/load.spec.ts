import { parseLoadArguments } from './load';

// The command line of `npm run load` (DEVELOPERS.md names its flags), read by node:util parseArgs.
describe('npm run load: its command line', () => {
  it('has the documented defaults: 50 clients, 20 s, 24 participants, every route', () => {
    expect(parseLoadArguments([])).toEqual({
      clients: 50,
      seconds: 20,
      participants: 24,
      routes: new Set(['results', 'raster', 'curves', 'participants', 'trajectory']),
      cpuProfileDir: null,
    });
  });

  it('reads every flag, in both spellings parseArgs accepts', () => {
    expect(
      parseLoadArguments([
        '--clients',
        '8',
        '--seconds=3',
        '--participants',
        '2',
        '--routes',
        'trajectory, results',
        '--cpu-prof',
        '/tmp/prof',
      ]),
    ).toEqual({
      clients: 8,
      seconds: 3,
      participants: 2,
      routes: new Set(['trajectory', 'results']),
      cpuProfileDir: '/tmp/prof',
    });
  });

  it('refuses what it cannot use, naming the flag', () => {
    expect(() => parseLoadArguments(['--clients', '0'])).toThrow('--clients: a positive integer');
    expect(() => parseLoadArguments(['--seconds', '2.5'])).toThrow('--seconds: a positive integer');
    expect(() => parseLoadArguments(['--routes', 'results,nope'])).toThrow(
      '--routes: unknown nope; known: results, raster, curves, participants, trajectory',
    );
    expect(() => parseLoadArguments(['--clinets', '5'])).toThrow("Unknown option '--clinets'");
    expect(() => parseLoadArguments(['--cpu-prof'])).toThrow("Option '--cpu-prof <value>'");
    expect(() => parseLoadArguments(['extra'])).toThrow(/positional argument/);
  });

  it('prints its usage for --help and asks for no run', () => {
    const log = jest.spyOn(console, 'log').mockImplementation(() => undefined);
    try {
      expect(parseLoadArguments(['--help'])).toBeNull();
      expect(log).toHaveBeenCalledWith(
        expect.stringMatching(/^usage: npm run load \[-- --clients N\]/),
      );
    } finally {
      log.mockRestore();
    }
  });
});
