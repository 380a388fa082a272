import {
  Body,
  Controller,
  Get,
  HttpCode,
  Param,
  Post,
  Req,
  Res,
  Sse,
  StreamableFile,
  type MessageEvent,
} from '@nestjs/common';
import {
  ApiAcceptedResponse,
  ApiBearerAuth,
  ApiExtraModels,
  ApiConflictResponse,
  ApiForbiddenResponse,
  ApiOkResponse,
  ApiOperation,
  ApiProduces,
  ApiTags,
  getSchemaPath,
} from '@nestjs/swagger';
import { type Response } from 'express';
import { type Observable } from 'rxjs';
import { type ExportRequested, type ExportView } from '@kerfwright/contracts';
import { type AuthUser, CurrentUser, Roles } from '../common/decorators/auth.decorators';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { ParseIdPipe } from '../common/pipes/parse-id.pipe';
import { JobActionDto, RequestExportDto } from '../jobs/dto/job.dto';
import { ExportRequestedDto, ExportViewDto } from './dto/export.dto';
import { ExportsService } from './exports.service';
import { assertVersion } from '../jobs/job-access';

const ID = new ParseIdPipe();
/** Content types of cut-pack files: DXF/SVG drawings, PDF sheets and guide, the JSON manifest, the ZIP archive. */
const FILE_CONTENT_TYPES = [
  'application/dxf',
  'image/svg+xml',
  'application/pdf',
  'application/json',
  'application/zip',
];

/** Cut-pack exports: queued by fabricators, followed by polling or server-sent events, downloaded by operators. */
@ApiTags('exports')
@ApiBearerAuth()
@ApiExtraModels(ExportViewDto)
@Controller()
export class ExportsController {
  constructor(private readonly exports: ExportsService) {}

  @Post('jobs/:id/exports')
  @HttpCode(202)
  @Roles('fabricator')
  @ApiOperation({
    summary: 'Queue the cut pack of an approved (or released) job; when done, an approved job is released',
  })
  @ApiAcceptedResponse({ type: ExportRequestedDto, description: 'Follow it at /api/exports/{exportId}' })
  request(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: RequestExportDto,
    @Req() req: unknown,
  ): Promise<ExportRequested> {
    const version = dto.version;
    return this.exports.request(
      u,
      id,
      requestIdOf(req),
      version === undefined ? undefined : (job) => assertVersion(job, version),
    );
  }

  @Post('jobs/:id/release')
  @HttpCode(202)
  @Roles('fabricator')
  @ApiTags('jobs')
  @ApiOperation({
    summary:
      'approved → released (fabricator): queues the cut pack; the job is released when the export is done',
  })
  @ApiAcceptedResponse({
    type: ExportRequestedDto,
    description: 'The queued export; the job stays approved until its files are stored',
  })
  release(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Body() dto: JobActionDto,
    @Req() req: unknown,
  ): Promise<ExportRequested> {
    return this.exports.release(u, id, dto.version, requestIdOf(req));
  }

  @Get('jobs/:id/exports')
  @ApiOkResponse({
    type: [ExportViewDto],
    description:
      'The cut packs of the job’s preparation in effect, newest first (none yet: an empty list). Packs built ' +
      'before the job was returned and prepared again are not listed; the audit trail keeps them',
  })
  list(@CurrentUser() u: AuthUser, @Param('id', ID) id: string): Promise<ExportView[]> {
    return this.exports.list(u, id);
  }

  @Get('exports/:id')
  @ApiOkResponse({
    type: ExportViewDto,
    description: 'State, progress %, error code and (when done) files with SHA-256 checksums',
  })
  get(@CurrentUser() u: AuthUser, @Param('id', ID) id: string): Promise<ExportView> {
    return this.exports.get(u, id);
  }

  @Sse('exports/:id/events')
  @ApiOperation({ summary: 'Server-sent events: the export view on every change; ends with done or failed' })
  @ApiProduces('text/event-stream')
  @ApiOkResponse({
    description:
      'A text/event-stream. Each event is named `progress`, `done` or `failed` (the last one sent) and its ' +
      '`data` line is the export view as JSON',
    content: {
      'text/event-stream': {
        schema: {
          type: 'object',
          description: 'One server-sent event',
          required: ['event', 'data'],
          properties: {
            event: { type: 'string', enum: ['progress', 'done', 'failed'] },
            data: { $ref: getSchemaPath(ExportViewDto) },
          },
        },
      },
    },
  })
  events(@CurrentUser() u: AuthUser, @Param('id', ID) id: string): Promise<Observable<MessageEvent>> {
    return this.exports.events(u, id);
  }

  @Get('exports/:id/files/:name')
  @ApiOperation({
    summary:
      'Download one file (operators and supervisors: after acknowledging the job’s current safety notices; hobbyists: their own assembly guide; not fabricators)',
  })
  @ApiProduces(...FILE_CONTENT_TYPES)
  @ApiOkResponse({
    description:
      'The stored bytes, with Content-Disposition: attachment and a Repr-Digest (RFC 9530) SHA-256 header',
    content: Object.fromEntries(
      FILE_CONTENT_TYPES.map((t) => [t, { schema: { type: 'string', format: 'binary' } }]),
    ),
  })
  @ApiForbiddenResponse({
    description:
      'SAFETY.ACKNOWLEDGEMENT_REQUIRED (operators and supervisors: the job’s current notices not yet acknowledged) or EXPORT.DOWNLOAD_NOT_ALLOWED (fabricators)',
  })
  @ApiConflictResponse({
    description:
      'EXPORT.NOT_DONE, EXPORT.JOB_NOT_RELEASED, EXPORT.PREPARATION_REPLACED (the pack was built before the job was returned and prepared again), or EXPORT.SAFETY_CHANGED (the setup sheet or ZIP prints safety notices changed since the build)',
  })
  async download(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Param('name') name: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    const file = await this.exports.open(u, id, name);
    // The recorded checksum, as an RFC 9530 representation digest, so clients can verify what they saved.
    res.setHeader('Repr-Digest', `sha-256=:${Buffer.from(file.sha256, 'hex').toString('base64')}:`);
    return new StreamableFile(file.body, {
      type: file.contentType,
      length: file.bytes,
      disposition: `attachment; filename="${file.name}"`,
    });
  }
}
