import { Body, Controller, Get, Param, Post, HttpStatus } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { VisitReviewStateView } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { MarkReviewedDto } from './dto/mark-reviewed.dto';
import { VisitReviewsService } from './visit-reviews.service';

@ApiTags('visit reviews')
@ApiBearerAuth()
@Controller('visits/:visitId/review')
export class VisitReviewsController {
  constructor(private readonly reviews: VisitReviewsService) {}

  @Get()
  @RequirePermission('read', 'VisitReview')
  @ApiResult('VisitReviewStateView', {
    description: "Whether the visit's current results are reviewed, by whom and when",
  })
  state(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
  ): Promise<VisitReviewStateView> {
    return this.reviews.state(caller, visitId);
  }

  @Post()
  @RequirePermission('create', 'VisitReview')
  @ApiResult('VisitReviewStateView', {
    description:
      'Marks the results the analyst saw (their fingerprint) reviewed, audited; 409 when there are none, they changed meanwhile or they are reviewed already',
    status: HttpStatus.CREATED,
  })
  markReviewed(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
    @Body() body: MarkReviewedDto,
  ): Promise<VisitReviewStateView> {
    return this.reviews.markReviewed(caller, visitId, body.fingerprint);
  }
}
