import { Transform, TransformCallback } from 'node:stream';
import { blankPatientField } from '../../signal/edf/edf-patient-field';

/** The fixed EDF header is the first 256 bytes; the patient field is bytes 8..87 (Kemp et al. 1992). */
const FIXED_HEADER_BYTES = 256;
const PATIENT_FIELD_START = 8;
const PATIENT_FIELD_END = 88;

/**
 * Holds back the first 256 bytes of an upload, blanks the EDF patient field in them
 * (the signal core's `blankPatientField`) and only then lets them through, so the
 * original field never reaches whatever is downstream (hash, disk). Later bytes pass
 * unchanged. A stream shorter than 256 bytes (not EDF at all) gets bytes 8..87 set to
 * spaces, as far as they exist.
 */
export class PatientFieldBlanker extends Transform {
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
    const end = Math.min(PATIENT_FIELD_END, head.byteLength);
    if (end > PATIENT_FIELD_START) head.fill(0x20, PATIENT_FIELD_START, end);
    done(null, head);
  }

  /** Joins the held chunks into one new buffer and overwrites the originals with spaces. */
  private releaseHeld(): Buffer {
    const head = Buffer.concat(this.held, this.heldBytes);
    // The caller's chunks held the original field: do not leave it lying in them.
    let offset = 0;
    for (const chunk of this.held) {
      const from = Math.max(PATIENT_FIELD_START - offset, 0);
      const to = Math.min(PATIENT_FIELD_END - offset, chunk.byteLength);
      if (from < to) chunk.fill(0x20, from, to);
      offset += chunk.byteLength;
    }
    this.held = [];
    this.heldBytes = 0;
    return head;
  }
}
