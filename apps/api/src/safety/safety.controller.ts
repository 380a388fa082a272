import { Body, Controller, Get, HttpCode, Param, Post, Put, Query, Req } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiConflictResponse,
  ApiExtraModels,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
  getSchemaPath,
} from '@nestjs/swagger';
import {
  type JobSafetyView,
  type LocalRulesView,
  type MaterialHazard,
  type SafetyNotice,
} from '@kerfwright/contracts';
import { type AuthUser, CurrentUser, Roles } from '../common/decorators/auth.decorators';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { ParseIdPipe } from '../common/pipes/parse-id.pipe';
import { AcknowledgeSafetyDto, LocalRulesDto, NoticeFilterQuery } from './dto/safety.dto';
import {
  JobSafetyResponse,
  LocalRulesResponse,
  MaterialHazardResponse,
  SafetyNoticeResponse,
} from './dto/safety.response';
import { SafetyService } from './safety.service';

@ApiTags('safety')
@ApiBearerAuth()
@ApiExtraModels(LocalRulesResponse)
@Controller()
export class SafetyController {
  constructor(private readonly safety: SafetyService) {}

  @Get('safety/notices')
  @ApiOkResponse({
    type: [SafetyNoticeResponse],
    description:
      'Current notice versions, most serious first, optionally for one machine kind and material family',
  })
  notices(@Query() q: NoticeFilterQuery): Promise<SafetyNotice[]> {
    return this.safety.notices(q);
  }

  @Get('safety/hazards')
  @ApiOkResponse({ type: [MaterialHazardResponse], description: 'The material hazard table' })
  hazards(): Promise<MaterialHazard[]> {
    return this.safety.hazards();
  }

  @Get('safety/local-rules')
  @ApiOkResponse({
    description: 'The workshop’s own rules (latest version), or null (an empty body) when none are set',
    schema: { allOf: [{ $ref: getSchemaPath(LocalRulesResponse) }], nullable: true },
  })
  localRules(): Promise<LocalRulesView | null> {
    return this.safety.localRules();
  }

  @Put('safety/local-rules')
  @Roles('supervisor')
  @ApiOperation({ summary: 'Replace the local rules (a new version; supervisor)' })
  @ApiOkResponse({ type: LocalRulesResponse, description: 'The new version' })
  updateLocalRules(
    @CurrentUser() u: AuthUser,
    @Body() dto: LocalRulesDto,
    @Req() req: unknown,
  ): Promise<LocalRulesView> {
    return this.safety.updateLocalRules(u, dto.body, requestIdOf(req), dto.version);
  }

  @Get('jobs/:id/safety')
  @ApiOkResponse({
    type: JobSafetyResponse,
    description: 'Notices for the job’s machine and material, local rules, and the caller’s acknowledgement',
  })
  forJob(@CurrentUser() u: AuthUser, @Param('id', new ParseIdPipe()) id: string): Promise<JobSafetyView> {
    return this.safety.forJob(u, id);
  }

  @Post('jobs/:id/safety/acknowledge')
  @HttpCode(200)
  @Roles('operator')
  @ApiOperation({
    summary: 'Acknowledge the current notices and local rules for a job (operator or supervisor)',
  })
  @ApiOkResponse({ type: JobSafetyResponse, description: 'The job’s safety view, now acknowledged' })
  @ApiConflictResponse({
    description:
      'SAFETY.STALE_ACKNOWLEDGEMENT (the notices or local rules changed since they were read), SAFETY.PREPARATION_CHANGED (the job was prepared again since its notices were read) or SAFETY.JOB_NOT_PREPARED (the job has no machine and material yet, so no notices of its own)',
  })
  acknowledge(
    @CurrentUser() u: AuthUser,
    @Param('id', new ParseIdPipe()) id: string,
    @Body() dto: AcknowledgeSafetyDto,
    @Req() req: unknown,
  ): Promise<JobSafetyView> {
    return this.safety.acknowledge(u, id, dto, requestIdOf(req));
  }
}
