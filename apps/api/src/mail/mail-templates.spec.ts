import { appLink, composeMail } from './mail-templates';

describe('mail templates', () => {
  it("builds the app's page addresses with one slash between the app's address and the path", () => {
    expect(appLink('https://kw.example', 'jobs/1')).toBe('https://kw.example/jobs/1');
    expect(appLink('https://kw.example/', '/jobs/1')).toBe('https://kw.example/jobs/1');
    expect(appLink('http://127.0.0.1:3000//', 'release-desk')).toBe('http://127.0.0.1:3000/release-desk');
  });

  it('lists links under a paragraph, a line each in the text body and a list in the HTML body, escaped', () => {
    const mail = composeMail(
      'Machine out of use: Bay laser',
      [
        'The machine is out of use.',
        {
          text: 'Released with these settings:',
          links: [
            { label: '"Lamp <A>" (released)', url: 'https://kw.example/jobs/1' },
            { label: '"Tom & Jo" (released)', url: 'https://kw.example/jobs/2?a=1&b=2' },
          ],
        },
      ],
      { label: 'Open the release desk', url: 'https://kw.example/release-desk' },
    );
    expect(mail.text).toBe(
      [
        'The machine is out of use.',
        'Released with these settings:',
        '- "Lamp <A>" (released): https://kw.example/jobs/1',
        '- "Tom & Jo" (released): https://kw.example/jobs/2?a=1&b=2',
        '',
        'Open the release desk: https://kw.example/release-desk',
        '',
        '— Kerfwright, for your workshop',
      ].join('\n'),
    );
    // HTML escaping as the HTML Living Standard requires in text and attribute values (& < > " ').
    expect(mail.html).toContain(
      '<p>Released with these settings:</p><ul>' +
        '<li><a href="https://kw.example/jobs/1">&quot;Lamp &lt;A&gt;&quot; (released)</a></li>' +
        '<li><a href="https://kw.example/jobs/2?a=1&amp;b=2">&quot;Tom &amp; Jo&quot; (released)</a></li></ul>',
    );
  });
});
