import { main } from '../cli/analyze';

/** Runs the analyze command line in-process and captures what it writes. */
export async function runAnalyzeCli(
  argv: string[],
): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const out = jest.spyOn(process.stdout, 'write').mockImplementation((chunk) => {
    stdout += String(chunk);
    return true;
  });
  const err = jest.spyOn(process.stderr, 'write').mockImplementation((chunk) => {
    stderr += String(chunk);
    return true;
  });
  try {
    return { code: await main(argv), stdout, stderr };
  } finally {
    out.mockRestore();
    err.mockRestore();
  }
}

/** The command line's JSON report for `argv`; a non-zero exit fails with what it wrote to stderr. */
export async function analyzeCliReport<T>(argv: string[]): Promise<T> {
  const { code, stdout, stderr } = await runAnalyzeCli(argv);
  if (code !== 0) throw new Error(`analyze exited with ${code}: ${stderr}`);
  return JSON.parse(stdout) as T;
}
