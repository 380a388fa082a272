import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  Param,
  Patch,
  Post,
  Query,
  Req,
  UploadedFile,
  UseInterceptors,
} from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import {
  ApiBearerAuth,
  ApiBody,
  ApiConsumes,
  ApiCreatedResponse,
  ApiNoContentResponse,
  ApiOkResponse,
  ApiTags,
} from '@nestjs/swagger';
import {
  SOLID_UPLOAD_MAX_BYTES,
  type DesignSummary,
  type DesignView,
  type Page,
} from '@kerfwright/contracts';
import { type AuthUser, CurrentUser } from '../common/decorators/auth.decorators';
import { AppError } from '../common/errors';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { ParseIdPipe } from '../common/pipes/parse-id.pipe';
import { DesignsService } from './designs.service';
import {
  CreateDesignDto,
  DesignPageDto,
  DesignViewDto,
  ListDesignsQuery,
  SolidCheckDto,
  UpdateDesignDto,
} from './dto/design.dto';

const UPLOAD = FileInterceptor('file', { limits: { fileSize: SOLID_UPLOAD_MAX_BYTES, files: 1, fields: 5 } });
const FILE_BODY = { schema: { type: 'object', properties: { file: { type: 'string', format: 'binary' } } } };

type UploadedSolidFile = { originalname: string; buffer: Buffer } | undefined;

function requireFile(file: UploadedSolidFile): { originalname: string; buffer: Buffer } {
  if (!file)
    throw new AppError(400, 'DESIGN.UPLOAD_MISSING', 'Attach the solid as the multipart field "file"', [
      { field: 'file', messages: ['required'] },
    ]);
  return file;
}

@ApiTags('designs')
@ApiBearerAuth()
@Controller('designs')
export class DesignsController {
  constructor(private readonly designs: DesignsService) {}

  @Get()
  @ApiOkResponse({ type: DesignPageDto, description: 'A page of designs (hobbyists see their own)' })
  list(@CurrentUser() user: AuthUser, @Query() query: ListDesignsQuery): Promise<Page<DesignSummary>> {
    return this.designs.list(user, query);
  }

  @Post()
  @ApiCreatedResponse({ type: DesignViewDto })
  create(
    @CurrentUser() user: AuthUser,
    @Body() dto: CreateDesignDto,
    @Req() req: unknown,
  ): Promise<DesignView> {
    return this.designs.create(user, dto, requestIdOf(req));
  }

  @Post('solid-check')
  @HttpCode(200)
  @UseInterceptors(UPLOAD)
  @ApiConsumes('multipart/form-data')
  @ApiBody(FILE_BODY)
  @ApiOkResponse({ type: SolidCheckDto, description: 'The engine accepted the solid; nothing is stored' })
  checkSolid(@UploadedFile() file: UploadedSolidFile) {
    return this.designs.checkSolid(requireFile(file));
  }

  @Get(':id')
  @ApiOkResponse({ type: DesignViewDto })
  get(@CurrentUser() user: AuthUser, @Param('id', new ParseIdPipe()) id: string): Promise<DesignView> {
    return this.designs.get(user, id);
  }

  @Patch(':id')
  @ApiOkResponse({ type: DesignViewDto })
  update(
    @CurrentUser() user: AuthUser,
    @Param('id', new ParseIdPipe()) id: string,
    @Body() dto: UpdateDesignDto,
    @Req() req: unknown,
  ): Promise<DesignView> {
    return this.designs.update(user, id, dto, requestIdOf(req));
  }

  @Delete(':id')
  @HttpCode(204)
  @ApiNoContentResponse()
  remove(
    @CurrentUser() user: AuthUser,
    @Param('id', new ParseIdPipe()) id: string,
    @Req() req: unknown,
  ): Promise<void> {
    return this.designs.remove(user, id, requestIdOf(req));
  }

  @Post(':id/duplicate')
  @ApiCreatedResponse({ type: DesignViewDto })
  duplicate(
    @CurrentUser() user: AuthUser,
    @Param('id', new ParseIdPipe()) id: string,
    @Req() req: unknown,
  ): Promise<DesignView> {
    return this.designs.duplicate(user, id, requestIdOf(req));
  }

  @Post(':id/solid')
  @UseInterceptors(UPLOAD)
  @ApiConsumes('multipart/form-data')
  @ApiBody(FILE_BODY)
  @ApiCreatedResponse({ type: DesignViewDto })
  attachSolid(
    @CurrentUser() user: AuthUser,
    @Param('id', new ParseIdPipe()) id: string,
    @UploadedFile() file: UploadedSolidFile,
    @Req() req: unknown,
  ): Promise<DesignView> {
    return this.designs.attachSolid(user, id, requireFile(file), requestIdOf(req));
  }
}
