import { Body, Controller, Get, HttpCode, Param, Patch, Post, Query, Req } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiForbiddenResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
  ApiTooManyRequestsResponse,
} from '@nestjs/swagger';
import { type JobDetailView, type JobView, type Page } from '@kerfwright/contracts';
import { type AuthUser, CurrentUser } from '../common/decorators/auth.decorators';
import { ParseIdPipe } from '../common/pipes/parse-id.pipe';
import {
  CreateJobDto,
  JobActionDto,
  ListJobsQuery,
  PrepareJobDto,
  RecordCutDto,
  ReturnJobDto,
  UpdateJobDto,
} from './dto/job.dto';
import { JobDetailViewDto, JobPageDto } from './dto/job.response';
import { JobsService } from './jobs.service';

const ID = new ParseIdPipe();

/**
 * Jobs and their state changes. Each action is its own route so roles and bodies stay explicit; the
 * state machine (JOB_TRANSITIONS in contracts) decides what is legal (409 otherwise). Release goes through
 * the cut-pack queue, so its route lives with the exports (`POST /api/jobs/:id/release`, 202 { exportId }).
 */
@ApiTags('jobs')
@ApiBearerAuth()
@Controller('jobs')
export class JobsController {
  constructor(private readonly jobs: JobsService) {}

  @Get()
  @ApiOkResponse({ type: JobPageDto, description: 'A page of jobs (hobbyists see their own)' })
  list(@CurrentUser() user: AuthUser, @Query() query: ListJobsQuery): Promise<Page<JobView>> {
    return this.jobs.list(user, query);
  }

  @Post()
  @ApiCreatedResponse({ type: JobDetailViewDto, description: 'A draft job for a design' })
  create(
    @CurrentUser() user: AuthUser,
    @Body() dto: CreateJobDto,
    @Req() req: unknown,
  ): Promise<JobDetailView> {
    return this.jobs.create(user, dto, req);
  }

  @Get(':id')
  @ApiOkResponse({ type: JobDetailViewDto, description: 'The job with its history of transitions' })
  get(@CurrentUser() user: AuthUser, @Param('id', ID) id: string): Promise<JobDetailView> {
    return this.jobs.get(user, id);
  }

  @Patch(':id')
  @ApiOkResponse({ type: JobDetailViewDto, description: 'The job after the change' })
  @ApiConflictResponse({ description: 'JOB.NOT_EDITABLE (not a draft) or JOB.STALE_VERSION' })
  @ApiForbiddenResponse({ description: 'JOB.ACTION_NOT_ALLOWED: only its requester or a supervisor' })
  @ApiOperation({
    summary:
      "A draft's copies and notes (its requester or a supervisor); a new number of copies drops the old layout",
  })
  update(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: UpdateJobDto,
    @Req() req: unknown,
  ): Promise<JobDetailView> {
    return this.jobs.update(u, id, dto, req);
  }

  @Post(':id/request')
  @HttpCode(200)
  @ApiOkResponse({ type: JobDetailViewDto, description: 'The job after the change' })
  @ApiConflictResponse({ description: 'JOB.ILLEGAL_TRANSITION, JOB.STALE_VERSION or a rule of the action' })
  @ApiTooManyRequestsResponse({
    description:
      'JOB.REQUESTED_TOO_OFTEN: the job was requested three times in the last ten minutes; ' +
      'JOB.TOO_MANY_OPEN_REQUESTS: the requester (not a fabricator or supervisor) already has ' +
      'KW_OPEN_REQUEST_LIMIT jobs waiting for the workshop (requested, or prepared and not yet approved)',
  })
  @ApiOperation({ summary: 'draft → requested (the requester)' })
  request(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: JobActionDto,
    @Req() req: unknown,
  ) {
    return this.jobs.request(u, id, dto.version, req);
  }

