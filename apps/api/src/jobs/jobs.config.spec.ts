import { DEFAULT_OPEN_REQUEST_LIMIT, jobsConfig } from './jobs.config';

describe('jobs configuration', () => {
  const saved = process.env.KW_OPEN_REQUEST_LIMIT;
  afterEach(() => {
    if (saved === undefined) delete process.env.KW_OPEN_REQUEST_LIMIT;
    else process.env.KW_OPEN_REQUEST_LIMIT = saved;
  });

  it('lets a requester have 5 jobs open with the workshop unless KW_OPEN_REQUEST_LIMIT says otherwise', () => {
    delete process.env.KW_OPEN_REQUEST_LIMIT;
    expect(DEFAULT_OPEN_REQUEST_LIMIT).toBe(5);
    expect(jobsConfig().openRequestLimit).toBe(5);
    process.env.KW_OPEN_REQUEST_LIMIT = '8';
    expect(jobsConfig().openRequestLimit).toBe(8);
  });
});
