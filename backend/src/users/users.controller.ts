import { Body, Controller, Get, Param, ParseUUIDPipe, Patch, Post, Query } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiForbiddenResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { Page, UserView } from '@gyre/shared';
import { CurrentCaller, RequirePermission, type Caller } from '../auth/decorators';
import { UserResponseDto } from '../auth/dto/auth-responses.dto';
import { InviteUserDto, UpdateUserDto, UserPageDto, UserQueryDto } from './dto/user.dto';
import { UsersService } from './users.service';

@ApiTags('users')
@ApiBearerAuth()
@ApiForbiddenResponse({ description: 'The role may never do this' })
@Controller('users')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @Get()
  @RequirePermission('read', 'User')
  @ApiOkResponse({ type: UserPageDto })
  list(@CurrentCaller() caller: Caller, @Query() query: UserQueryDto): Promise<Page<UserView>> {
    return this.users.list(caller, query);
  }

  @Get(':id')
  @RequirePermission('read', 'User')
  @ApiOkResponse({ type: UserResponseDto })
  @ApiNotFoundResponse({ description: 'No such user in your scope' })
  get(@CurrentCaller() caller: Caller, @Param('id', ParseUUIDPipe) id: string): Promise<UserView> {
    return this.users.get(caller, id);
  }

  @Post('invitations')
  @RequirePermission('invite', 'User')
  @ApiOperation({ summary: 'Creates an invited account and e-mails a single-use link' })
  @ApiCreatedResponse({ type: UserResponseDto })
  @ApiConflictResponse({ description: 'The e-mail already has an account' })
  invite(@CurrentCaller() caller: Caller, @Body() body: InviteUserDto): Promise<UserView> {
    return this.users.invite(caller, body);
  }

  @Post(':id/invitation')
  @RequirePermission('invite', 'User')
  @ApiOperation({ summary: 'Sends the invitation again with a new link' })
  @ApiCreatedResponse({ type: UserResponseDto })
  resend(
    @CurrentCaller() caller: Caller,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<UserView> {
    return this.users.resendInvitation(caller, id);
  }

  @Patch(':id')
  @RequirePermission('update', 'User')
  @ApiOperation({ summary: 'Name, role and membership, or deactivation (ends every session)' })
  @ApiOkResponse({ type: UserResponseDto })
  update(
    @CurrentCaller() caller: Caller,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() body: UpdateUserDto,
  ): Promise<UserView> {
    return this.users.update(caller, id, body);
  }
}
