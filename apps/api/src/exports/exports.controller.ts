import {
  Controller,
  Get,
  HttpCode,
  Param,
  ParseUUIDPipe,
  Post,
  Req,
  Res,
  Sse,
  StreamableFile,
  type MessageEvent,
} from '@nestjs/common';
import { ApiAcceptedResponse, ApiBearerAuth, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Response } from 'express';
import { type Observable } from 'rxjs';
import { type ExportView } from '@kerfwright/contracts';
import { type AuthUser, CurrentUser, Roles } from '../common/decorators/auth.decorators';
import { requestIdOf } from '../common/middleware/request-id.middleware';
import { ExportsService } from './exports.service';

const ID = new ParseUUIDPipe();

/** Cut-pack exports: queued by fabricators, followed by polling or server-sent events, downloaded by operators. */
@ApiTags('exports')
@ApiBearerAuth()
@Controller()
export class ExportsController {
  constructor(private readonly exports: ExportsService) {}

  @Post('jobs/:id/exports')
  @HttpCode(202)
  @Roles('fabricator')
  @ApiOperation({
    summary: 'Queue the cut pack of an approved (or released) job; when done, an approved job is released',
  })
  @ApiAcceptedResponse({ description: '{ exportId }: follow it at /api/exports/{exportId}' })
  request(
    @CurrentUser() u: AuthUser,
    @Param('id', ID) id: string,
    @Req() req: unknown,
  ): Promise<{ exportId: string }> {
    return this.exports.request(u, id, requestIdOf(req));
  }

  @Get('jobs/:id/exports')
  @ApiOkResponse({ description: 'The job’s exports, newest first' })
  list(@CurrentUser() u: AuthUser, @Param('id', ID) id: string): Promise<ExportView[]> {
    return this.exports.list(u, id);
  }

  @Get('exports/:id')
  @ApiOkResponse({
    description: 'State, progress %, error code and (when done) files with SHA-256 checksums',
  })
  get(@CurrentUser() u: AuthUser, @Param('id', ID) id: string): Promise<ExportView> {
    return this.exports.get(u, id);
  }

  @Sse('exports/:id/events')
  @ApiOperation({ summary: 'Server-sent events: the export view on every change; ends with done or failed' })
  events(@CurrentUser() u: AuthUser, @Param('id', ID) id: string): Promise<Observable<MessageEvent>> {
    return this.exports.events(u, id);
  }

  @Get('exports/:id/files/:name')
  @ApiOperation({
    summary:
      'Download one file (staff: after acknowledging the job’s current safety notices; hobbyists: their own assembly guide)',
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
