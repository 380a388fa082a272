import { Logger } from '@nestjs/common';
import { Client } from 'pg';
import { GuardedPgClient } from './guarded-pg-client';

describe('GuardedPgClient', () => {
  it('logs an error event instead of throwing it, where a plain client would throw', () => {
    const warn = jest.spyOn(Logger.prototype, 'warn').mockImplementation(() => undefined);
    const failure = Object.assign(new Error('terminating connection due to administrator command'), {
      code: '57P01',
    });
    const guarded = new GuardedPgClient({ host: '127.0.0.1', port: 1 });
    expect(() => guarded.emit('error', failure)).not.toThrow();
    expect(warn).toHaveBeenCalledWith(expect.stringContaining('terminating connection'));
    // Node's EventEmitter rule the guard is for: an 'error' event without a listener is thrown.
    const plain = new Client({ host: '127.0.0.1', port: 1 });
    expect(() => plain.emit('error', failure)).toThrow('terminating connection');
    warn.mockRestore();
  });
});
