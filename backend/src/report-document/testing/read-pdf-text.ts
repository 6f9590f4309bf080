import { spawn } from 'node:child_process';

/** What pdf-parse reads back from a PDF: the text of each page, in order. */
export interface PdfText {
  pages: string[];
  /** Every page's text joined. pdf.js reads the micro sign U+00B5 back as Greek mu U+03BC. */
  text: string;
}

// pdf-parse runs pdf.js, whose worker is loaded with a dynamic import() that jest's module
// sandbox refuses; a plain Node child process reads the bytes instead.
const READER = `
const { PDFParse } = require('pdf-parse');
const chunks = [];
process.stdin.on('data', (c) => chunks.push(c));
process.stdin.on('end', async () => {
  const parser = new PDFParse({ data: new Uint8Array(Buffer.concat(chunks)) });
  try {
    const result = await parser.getText();
    process.stdout.write(JSON.stringify(result.pages.map((p) => p.text)));
  } finally {
    await parser.destroy();
  }
});
`;

/** Reads a PDF's text with pdf-parse 2 in a child process. */
export function readPdfText(pdf: Buffer): Promise<PdfText> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['-e', READER], {
      cwd: __dirname,
      stdio: ['pipe', 'pipe', 'pipe'],
    });
    const out: Buffer[] = [];
    const err: Buffer[] = [];
    child.stdout.on('data', (c: Buffer) => out.push(c));
    child.stderr.on('data', (c: Buffer) => err.push(c));
    child.on('error', reject);
    child.on('close', (code) => {
      if (code !== 0) {
        reject(new Error(`pdf-parse exited with ${code}: ${Buffer.concat(err).toString()}`));
        return;
      }
      const parsed: unknown = JSON.parse(Buffer.concat(out).toString('utf8'));
      if (!Array.isArray(parsed) || !parsed.every((p) => typeof p === 'string')) {
        reject(new Error('pdf-parse gave no page texts.'));
        return;
      }
      const pages = parsed as string[];
      resolve({ pages, text: pages.join('\n') });
    });
    child.stdin.end(pdf);
  });
}
