// The 10-10 label rules live once in @gyre/shared (the client's channel pickers use them too).
export { canonicalElectrodeName, normaliseChannelLabel } from '@gyre/shared';
