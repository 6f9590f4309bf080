import { Body, Controller, Param, Query } from '@nestjs/common';
import type { Page, ParticipantListItem, ParticipantView } from '@gyre/shared';
import { CurrentCaller, type Caller } from '../auth/decorators';
import { CreateRoute, ListRoute, ReadRoute, UpdateRoute } from '../common/http/resource-routes';
import { ScopedController } from '../common/http/scoped-controller';
import {
  CreateParticipantDto,
  ParticipantQueryDto,
  UpdateParticipantDto,
} from './dto/participant.dto';
import { ParticipantsService } from './participants.service';

const NOT_FOUND = 'No such participant in your scope';

@ScopedController('participants')
@Controller('participants')
export class ParticipantsController {
  constructor(private readonly participants: ParticipantsService) {}

  @ListRoute('Participant', 'ParticipantListItem', {
    description: "The participants in your scope, each with its visits' latest numbers and flags",
  })
  list(
    @CurrentCaller() caller: Caller,
    @Query() query: ParticipantQueryDto,
  ): Promise<Page<ParticipantListItem>> {
    return this.participants.list(caller, query);
  }

  @ReadRoute('Participant', 'ParticipantView', {
    description: 'One participant',
    notFound: NOT_FOUND,
  })
  get(@CurrentCaller() caller: Caller, @Param('id') id: string): Promise<ParticipantView> {
    return this.participants.get(caller, id);
  }

  @CreateRoute('Participant', 'ParticipantView', {
    description: 'The new participant (audited)',
    conflict: 'The code is taken in this study',
  })
  create(
    @CurrentCaller() caller: Caller,
    @Body() body: CreateParticipantDto,
  ): Promise<ParticipantView> {
    return this.participants.create(caller, body);
  }

  @UpdateRoute('Participant', 'ParticipantView', {
    description: 'The changed participant',
    notFound: NOT_FOUND,
  })
  update(
    @CurrentCaller() caller: Caller,
    @Param('id') id: string,
    @Body() body: UpdateParticipantDto,
  ): Promise<ParticipantView> {
    return this.participants.update(caller, id, body);
  }
}
