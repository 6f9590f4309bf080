/**
 * Types of a decoded EDF/EDF+ or BDF/BDF+ recording (Kemp et al. 1992; Kemp & Olivan 2003;
 * BioSemi's BDF format and its BDF+ extension: the same header, 24-bit samples).
 * Imported by the DSP code and the server: keep the names stable.
 */

/** Main header (the first 256 bytes), with the EDF+ meaning of the reserved field. */
export interface EdfHeader {
  /** Version field: "0" in every valid EDF/EDF+ file, "0xFF BIOSEMI" in a BDF/BDF+ file. */
  version: string;
  /** Local patient identification (EDF+: `code sex birthdate name`), trailing spaces removed. */
  patientId: string;
  /** Local recording identification (EDF+: `Startdate dd-MMM-yyyy admincode technician equipment`). */
  recordingId: string;
  /** Start of the recording, local clock time as written in the header, ISO `YYYY-MM-DDTHH:mm:ss`. */
  startDate: string;
  /** Header length in bytes, 256 × (1 + signalCount). */
  headerBytes: number;
  /**
   * The 44-byte reserved field (EDF+: starts with `EDF+C` or `EDF+D`; BDF: `24BIT`; BDF+:
   * `BDF+C` or `BDF+D`), trailing spaces removed.
   */
  reserved: string;
  format: 'EDF' | 'EDF+C' | 'EDF+D' | 'BDF' | 'BDF+C' | 'BDF+D';
  /**
   * Number of data records; when the field says −1 ("still recording"), the count the file's
   * size holds (see `readEdfHeader`).
   */
  recordCount: number;
  recordDurationS: number;
  /** All signals in the file, including `EDF Annotations` signals. */
  signalCount: number;
}

/** One signal's header fields, without its samples (what the header alone tells). */
export interface EdfSignalHeader {
  label: string;
  transducer: string;
  /** Unit of the physical values as written (e.g. `uV`). Samples stay in this unit. */
  physicalDimension: string;
  physicalMin: number;
  physicalMax: number;
  digitalMin: number;
  digitalMax: number;
  prefiltering: string;
  samplesPerRecord: number;
  /** samplesPerRecord / recordDurationS. Signals of one file may differ. */
  sampleRateHz: number;
}

/** An ordinary (non-annotation) signal with its physical values. */
export interface EdfSignal extends EdfSignalHeader {
  /** Physical values in `physicalDimension` units, records concatenated in file order. */
  samples: Float32Array;
}

/** One EDF+ annotation; time-keeping annotations are not included. */
export interface EdfAnnotation {
  /** Seconds after the header's start date/time (may be negative, Kemp & Olivan 2003). */
  onsetS: number;
  /** Seconds, or null when the TAL gives no duration. */
  durationS: number | null;
  text: string;
}

export interface EdfRecording {
  header: EdfHeader;
  /** Ordinary signals only, in file order (annotation signals are left out). */
  signals: EdfSignal[];
  /** Annotations of every `EDF Annotations` signal, in file order; time-keeping excluded. */
  annotations: EdfAnnotation[];
  /**
   * Start of each data record in seconds after the header start time: from the
   * time-keeping TALs in EDF+, otherwise index × recordDurationS.
   */
  recordStartsS: Float64Array;
  /** End of the last data record in seconds after the header start time. */
  durationS: number;
  /** Problems that do not stop reading (e.g. no EEG channel in the region of interest). */
  warnings: string[];
}

/** What the header alone gives (see `readEdfHeader`). */
export interface EdfHeaderInfo {
  header: EdfHeader;
  /** Every signal in file order, annotation signals included. */
  signalHeaders: EdfSignalHeader[];
  /** Indices into `signalHeaders` of the `EDF Annotations` (BDF+: `BDF Annotations`) signals. */
  annotationSignalIndices: number[];
  /** Bytes in one data record: sampleBytes × Σ samplesPerRecord. */
  recordBytes: number;
  /** Bytes per sample: 2 in EDF/EDF+ (16-bit), 3 in BDF/BDF+ (24-bit), annotation signals too. */
  sampleBytes: 2 | 3;
  warnings: string[];
}
