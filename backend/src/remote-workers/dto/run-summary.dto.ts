/**
 * The shape a worker's posted `summary` must have: the signal core's `RunSummary`, field for
 * field (each class `implements` its part, so a change of the core's type fails to compile
 * here until the check follows it). Validated by class-validator with unknown fields refused,
 * so a 400 names the exact path that is wrong (`summary.quality.channels.3.flat`).
 */
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsBoolean,
  IsIn,
  IsInt,
  IsNumber,
  IsObject,
  IsString,
  Max,
  MaxLength,
  Min,
  ValidateBy,
  ValidateIf,
  ValidateNested,
  ValidationOptions,
} from 'class-validator';
import type {
  ChannelQualityView,
  AmplitudeGateView,
  ChannelStatsView,
  ConditionDifferenceView,
  ConditionPairSource,
  ConditionStatsView,
  CycleEstimateView,
  QualityView,
  RoiChannelOmission,
  RoiOmissionReason,
  RoiUsageView,
} from '@gyre/shared';
import type { AnalysisBandSource } from '../../signal/pipeline/analysis-settings';
import type { RunSummary } from '../../signal/pipeline/run-summary';

const finite = { allowNaN: false, allowInfinity: false };
/** Generous ceilings: a 256-channel montage, a few hours of trials, long warning lists. */
const MAX_LABEL = 256;
const MAX_TEXT = 4000;
const MAX_CHANNELS = 1024;
const MAX_WARNINGS = 2000;
const MAX_TRIALS = 200_000;

const BAND_SOURCES = [
  'settings',
  'iaf',
  'default',
] as const satisfies readonly AnalysisBandSource[];
const OMISSION_REASONS = [
  'missing',
  'flat',
  'saturated',
  'sample-rate',
  'excluded',
] as const satisfies readonly RoiOmissionReason[];
const CONDITION_PAIR_SOURCES = [
  'settings',
  'request',
  'first-two',
] as const satisfies readonly ConditionPairSource[];
const ROI_STATUSES = [
  'complete',
  'partial',
  'none',
] as const satisfies readonly RoiUsageView['status'][];

function compose(...decorators: PropertyDecorator[]): PropertyDecorator {
  return (target, key) => decorators.forEach((decorator) => decorator(target, key));
}

/** A finite number, or null (a missing value). */
const NullableNumber = (): PropertyDecorator =>
  compose(
    ValidateIf((_o, value) => value !== null),
    IsNumber(finite),
  );

/** `[low, high]` of finite numbers. */
const Pair = (): PropertyDecorator =>
  compose(IsArray(), ArrayMaxSize(2), IsNumber(finite, { each: true }), ValidateBy(pairOf2));

const pairOf2 = {
  name: 'pair',
  validator: {
    validate: (value: unknown): boolean => Array.isArray(value) && value.length === 2,
    defaultMessage: (): string => '$property must hold exactly two numbers',
  },
};

const Labels = (max = MAX_CHANNELS): PropertyDecorator =>
  compose(
    IsArray(),
    ArrayMaxSize(max),
    IsString({ each: true }),
    MaxLength(MAX_LABEL, { each: true }),
  );

const Numbers = (max: number): PropertyDecorator =>
  compose(IsArray(), ArrayMaxSize(max), IsNumber(finite, { each: true }));

const Nested = (type: () => new () => object, options: ValidationOptions = {}): PropertyDecorator =>
  compose(IsObject(options), ValidateNested(options), Type(type));

/** A nested object, or null. */
const NullableNested = (type: () => new () => object): PropertyDecorator =>
  compose(
    ValidateIf((_o, value) => value !== null),
    Nested(type),
  );

/** An array of at most `max` nested objects. */
const NestedList = (type: () => new () => object, max: number): PropertyDecorator =>
  compose(IsArray(), ArrayMaxSize(max), ValidateNested({ each: true }), Type(type));

/** A count: a whole number, 0 or more (samples, trials, points). */
const Count = (): PropertyDecorator => compose(IsInt(), Min(0));

