import { Body, Controller, Get, HttpCode, Param, ParseUUIDPipe, Post, Put, Query, Req } from '@nestjs/common';
import { ApiBearerAuth, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import {
  type JobSafetyView,
  type LocalRulesView,
  type MaterialHazard,
  type SafetyNotice,
} from '@kerfwright/contracts';
import { type AuthUser, CurrentUser, Roles } from '../common/decorators/auth.decorators';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { AcknowledgeSafetyDto, LocalRulesDto, NoticeFilterQuery } from './dto/safety.dto';
import { SafetyService } from './safety.service';

@ApiTags('safety')
@ApiBearerAuth()
@Controller()
export class SafetyController {
  constructor(private readonly safety: SafetyService) {}

  @Get('safety/notices')
  @ApiOkResponse({
    description:
      'Current notice versions, most serious first, optionally for one machine kind and material family',
  })
  notices(@Query() q: NoticeFilterQuery): Promise<SafetyNotice[]> {
    return this.safety.notices(q);
  }

  @Get('safety/hazards')
  @ApiOkResponse({ description: 'The material hazard table' })
  hazards(): Promise<MaterialHazard[]> {
    return this.safety.hazards();
  }

  @Get('safety/local-rules')
  @ApiOkResponse({ description: 'The workshop’s own rules (latest version), or null' })
  localRules(): Promise<LocalRulesView | null> {
    return this.safety.localRules();
  }

  @Put('safety/local-rules')
  @Roles('supervisor')
  @ApiOperation({ summary: 'Replace the local rules (a new version; supervisor)' })
  updateLocalRules(
    @CurrentUser() u: AuthUser,
    @Body() dto: LocalRulesDto,
    @Req() req: unknown,
  ): Promise<LocalRulesView> {
    return this.safety.updateLocalRules(u, dto.body, requestIdOf(req));
  }

  @Get('jobs/:id/safety')
  @ApiOkResponse({
    description: 'Notices for the job’s machine and material, local rules, and the caller’s acknowledgement',
  })
  forJob(@CurrentUser() u: AuthUser, @Param('id', new ParseUUIDPipe()) id: string): Promise<JobSafetyView> {
    return this.safety.forJob(u, id);
  }

  @Post('jobs/:id/safety/acknowledge')
  @HttpCode(200)
  @Roles('operator')
  @ApiOperation({
    summary: 'Acknowledge the current notices and local rules for a job (operator or supervisor)',
  })
  acknowledge(
    @CurrentUser() u: AuthUser,
    @Param('id', new ParseUUIDPipe()) id: string,
    @Body() dto: AcknowledgeSafetyDto,
    @Req() req: unknown,
  ): Promise<JobSafetyView> {
    return this.safety.acknowledge(u, id, dto, requestIdOf(req));
  }
}
