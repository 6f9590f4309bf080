import { Body, Controller, Get, Param, Post, Query, HttpStatus } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { ApiResult } from '../openapi/api-responses';
import type { FlagView, Page, VisitFlagView } from '@gyre/shared';
import { CurrentCaller, RequirePermission } from '../auth/decorators';
import type { Caller } from '../auth/decorators';
import { FlagChangeDto } from './dto/flag-change.dto';
import { FlagListQueryDto } from './dto/flag-list-query.dto';
import { FlagsService } from './flags.service';

@ApiTags('flags')
@ApiBearerAuth()
@Controller()
export class FlagsController {
  constructor(private readonly flags: FlagsService) {}

  @Get('flags')
  @RequirePermission('read', 'Flag')
  @ApiResult('FlagView', {
    description: 'Flags in scope; filter by state, participant, site',
    page: true,
  })
  list(@CurrentCaller() caller: Caller, @Query() query: FlagListQueryDto): Promise<Page<FlagView>> {
    return this.flags.list(caller, query);
  }

  @Get('visits/:visitId/flag')
  @RequirePermission('read', 'Flag')
  @ApiResult('VisitFlagView', {
    description: "The visit's flag, its history and the computation's suggestion",
  })
  forVisit(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
  ): Promise<VisitFlagView> {
    return this.flags.forVisit(caller, visitId);
  }

  @Post('visits/:visitId/flag/raise')
  @RequirePermission('create', 'Flag')
  @ApiResult('VisitFlagView', {
    description: 'Raises the slowing flag (reason ≥ 10 characters, audited)',
    status: HttpStatus.CREATED,
  })
  raise(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
    @Body() body: FlagChangeDto,
  ): Promise<VisitFlagView> {
    return this.flags.raise(caller, visitId, body.reason);
  }

  @Post('visits/:visitId/flag/clear')
  @RequirePermission('update', 'Flag')
  @ApiResult('VisitFlagView', {
    description: 'Clears the raised flag (reason ≥ 10 characters, audited)',
    status: HttpStatus.CREATED,
  })
  clear(
    @CurrentCaller() caller: Caller,
    @Param('visitId') visitId: string,
    @Body() body: FlagChangeDto,
  ): Promise<VisitFlagView> {
    return this.flags.clear(caller, visitId, body.reason);
  }
}
