import { Body, Controller, Get, HttpCode, Param, ParseUUIDPipe, Post, Query, Req } from '@nestjs/common';
import { ApiBearerAuth, ApiCreatedResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type JobDetailView, type JobView, type Page } from '@kerfwright/contracts';
import { type AuthUser, CurrentUser } from '../common/decorators/auth.decorators';
import {
  CreateJobDto,
  JobActionDto,
  ListJobsQuery,
  PrepareJobDto,
  RecordCutDto,
  ReturnJobDto,
} from './dto/job.dto';
import { JobsService } from './jobs.service';

const ID = new ParseUUIDPipe();

/**
 * Jobs and their state changes. Each action is its own route so roles and bodies stay explicit; the
 * state machine (JOB_TRANSITIONS in contracts) decides what is legal (409 otherwise).
 */
@ApiTags('jobs')
@ApiBearerAuth()
@Controller('jobs')
export class JobsController {
  constructor(private readonly jobs: JobsService) {}

  @Get()
  @ApiOkResponse({ description: 'A page of jobs (hobbyists see their own)' })
  list(@CurrentUser() user: AuthUser, @Query() query: ListJobsQuery): Promise<Page<JobView>> {
    return this.jobs.list(user, query);
  }

  @Post()
  @ApiCreatedResponse({ description: 'A draft job for a design' })
  create(
    @CurrentUser() user: AuthUser,
    @Body() dto: CreateJobDto,
    @Req() req: unknown,
  ): Promise<JobDetailView> {
    return this.jobs.create(user, dto, req);
  }

  @Get(':id')
  @ApiOkResponse({ description: 'The job with its history of transitions' })
  get(@CurrentUser() user: AuthUser, @Param('id', ID) id: string): Promise<JobDetailView> {
    return this.jobs.get(user, id);
  }

  @Post(':id/request')
  @HttpCode(200)
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
  @ApiOperation({ summary: 'prepared → approved (supervisor)' })
  approve(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: JobActionDto,
    @Req() req: unknown,
  ) {
    return this.jobs.approve(u, id, dto.version, req);
  }

  @Post(':id/release')
  @HttpCode(200)
  @ApiOperation({ summary: 'approved → released (fabricator)' })
  release(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: JobActionDto,
    @Req() req: unknown,
  ) {
    return this.jobs.release(u, id, dto.version, req);
  }

  @Post(':id/cut')
  @HttpCode(200)
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
  @ApiOperation({ summary: 'returned → draft (the requester)' })
  reopen(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: JobActionDto,
    @Req() req: unknown,
  ) {
    return this.jobs.reopen(u, id, dto.version, req);
  }
}
