import { Body, Controller, Get, Param, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiCreatedResponse, ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { VisitReviewStateDto } from '@gyre/shared';
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
  @ApiOkResponse({
    description: "Whether the visit's current results are reviewed, by whom and when",
  })
  state(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
  ): Promise<VisitReviewStateDto> {
    return this.reviews.state(caller, visitId);
  }

  @Post()
  @RequirePermission('create', 'VisitReview')
  @ApiCreatedResponse({
    description:
      'Marks the results the analyst saw (their fingerprint) reviewed, audited; 409 when there are none, they changed meanwhile or they are reviewed already',
  })
  markReviewed(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
    @Body() body: MarkReviewedDto,
  ): Promise<VisitReviewStateDto> {
    return this.reviews.markReviewed(caller, visitId, body.fingerprint);
  }
}
