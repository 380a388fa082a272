import { Body, Controller, Get, HttpCode, Param, Patch, Post, Query, Req } from '@nestjs/common';
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
import {
  type MachineProfileDetailView,
  type MachineProfileSummaryView,
  type MachineProfileVersionView,
  type Page,
} from '@kerfwright/contracts';
import { type AuthUser, CurrentUser, Roles } from '../common/decorators/auth.decorators';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { ParseIdPipe } from '../common/pipes/parse-id.pipe';
import { CreateMachineProfileDto } from './dto/create-machine-profile.dto';
import { ListMachineProfilesQueryDto } from './dto/list-machine-profiles.query';
import {
  MachineProfileDetailResponse,
  MachineProfilePageResponse,
  MachineProfileVersionResponse,
} from './dto/machine-profile.response';
import {
  ApproveProfileVersionDto,
  CreateProfileVersionDto,
  ProfileDecisionDto,
  RetireProfileVersionDto,
  ReturnProfileVersionDto,
  UpdateProfileVersionDto,
} from './dto/profile-version-requests.dto';
import { MachineProfilesService, type ProfileActor } from './machine-profiles.service';

const uuid = new ParseIdPipe();
const actorOf = (user: AuthUser, req: unknown): ProfileActor => ({
  id: user.id,
  displayName: user.displayName,
  requestId: requestIdOf(req),
});

/**
 * Machine profiles and their versions. Everyone signed in reads them; fabricators draft, edit and
 * submit versions; supervisors approve, send back and retire them.
 */
@ApiTags('machine-profiles')
@ApiBearerAuth()
@Controller('machine-profiles')
export class MachineProfilesController {
  constructor(private readonly profiles: MachineProfilesService) {}

  @Get()
  @ApiOperation({
    summary: 'List machine profiles with their approved and latest versions (any signed-in user)',
  })
  @ApiOkResponse({
    type: MachineProfilePageResponse,
    description: 'Profiles with their approved and latest versions',
  })
  list(@Query() query: ListMachineProfilesQueryDto): Promise<Page<MachineProfileSummaryView>> {
    return this.profiles.list(query);
  }

  @Post()
  @ApiOperation({ summary: 'Create a profile with version 1 as a draft (fabricator, supervisor)' })
  @Roles('fabricator')
  @ApiCreatedResponse({
    type: MachineProfileDetailResponse,
    description: 'The profile with version 1 as a draft',
  })
  @ApiForbiddenResponse({ description: 'AUTH.FORBIDDEN: fabricators and supervisors only' })
  @ApiConflictResponse({ description: 'MACHINE_PROFILE.NAME_TAKEN or MATERIAL.LASER_PROHIBITED' })
  create(
    @CurrentUser() user: AuthUser,
    @Body() dto: CreateMachineProfileDto,
    @Req() req: unknown,
  ): Promise<MachineProfileDetailView> {
    return this.profiles.create(actorOf(user, req), dto);
  }

  @Get(':id')
  @ApiOperation({ summary: 'A profile with every version, newest first (any signed-in user)' })
  @ApiOkResponse({
    type: MachineProfileDetailResponse,
    description: 'The profile with every version, newest first',
  })
  @ApiNotFoundResponse({ description: 'MACHINE_PROFILE.NOT_FOUND' })
  get(@Param('id', uuid) id: string): Promise<MachineProfileDetailView> {
    return this.profiles.get(id);
  }

  @Post(':id/versions')
  @ApiOperation({
    summary: 'Start a new draft from the latest version, with changes (fabricator, supervisor)',
  })
  @Roles('fabricator')
  @ApiCreatedResponse({
    type: MachineProfileVersionResponse,
    description: 'A new draft copied from the latest version',
  })
  @ApiConflictResponse({
    description: 'MACHINE_PROFILE.OPEN_VERSION_EXISTS: a draft or submitted version exists',
  })
  createVersion(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @Body() dto: CreateProfileVersionDto,
    @Req() req: unknown,
  ): Promise<MachineProfileVersionView> {
    return this.profiles.createVersion(actorOf(user, req), id, dto);
  }

