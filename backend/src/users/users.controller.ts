import { Body, Controller, HttpStatus, Param, Post, Query } from '@nestjs/common';
import { ApiConflictResponse, ApiOperation } from '@nestjs/swagger';
import type { Page, UserView } from '@gyre/shared';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import { ListRoute, ReadRoute, UpdateRoute } from '../common/http/resource-routes';
import { ScopedController } from '../common/http/scoped-controller';
import { ApiResult } from '../openapi/api-responses';
import { InviteUserDto, UpdateUserDto, UserQueryDto } from './dto/user.dto';
import { UsersService } from './users.service';

@ScopedController('users')
@Controller('users')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @ListRoute('User', 'UserView', { description: 'The accounts in your scope' })
  list(@CurrentCaller() caller: Caller, @Query() query: UserQueryDto): Promise<Page<UserView>> {
    return this.users.list(caller, query);
  }

  @ReadRoute('User', 'UserView', {
    description: 'One account',
    notFound: 'No such user in your scope',
  })
  get(@CurrentCaller() caller: Caller, @Param('id') id: string): Promise<UserView> {
    return this.users.get(caller, id);
  }

  @Post('invitations')
  @RequirePermission('invite', 'User')
  @ApiOperation({ summary: 'Creates an invited account and e-mails a single-use link' })
  @ApiResult('UserView', { description: 'The invited account', status: HttpStatus.CREATED })
  @ApiConflictResponse({ description: 'The e-mail already has an account' })
  invite(@CurrentCaller() caller: Caller, @Body() body: InviteUserDto): Promise<UserView> {
    return this.users.invite(caller, body);
  }

  @Post(':id/invitation')
  @RequirePermission('invite', 'User')
  @ApiOperation({ summary: 'Sends the invitation again with a new link' })
  @ApiResult('UserView', { description: 'The invited account', status: HttpStatus.CREATED })
  resend(@CurrentCaller() caller: Caller, @Param('id') id: string): Promise<UserView> {
    return this.users.resendInvitation(caller, id);
  }

  @UpdateRoute('User', 'UserView', { description: 'The changed account' })
  @ApiOperation({ summary: 'Name, role and membership, or deactivation (ends every session)' })
  update(
    @CurrentCaller() caller: Caller,
    @Param('id') id: string,
    @Body() body: UpdateUserDto,
  ): Promise<UserView> {
    return this.users.update(caller, id, body);
  }
}
