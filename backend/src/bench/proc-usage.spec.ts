import {
  cpuAt,
  parseStatTicks,
  parseStatusBytes,
  processCpuS,
  processPeakBytes,
} from './proc-usage';

describe('/proc readings of a process', () => {
  it('counts utime and stime as fields 14 and 15 after the command name (proc(5))', () => {
    // proc(5): "(2) comm … in parentheses"; a name may hold spaces and ")": fields are
    // counted after the last ")". Fields 3…15 here: state R, then 4…13, utime 731, stime 42.
    const line = '4242 (node) (worker 1)) R 1 4242 4242 0 -1 4194560 2000 0 0 0 731 42 0 0 20 0';
    expect(parseStatTicks(line)).toBe(731 + 42);
  });

  it('reads the kB lines of /proc/<pid>/status as 1024-byte units (proc(5))', () => {
    const status = 'Name:\tnode\nVmPeak:\t  900 kB\nVmHWM:\t  123456 kB\nVmRSS:\t  100000 kB\n';
    expect(parseStatusBytes(status, 'VmHWM')).toBe(123456 * 1024);
    expect(parseStatusBytes(status, 'VmRSS')).toBe(100000 * 1024);
    expect(() => parseStatusBytes('Name:\tnode\n', 'VmHWM')).toThrow('VmHWM');
  });

  it('gives this process the CPU time getrusage(2) gives it (process.cpuUsage)', () => {
    const until = Date.now() + 300;
    let x = 0;
    while (Date.now() < until) x += Math.sqrt(x + 1);
    expect(x).toBeGreaterThan(0);
    const usage = process.cpuUsage();
    const fromProc = processCpuS(process.pid);
    const fromRusage = (usage.user + usage.system) / 1e6;
    // /proc counts whole clock ticks (10 ms at CLK_TCK 100): a few ticks apart at most.
    expect(Math.abs(fromProc - fromRusage)).toBeLessThan(0.05);
    expect(fromProc).toBeGreaterThan(0.25);
  });

  it('gives this process the peak memory getrusage(2) gives it (ru_maxrss = VmHWM)', () => {
    const held = Buffer.alloc(64 * 2 ** 20, 1);
    const peak = processPeakBytes(process.pid);
    const maxRss = process.resourceUsage().maxRSS * 1024;
    expect(held[held.length - 1]).toBe(1);
    expect(Math.abs(peak - maxRss)).toBeLessThan(2 ** 20);
    expect(peak).toBeGreaterThan(64 * 2 ** 20);
  });

  it('interpolates CPU seconds linearly between the samples around a time', () => {
    const samples = [
      { atMs: 1000, cpuS: 1 },
      { atMs: 1050, cpuS: 1.1 },
      { atMs: 1100, cpuS: 1.3 },
    ];
    // Closed form: 1.1 + (1.3 − 1.1)·(1075 − 1050)/(1100 − 1050) = 1.2.
    expect(cpuAt(samples, 1075)).toBeCloseTo(1.2, 12);
    expect(cpuAt(samples, 1050)).toBeCloseTo(1.1, 12);
    expect(cpuAt(samples, 900)).toBe(1);
    expect(cpuAt(samples, 2000)).toBe(1.3);
  });
});
