import { Body, Controller, Get, Param, Post, Query, Req } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiForbiddenResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import { type KerfRecordView, type MachineProfileVersionView, type Page } from '@kerfwright/contracts';
import { type AuthUser, CurrentUser, Roles } from '../common/decorators/auth.decorators';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { ParseIdPipe } from '../common/pipes/parse-id.pipe';
import { CreateKerfRecordDto } from './dto/create-kerf-record.dto';
import { ListKerfRecordsQueryDto } from './dto/list-machine-profiles.query';
import {
  KerfRecordPageResponse,
  KerfRecordResponse,
  MachineProfileVersionResponse,
} from './dto/machine-profile.response';
import { KerfRecordsService } from './kerf-records.service';

const uuid = new ParseIdPipe();

/** Measured kerfs per machine and material: operators and fabricators record and read them. */
@ApiTags('machine-profiles')
@ApiBearerAuth()
@Controller('machine-profiles/:id/kerf-records')
export class KerfRecordsController {
  constructor(private readonly kerfRecords: KerfRecordsService) {}

  @Post()
  @ApiOperation({ summary: 'Record a measured kerf for a material (operator, fabricator, supervisor)' })
  @Roles('operator', 'fabricator')
  @ApiCreatedResponse({ type: KerfRecordResponse })
  @ApiForbiddenResponse({ description: 'AUTH.FORBIDDEN: operators, fabricators and supervisors only' })
  record(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @Body() dto: CreateKerfRecordDto,
    @Req() req: unknown,
  ): Promise<KerfRecordView> {
    return this.kerfRecords.record(
      { id: user.id, displayName: user.displayName, requestId: requestIdOf(req) },
      id,
      dto,
    );
  }

  @Get()
  @ApiOperation({
    summary:
      'Kerf history of the machine, oldest first; filter by materialId (operator, fabricator, supervisor)',
  })
  @Roles('operator', 'fabricator')
  @ApiOkResponse({ type: KerfRecordPageResponse, description: 'Oldest first, for a chart' })
  list(
    @Param('id', uuid) id: string,
    @Query() query: ListKerfRecordsQueryDto,
  ): Promise<Page<KerfRecordView>> {
    return this.kerfRecords.list(id, query);
  }

  @Post(':recordId/adopt')
  @ApiOperation({ summary: 'Adopt a measured kerf into the draft version (fabricator, supervisor)' })
  @Roles('fabricator')
  @ApiCreatedResponse({
    type: MachineProfileVersionResponse,
    description: 'The draft now holding the measured value (the open draft, or a new one)',
  })
  @ApiForbiddenResponse({ description: 'AUTH.FORBIDDEN: fabricators and supervisors only' })
  @ApiConflictResponse({
    description: 'MACHINE_PROFILE.VERSION_PENDING or MACHINE_PROFILE.NO_SETTING_FOR_MATERIAL',
  })
  adopt(
    @CurrentUser() user: AuthUser,
    @Param('id', uuid) id: string,
    @Param('recordId', uuid) recordId: string,
    @Req() req: unknown,
  ): Promise<MachineProfileVersionView> {
    return this.kerfRecords.adopt(
      { id: user.id, displayName: user.displayName, requestId: requestIdOf(req) },
      id,
      recordId,
    );
  }
}
