// Types for the parts of edfdecoder 0.1.2 (untyped) that the tests use, from its readme.
declare module 'edfdecoder' {
  export interface EdfDecoderOutput {
    getNumberOfSignals(): number;
    getNumberOfRecords(): number;
    getSignalSamplingFrequency(index: number): number;
    getPhysicalSignalConcatRecords(index: number): Float32Array;
  }
  export class EdfDecoder {
    setInput(buffer: ArrayBuffer): void;
    decode(): void;
    getOutput(): EdfDecoderOutput | null;
  }
}