/** A plain object of finite counts (`epochs.dropped`: reason → trials). */
const CountRecord = (): PropertyDecorator =>
  ValidateBy({
    name: 'countRecord',
    validator: {
      validate: (value: unknown): boolean =>
        typeof value === 'object' &&
        value !== null &&
        !Array.isArray(value) &&
        Object.keys(value).length <= 100 &&
        Object.values(value).every((n) => Number.isInteger(n) && (n as number) >= 0),
      defaultMessage: (): string => '$property must map reasons to trial counts',
    },
  });

class RoiChannelOmissionDto implements RoiChannelOmission {
  @IsString()
  @MaxLength(MAX_LABEL)
  label: string;

  @IsIn(OMISSION_REASONS)
  reason: RoiOmissionReason;
}

class RoiUsageWireDto implements RoiUsageView {
  @Labels()
  wanted: string[];

  @Labels()
  used: string[];

  @NestedList(() => RoiChannelOmissionDto, MAX_CHANNELS)
  leftOut: RoiChannelOmissionDto[];

  @IsIn(ROI_STATUSES)
  status: RoiUsageView['status'];
}

/** Baseline, post, Δf and its interval: every Δf estimate reports them. */
class DeltaFEstimateDto {
  @NullableNumber()
  baselineHz: number | null;

  @NullableNumber()
  postHz: number | null;

  @NullableNumber()
  deltaFHz: number | null;

  @ValidateIf((_o, value) => value !== null)
  @Pair()
  ciHz: [number, number] | null;
}

/** The onset statistics a channel and the region of interest both report. */
class OnsetStatsDto extends DeltaFEstimateDto {
  @NullableNumber()
  pValue: number | null;
}

class AmplitudeGateDto implements AmplitudeGateView {
  @NullableNumber()
  percentile: number | null;

  @Count()
  excludedSamples: number;

  @Count()
  totalSamples: number;
}

class ChannelStatsWireDto extends OnsetStatsDto implements ChannelStatsView {
  @IsString()
  @MaxLength(MAX_LABEL)
  label: string;

  @ValidateIf((_o, value) => value !== null)
  @IsString()
  @MaxLength(MAX_LABEL)
  canonical: string | null;

  @IsBoolean()
  inRoi: boolean;

  @ValidateIf((_o, value) => value !== null)
  @Count()
  trials: number | null;

  @NullableNumber()
  pafHz: number | null;

  @NullableNumber()
  cogHz: number | null;

  @ValidateIf((_o, value) => value !== null)
  @ValidateNested()
  @Type(() => AmplitudeGateDto)
  amplitudeGate: AmplitudeGateView | null;
}

class RoiStatsDto extends OnsetStatsDto implements NonNullable<RunSummary['roi']> {
  @Count()
  trialsKept: number;

  @Count()
  trialsTotal: number;
}

/** The region's statistics over one condition's trials, with the condition's label. */
class ConditionStatsDto extends RoiStatsDto implements ConditionStatsView {
  @IsString()
  @MaxLength(MAX_LABEL)
  label: string;
}

class ConditionDifferenceDto implements ConditionDifferenceView {
  @IsString()
  @MaxLength(MAX_LABEL)
  first: string;

  @IsString()
  @MaxLength(MAX_LABEL)
  second: string;

  @IsIn(CONDITION_PAIR_SOURCES)
  chosenBy: ConditionPairSource;

  @NullableNumber()
  differenceHz: number | null;

  @ValidateIf((_o, value) => value !== null)
  @Pair()
  ciHz: [number, number] | null;

  @NullableNumber()
  pValue: number | null;

  @IsInt()
  @Min(1)
  permutations: number;

  @IsInt()
  seed: number;
}

class CycleEstimateDto extends DeltaFEstimateDto implements CycleEstimateView {
  @Count()
  trialsUsed: number;

  @Count()
  trialsTotal: number;

  @ValidateIf((_o, value) => value !== null)
  @IsNumber(finite)
  @Min(0)
  @Max(1)
  burstCycleShare: number | null;

  @ValidateIf((_o, value) => value !== null)
  @IsNumber(finite)
  @Min(0)
  disagreementHz: number | null;

