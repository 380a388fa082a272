import { Body, Controller, Delete, Get, HttpCode, Param, Patch, Post, Query, Req } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiForbiddenResponse,
  ApiNoContentResponse,
  ApiNotFoundResponse,
  ApiOkResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import { type MaterialView, type Page } from '@kerfwright/contracts';
import { type AuthUser, CurrentUser, Roles } from '../common/decorators/auth.decorators';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { ParseIdPipe } from '../common/pipes/parse-id.pipe';
import { CreateMaterialDto } from './dto/create-material.dto';
import { ListMaterialsQueryDto } from './dto/list-materials.query';
import { MaterialPageResponse, MaterialResponse } from './dto/material.response';
import { UpdateMaterialDto } from './dto/update-material.dto';
import { MaterialsService } from './materials.service';

/** The materials library: every signed-in user reads it; fabricators and supervisors keep it. */
@ApiTags('materials')
@ApiBearerAuth()
@Controller('materials')
export class MaterialsController {
  constructor(private readonly materials: MaterialsService) {}

  @Get()
  @ApiOperation({
    summary: 'List materials (any signed-in user): page, pageSize, sort, family, q, laserAllowed',
  })
  @ApiOkResponse({ type: MaterialPageResponse, description: 'One page of materials' })
  list(@Query() query: ListMaterialsQueryDto): Promise<Page<MaterialView>> {
    return this.materials.list(query);
  }

  @Get(':id')
  @ApiOperation({ summary: 'One material (any signed-in user)' })
  @ApiOkResponse({ type: MaterialResponse })
  @ApiNotFoundResponse({ description: 'MATERIAL.NOT_FOUND' })
  get(@Param('id', new ParseIdPipe()) id: string): Promise<MaterialView> {
    return this.materials.get(id);
  }

  @Post()
  @ApiOperation({
    summary: 'Add a material (fabricator, supervisor); laser use is checked against the hazard table',
  })
  @Roles('fabricator')
  @ApiCreatedResponse({ type: MaterialResponse })
  @ApiForbiddenResponse({ description: 'AUTH.FORBIDDEN: fabricators and supervisors only' })
  @ApiConflictResponse({ description: 'MATERIAL.NAME_TAKEN or MATERIAL.LASER_PROHIBITED' })
  create(
    @CurrentUser() user: AuthUser,
    @Body() dto: CreateMaterialDto,
    @Req() req: unknown,
  ): Promise<MaterialView> {
    return this.materials.create({ id: user.id, requestId: requestIdOf(req), role: user.role }, dto);
  }

  @Patch(':id')
  @ApiOperation({ summary: 'Change a material (fabricator, supervisor); send the version you read' })
  @Roles('fabricator')
  @ApiOkResponse({ type: MaterialResponse })
  @ApiForbiddenResponse({
    description:
      'AUTH.FORBIDDEN: fabricators and supervisors only; MATERIAL.LASER_RELEASE_NEEDS_SUPERVISOR: only a supervisor allows a material kept off the laser back on it, or moves a laser-usable one into a family the laser cuts only on a condition',
  })
  @ApiConflictResponse({
    description: 'MATERIAL.STALE_VERSION, MATERIAL.NAME_TAKEN or MATERIAL.LASER_PROHIBITED',
  })
  update(
    @CurrentUser() user: AuthUser,
    @Param('id', new ParseIdPipe()) id: string,
    @Body() dto: UpdateMaterialDto,
    @Req() req: unknown,
  ): Promise<MaterialView> {
    return this.materials.update({ id: user.id, requestId: requestIdOf(req), role: user.role }, id, dto);
  }

  @Delete(':id')
  @ApiOperation({ summary: 'Delete an unused material (fabricator, supervisor)' })
  @Roles('fabricator')
  @HttpCode(204)
  @ApiNoContentResponse({ description: 'Deleted' })
  @ApiForbiddenResponse({ description: 'AUTH.FORBIDDEN: fabricators and supervisors only' })
  @ApiConflictResponse({ description: 'MATERIAL.IN_USE: a job, machine profile or kerf record refers to it' })
  async remove(
    @CurrentUser() user: AuthUser,
    @Param('id', new ParseIdPipe()) id: string,
    @Req() req: unknown,
  ): Promise<void> {
    await this.materials.remove({ id: user.id, requestId: requestIdOf(req), role: user.role }, id);
  }
}
