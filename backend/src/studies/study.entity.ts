import { Column, Entity } from 'typeorm';
import { ModelRowColumns } from '../common/database/model-columns';

@Entity('study')
export class Study extends ModelRowColumns {
  @Column('varchar') code: string;
  @Column('varchar') name: string;
  @Column('text') description: string;

  /** A trend slope is shown from this many visits with a value… */
  @Column('integer') trendMinVisits: number;

  /** …spanning at least this many days. */
  @Column('integer') trendMinSpanDays: number;

  /** Blinded review: analysts see visits under codes until they record their decision. */
  @Column('boolean', { default: false }) blindedReview: boolean;
}
