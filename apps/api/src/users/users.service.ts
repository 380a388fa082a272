import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { type ConfigType } from '@nestjs/config';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository } from 'typeorm';
import { type Page, type UserView } from '@kerfwright/contracts';
import { AuditService } from '../audit/audit.service';
import { likePattern } from '../common/db-helpers';
import { AppError, notFound } from '../common/errors';
import { pageWindow, sortOrder } from '../common/paging';
import { sameId } from '../common/pipes/parse-id.pipe';
import { mailConfig } from '../mail/mail.config';
import { MailOutboxService } from '../mail/mail-outbox.service';
import { appLink, composeMail } from '../mail/mail-templates';
import { type ListUsersQuery } from './dto/list-users.query';
import { type UpdateUserDto } from './dto/update-user.dto';
import { toUserView, User } from './user.entity';

const SORT_COLUMNS: Record<string, string> = {
  email: 'u.email',
  displayName: 'u.display_name',
  role: 'u.role',
  createdAt: 'u.created_at',
};

@Injectable()
export class UsersService {
  constructor(
    @InjectRepository(User) private readonly users: Repository<User>,
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly outbox: MailOutboxService,
    @Inject(mailConfig.KEY) private readonly mail: ConfigType<typeof mailConfig>,
  ) {}

  async list(query: ListUsersQuery): Promise<Page<UserView>> {
    const { page, pageSize, skip, take } = pageWindow(query);
    const [column, direction] = sortOrder(query.sort ?? 'email', SORT_COLUMNS, 'u.email');
    const qb = this.users.createQueryBuilder('u');
    if (query.role) qb.andWhere('u.role = :role', { role: query.role });
    if (query.active !== undefined) qb.andWhere('u.active = :active', { active: query.active });
    if (query.q) {
      const like = likePattern(query.q);
      qb.andWhere('(u.email ILIKE :like OR u.display_name ILIKE :like)', { like });
    }
    qb.orderBy(column, direction).addOrderBy('u.id', 'ASC').skip(skip).take(take);
    const [rows, total] = await qb.getManyAndCount();
    return { items: rows.map(toUserView), total, page, pageSize };
  }

  async update(actorId: string, id: string, dto: UpdateUserDto, requestId: string): Promise<UserView> {
    if (dto.role === undefined && dto.active === undefined) {
      throw new AppError(
        HttpStatus.BAD_REQUEST,
        'VALIDATION.FAILED',
        'Nothing to change: give role or active',
        [{ field: 'role', messages: ['role or active is required'] }],
      );
    }
    const selfChange = () =>
      new AppError(
        HttpStatus.CONFLICT,
        'USER.SELF_CHANGE',
        'Supervisors cannot change their own role or deactivate themselves; ask another supervisor',
      );
    // Ids are compared normalised (PostgreSQL takes an upper-case uuid for the same row), and again as stored.
    if (sameId(id, actorId)) throw selfChange();
    return this.dataSource.transaction(async (manager) => {
      // Both rows are locked, in the order of their ids: the audit row's foreign key locks the actor's row
      // anyway, and two supervisors changing each other at once would otherwise lock the two in opposite
      // orders (a deadlock). Whoever waited then sees the other's change to their own account.
      const rows = new Map<string, User | null>();
      for (const key of [id, actorId].map((k) => k.toLowerCase()).sort()) {
        rows.set(
          key,
          await manager.findOne(User, { where: { id: key }, lock: { mode: 'pessimistic_write' } }),
        );
      }
      const user = rows.get(id.toLowerCase());
      if (!user) throw notFound('USER', 'No such user');
      if (sameId(user.id, actorId)) throw selfChange();
      const actor = rows.get(actorId.toLowerCase());
      if (actor?.role !== 'supervisor' || !actor.active) {
        throw new AppError(
          HttpStatus.CONFLICT,
          'USER.ACTOR_CHANGED',
          'Your own account was changed while this request ran (you are no longer an active supervisor); nothing was changed',
        );
      }
      const before = toUserView(user);
      if (dto.role !== undefined) user.role = dto.role;
      if (dto.active !== undefined) user.active = dto.active;
      const saved = await manager.save(User, user);
      const after = toUserView(saved);
      await this.audit.record(manager, {
        actorId,
        action: 'user.update',
        entityType: 'user',
        entityId: id,
        before,
        after,
        requestId,
      });
      if ((before.role === 'supervisor') !== (after.role === 'supervisor')) {
        // Supervisors approve each other's work (four eyes): every one of them hears who joined or left them,
        // so an account made a supervisor to approve its maker's own job does not go unseen.
        const granted = after.role === 'supervisor';
        const text = composeMail(
          granted
            ? `${after.displayName} is now a supervisor`
            : `${after.displayName} is no longer a supervisor`,
          [
            `${actor.displayName} ${granted ? 'made' : 'took the supervisor role from'} ${after.displayName} ` +
              `(${after.email})${granted ? ' a supervisor' : `, now ${after.role}`}.`,
            granted
              ? 'Supervisors approve machine profile versions and jobs that another person prepared. If this ' +
                'change was not agreed in the workshop, check the audit trail and the approvals made since.'
              : 'Approvals they made stay in the audit trail.',
          ],
          { label: 'Open the people list', url: appLink(this.mail.appUrl, 'people') },
        );
        await this.outbox.enqueue(manager, {
          kind: granted ? 'user.supervisor-granted' : 'user.supervisor-removed',
          to: await this.outbox.addressesOfRoles(manager, ['supervisor']),
          ...text,
        });
      }
      return after;
    });
  }
}