  @Patch(':id/versions/:versionId')
  @ApiOperation({ summary: 'Edit a draft version (fabricator, supervisor); send the lockVersion you read' })
  @Roles('fabricator')
  @ApiOkResponse({ type: MachineProfileVersionResponse })
  @ApiConflictResponse({
    description: 'MACHINE_PROFILE.INVALID_STATE (not a draft) or MACHINE_PROFILE.STALE_VERSION',
  })
  updateVersion(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @Param('versionId', uuid) versionId: string,
    @Body() dto: UpdateProfileVersionDto,
    @Req() req: unknown,
  ): Promise<MachineProfileVersionView> {
    return this.profiles.updateVersion(actorOf(user, req), id, versionId, dto);
  }

  @Post(':id/versions/:versionId/submit')
  @ApiOperation({ summary: 'draft → submitted (fabricator, supervisor); supervisors are mailed' })
  @Roles('fabricator')
  @HttpCode(200)
  @ApiOkResponse({ type: MachineProfileVersionResponse, description: 'Submitted; supervisors are mailed' })
  @ApiConflictResponse({
    description:
      'MACHINE_PROFILE.INVALID_STATE, STALE_VERSION, INCOMPLETE, or NO_CHANGES (the same values as the approved version)',
  })
  submit(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @Param('versionId', uuid) versionId: string,
    @Body() dto: ProfileDecisionDto,
    @Req() req: unknown,
  ): Promise<MachineProfileVersionView> {
    return this.profiles.submit(actorOf(user, req), id, versionId, dto);
  }

  @Post(':id/versions/:versionId/approve')
  @ApiOperation({
    summary:
      'submitted → approved (a supervisor who neither drafted, edited nor submitted the version); the previously approved version is retired',
  })
  @Roles('supervisor')
  @HttpCode(200)
  @ApiOkResponse({
    type: MachineProfileVersionResponse,
    description: 'Approved; the version approved before is retired',
  })
  @ApiForbiddenResponse({
    description:
      'AUTH.FORBIDDEN: supervisors only; MACHINE_PROFILE.SELF_APPROVAL: the caller drafted, edited or submitted this version (four-eyes rule)',
  })
  @ApiConflictResponse({
    description:
      'MACHINE_PROFILE.INVALID_STATE, MACHINE_PROFILE.STALE_VERSION, or MACHINE_PROFILE.CONDITIONS_UNCHECKED (a laser version with materials cut only on a condition, approved without conditionsChecked)',
  })
  approve(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @Param('versionId', uuid) versionId: string,
    @Body() dto: ApproveProfileVersionDto,
    @Req() req: unknown,
  ): Promise<MachineProfileVersionView> {
    return this.profiles.approve(actorOf(user, req), id, versionId, dto);
  }

  @Post(':id/versions/:versionId/return')
  @ApiOperation({ summary: 'submitted → draft with a reason (supervisor)' })
  @Roles('supervisor')
  @HttpCode(200)
  @ApiOkResponse({ type: MachineProfileVersionResponse, description: 'Back to draft with the reason' })
  @ApiForbiddenResponse({ description: 'AUTH.FORBIDDEN: supervisors only' })
  @ApiConflictResponse({ description: 'MACHINE_PROFILE.INVALID_STATE or MACHINE_PROFILE.STALE_VERSION' })
  returnToDraft(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @Param('versionId', uuid) versionId: string,
    @Body() dto: ReturnProfileVersionDto,
    @Req() req: unknown,
  ): Promise<MachineProfileVersionView> {
    return this.profiles.returnToDraft(actorOf(user, req), id, versionId, dto);
  }

  @Post(':id/versions/:versionId/retire')
  @ApiOperation({ summary: 'Retire a version (supervisor)' })
  @Roles('supervisor')
  @HttpCode(200)
  @ApiOkResponse({
    type: MachineProfileVersionResponse,
    description:
      'Retired: no new job can use it. Retiring the approved version takes the machine out of use until a newer one is approved; fabricators, operators and supervisors are mailed, with the jobs that used it',
  })
  @ApiForbiddenResponse({ description: 'AUTH.FORBIDDEN: supervisors only' })
  @ApiConflictResponse({ description: 'MACHINE_PROFILE.INVALID_STATE or MACHINE_PROFILE.STALE_VERSION' })
  retire(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @Param('versionId', uuid) versionId: string,
    @Body() dto: RetireProfileVersionDto,
    @Req() req: unknown,
  ): Promise<MachineProfileVersionView> {
    return this.profiles.retire(actorOf(user, req), id, versionId, dto);
  }
}
