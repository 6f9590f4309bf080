import { Transform, TransformCallback } from 'node:stream';
import { blankPatientField, blankRecordingField } from '../../signal/edf/edf-patient-field';

/** The fixed EDF header is the first 256 bytes (Kemp et al. 1992). */
const FIXED_HEADER_BYTES = 256;
/** Patient field bytes 8..87 and recording field bytes 88..167, kept together as one span. */
const IDENTIFYING_START = 8;
const IDENTIFYING_END = 168;

/**
 * Holds back the first 256 bytes of an upload, blanks the EDF patient field (bytes 8..87)
 * and recording field (bytes 88..167) in them with the signal core's `blankPatientField`
 * and `blankRecordingField`, and only then lets them through, so the original fields never
 * reach whatever is downstream (hash, disk). Later bytes pass unchanged. A stream shorter
 * than 256 bytes (not EDF at all) gets bytes 8..167 set to spaces, as far as they exist.
 */
export class IdentifyingFieldsBlanker extends Transform {
  private held: Buffer[] = [];
  private heldBytes = 0;
  private passing = false;

  override _transform(chunk: Buffer, _encoding: BufferEncoding, done: TransformCallback): void {
    if (this.passing) {
      done(null, chunk);
      return;
    }
    this.held.push(chunk);
    this.heldBytes += chunk.byteLength;
    if (this.heldBytes >= FIXED_HEADER_BYTES) {
      const head = this.releaseHeld();
      blankPatientField(head);
      blankRecordingField(head);
      this.passing = true;
      done(null, head);
      return;
    }
    done();
  }

  override _flush(done: TransformCallback): void {
    if (this.passing || this.heldBytes === 0) {
      done();
      return;
    }
    const head = this.releaseHeld();
    const end = Math.min(IDENTIFYING_END, head.byteLength);
    if (end > IDENTIFYING_START) head.fill(0x20, IDENTIFYING_START, end);
    done(null, head);
  }

  /** Joins the held chunks into one new buffer and overwrites the originals with spaces. */
  private releaseHeld(): Buffer {
    const head = Buffer.concat(this.held, this.heldBytes);
    // The caller's chunks held the original fields: do not leave them lying in them.
    let offset = 0;
    for (const chunk of this.held) {
      const from = Math.max(IDENTIFYING_START - offset, 0);
      const to = Math.min(IDENTIFYING_END - offset, chunk.byteLength);
      if (from < to) chunk.fill(0x20, from, to);
      offset += chunk.byteLength;
    }
    this.held = [];
    this.heldBytes = 0;
    return head;
  }
}
