/**
 * 10-10 electrode names (ACNS Guideline 2, 2016, "Guidelines for standard electrode position
 * nomenclature"): the visit override names channels this way, while files label them
 * `EEG O1-REF`, `o1-A1` or `EEG Oz`. The server reads labels by the same rules
 * (`normaliseChannelLabel` of `@gyre/shared/channel-labels`, one copy for both).
 */
import { normaliseChannelLabel } from '@gyre/shared/channel-labels';

export interface ChannelOption {
  /** The 10-10 name sent to the server. */
  value: string;
  /** The name and, when the file spells it otherwise, the file's label. */
  label: string;
}

/** The scalp electrodes among a file's labels, each once, in file order. */
export function channelOptionsOf(labels: readonly string[]): ChannelOption[] {
  const options: ChannelOption[] = [];
  for (const label of labels) {
    const name = normaliseChannelLabel(label);
    if (name === null || options.some((o) => o.value === name)) continue;
    options.push({
      value: name,
      label: name === label.trim() ? name : `${name} (${label.trim()})`,
    });
  }
  return options;
}
