export { canonicalElectrodeName, normaliseChannelLabel } from '@gyre/shared/channel-labels';
export { DEFAULT_POSTERIOR_ROI, roiChannels } from './region-of-interest';
export type { RoiChannel } from './region-of-interest';
