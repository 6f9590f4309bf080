import { Body, Controller, Get, HttpStatus, Param, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { VisitBlindingView } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { ApiResult } from '../openapi/api-responses';
import { BlindedDecisionsService } from './blinded-decisions.service';
import { BlindedDecisionDto } from './dto/blinded-decision.dto';

@ApiTags('blinded review')
@ApiBearerAuth()
@Controller('visits/:visitId/blinding')
export class BlindedDecisionsController {
  constructor(private readonly decisions: BlindedDecisionsService) {}

  @Get()
  @RequirePermission('read', 'Visit')
  @ApiResult('VisitBlindingView', {
    description:
      "Whether the visit's details are hidden from the caller (blinded review), its code and the caller's decision",
  })
  state(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
  ): Promise<VisitBlindingView> {
    return this.decisions.state(caller, visitId);
  }

  @Post('decision')
  @RequirePermission('create', 'Flag')
  @ApiResult('VisitBlindingView', {
    description:
      'Records the analyst\'s decision on a blinded visit (flag raised, or no flag, with a reason) and unblinds it for them; audited as "unblind"; 409 when the visit is not blinded for them',
    status: HttpStatus.CREATED,
  })
  decide(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
    @Body() body: BlindedDecisionDto,
  ): Promise<VisitBlindingView> {
    return this.decisions.decide(caller, visitId, body);
  }
}