  @Post(':id/prepare')
  @HttpCode(200)
  @ApiOkResponse({ type: JobDetailViewDto, description: 'The job after the change' })
  @ApiConflictResponse({ description: 'JOB.ILLEGAL_TRANSITION, JOB.STALE_VERSION or a rule of the action' })
  @ApiOperation({
    summary:
      'requested → prepared (fabricator): material, machine profile version, colours; the engine lays it out',
  })
  prepare(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: PrepareJobDto,
    @Req() req: unknown,
  ) {
    return this.jobs.prepare(u, id, dto, req);
  }

  @Post(':id/approve')
  @HttpCode(200)
  @ApiOkResponse({ type: JobDetailViewDto, description: 'The job after the change' })
  @ApiConflictResponse({ description: 'JOB.ILLEGAL_TRANSITION, JOB.STALE_VERSION or a rule of the action' })
  @ApiOperation({ summary: 'prepared → approved (a supervisor who did not prepare the job)' })
  @ApiForbiddenResponse({
    description:
      'JOB.ACTION_NOT_ALLOWED: supervisors only; JOB.SELF_APPROVAL: the caller prepared this job (four-eyes rule)',
  })
  approve(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: JobActionDto,
    @Req() req: unknown,
  ) {
    return this.jobs.approve(u, id, dto.version, req);
  }

  @Post(':id/cut')
  @HttpCode(200)
  @ApiOkResponse({ type: JobDetailViewDto, description: 'The job after the change' })
  @ApiConflictResponse({ description: 'JOB.ILLEGAL_TRANSITION, JOB.STALE_VERSION or a rule of the action' })
  @ApiOperation({ summary: 'released → cut (operator): actual time, sheets used, measured kerf' })
  cut(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: RecordCutDto,
    @Req() req: unknown,
  ) {
    return this.jobs.recordCut(u, id, dto, req);
  }

  @Post(':id/close')
  @HttpCode(200)
  @ApiOkResponse({ type: JobDetailViewDto, description: 'The job after the change' })
  @ApiConflictResponse({ description: 'JOB.ILLEGAL_TRANSITION, JOB.STALE_VERSION or a rule of the action' })
  @ApiOperation({ summary: 'cut → closed (operator or fabricator)' })
  close(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: JobActionDto,
    @Req() req: unknown,
  ) {
    return this.jobs.close(u, id, dto.version, req);
  }

  @Post(':id/return')
  @HttpCode(200)
  @ApiOkResponse({ type: JobDetailViewDto, description: 'The job after the change' })
  @ApiConflictResponse({ description: 'JOB.ILLEGAL_TRANSITION, JOB.STALE_VERSION or a rule of the action' })
  @ApiOperation({ summary: 'requested | prepared | approved → returned, with a reason (fabricator)' })
  returnJob(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: ReturnJobDto,
    @Req() req: unknown,
  ) {
    return this.jobs.returnJob(u, id, dto.version, dto.reason, req);
  }

  @Post(':id/reopen')
  @HttpCode(200)
  @ApiOkResponse({ type: JobDetailViewDto, description: 'The job after the change' })
  @ApiConflictResponse({ description: 'JOB.ILLEGAL_TRANSITION, JOB.STALE_VERSION or a rule of the action' })
  @ApiOperation({ summary: 'returned → draft (the requester)' })
  reopen(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: JobActionDto,
    @Req() req: unknown,
  ) {
    return this.jobs.reopen(u, id, dto.version, req);
  }

  @Post(':id/withdraw')
  @HttpCode(200)
  @ApiOkResponse({ type: JobDetailViewDto, description: 'The job after the change' })
  @ApiConflictResponse({ description: 'JOB.ILLEGAL_TRANSITION, JOB.STALE_VERSION or a rule of the action' })
  @ApiOperation({ summary: 'requested → draft, before it is prepared (the requester)' })
  withdraw(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: JobActionDto,
    @Req() req: unknown,
  ) {
    return this.jobs.withdraw(u, id, dto.version, req);
  }
}
