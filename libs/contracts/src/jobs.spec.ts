import { JOB_OPEN_STATES, JOB_TRANSITIONS, JOB_WAIT_ENDING_ACTIONS, transitionFor } from './jobs';

describe('jobs open with the workshop', () => {
  it('are the requested ones and the prepared ones waiting for approval', () => {
    expect([...JOB_OPEN_STATES].sort()).toEqual(['prepared', 'requested']);
  });

  it('end their wait by approval, return or withdrawal, each leading out of the open states', () => {
    for (const action of JOB_WAIT_ENDING_ACTIONS) {
      const rule = transitionFor(action);
      expect(rule.from.some((s) => JOB_OPEN_STATES.includes(s))).toBe(true);
      expect(JOB_OPEN_STATES).not.toContain(rule.to);
    }
    // Every other action taken on an open job keeps it open (preparing it again, say).
    for (const t of JOB_TRANSITIONS) {
      if (JOB_WAIT_ENDING_ACTIONS.includes(t.action)) continue;
      if (t.from.some((s) => JOB_OPEN_STATES.includes(s))) expect(JOB_OPEN_STATES).toContain(t.to);
    }
  });
});