  @IsBoolean()
  disagrees: boolean;
}

class EpochCountsDto {
  @Count()
  total: number;

  @Count()
  kept: number;

  @CountRecord()
  dropped: Record<string, number>;
}

class TaskSummaryDto implements NonNullable<RunSummary['task']> {
  @Pair()
  baselineWindowS: [number, number];

  @Pair()
  postWindowS: [number, number];

  @Nested(() => EpochCountsDto)
  epochs: EpochCountsDto;

  @Numbers(MAX_TRIALS)
  trialOnsetsS: number[];

  @Labels()
  curveChannels: string[];

  @Count()
  rasterTrials: number;

  @Count()
  rasterPoints: number;

  @NestedList(() => ConditionStatsDto, MAX_TRIALS)
  conditions: ConditionStatsDto[];

  @NullableNested(() => ConditionDifferenceDto)
  conditionDifference: ConditionDifferenceDto | null;

  @Labels()
  conditionCurves: string[];

  @NullableNested(() => CycleEstimateDto)
  cycles: CycleEstimateDto | null;
}

class RestSummaryDto implements NonNullable<RunSummary['rest']> {
  @NullableNumber()
  pafHz: number | null;

  @NullableNumber()
  cogHz: number | null;

  @NullableNumber()
  prominenceDb: number | null;

  @ValidateIf((_o, value) => value !== null)
  @IsString()
  @MaxLength(MAX_TEXT)
  noPeakReason: string | null;

  @Pair()
  alphaWindowHz: [number, number];
}

class ChannelQualityWireDto implements ChannelQualityView {
  @IsString()
  @MaxLength(MAX_LABEL)
  label: string;

  @NullableNumber()
  standardDeviationUv: number | null;

  @IsBoolean()
  flat: boolean;

  @NullableNumber()
  saturatedShare: number | null;

  @IsBoolean()
  saturated: boolean;

  @NullableNumber()
  lineNoiseRatio50Hz: number | null;

  @NullableNumber()
  lineNoiseRatio60Hz: number | null;

  @NullableNumber()
  phaseSlipShare: number | null;
}

class QualityWireDto implements QualityView {
  @IsNumber(finite)
  durationS: number;

  @Numbers(MAX_CHANNELS)
  sampleRatesHz: number[];

  @Labels()
  roiChannelsFound: string[];

  @Labels()
  roiChannelsMissing: string[];

  @Labels()
  flatChannels: string[];

  @Labels()
  saturatedChannels: string[];

  @NullableNumber()
  lineNoiseRatio50Hz: number | null;

  @NullableNumber()
  lineNoiseRatio60Hz: number | null;

  @NullableNumber()
  epochsDroppedShare: number | null;

  @NullableNumber()
  phaseSlipShare: number | null;

  @NullableNumber()
  alphaPeakProminenceDb: number | null;

  @NestedList(() => ChannelQualityWireDto, MAX_CHANNELS)
  channels: ChannelQualityWireDto[];

  @IsArray()
  @ArrayMaxSize(MAX_WARNINGS)
  @IsString({ each: true })
  @MaxLength(MAX_TEXT, { each: true })
  warnings: string[];
}

/** `summary` of a posted result. */
export class RunSummaryDto implements RunSummary {
  @Pair()
  bandHz: [number, number];

  @IsIn(BAND_SOURCES)
  bandSource: AnalysisBandSource;

  @Nested(() => RoiUsageWireDto)
  roiUsage: RoiUsageWireDto;

  @NestedList(() => ChannelStatsWireDto, MAX_CHANNELS)
  channels: ChannelStatsWireDto[];

  @NullableNested(() => RoiStatsDto)
  roi: RoiStatsDto | null;

  @NullableNested(() => TaskSummaryDto)
  task: TaskSummaryDto | null;

  @NullableNested(() => RestSummaryDto)
  rest: RestSummaryDto | null;

  @Nested(() => QualityWireDto)
  quality: QualityWireDto;

  @ValidateIf((_o, value) => value !== null)
  @IsBoolean()
  suggestsSlowing: boolean | null;
}
