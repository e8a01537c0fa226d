/** The fake mail server reads each message with mailparser: what the demo mailbox page shows. */
import { describe, expect, it } from 'vitest';
import { readMail } from '@/lib/fake-smtp';
import { renderMail } from '@/lib/mail-render';

describe('readMail', () => {
  it('reads folded headers, encoded words and a quoted-printable / base64 alternative', async () => {
    const raw = [
      'From: A <A@example.test>',
      'To: b@example.test',
      'X-Phasewright-Team: 3',
      'Subject: =?UTF-8?Q?Gr=C3=BC=C3=9Fe?=',
      ' =?UTF-8?B?IGF1cyBCZXJu?=',
      'Content-Type: multipart/alternative; boundary="--b1"',
      'MIME-Version: 1.0',
      '',
      '----b1',
      'Content-Type: text/plain; charset=utf-8',
      'Content-Transfer-Encoding: quoted-printable',
      '',
      'fc =3D 42 kHz, a long line that was wr=',
      'apped',
      '----b1',
      'Content-Type: text/html; charset=utf-8',
      'Content-Transfer-Encoding: base64',
      '',
      Buffer.from('<p>fc = 42 kHz</p>').toString('base64'),
      '----b1--',
      '',
    ].join('\r\n');
    const m = await readMail(raw);
    expect(m.subject).toBe('Grüße aus Bern');
    expect(m.fromAddress).toBe('A@example.test');
    expect(m.teamId).toBe(3);
    expect(m.text).toBe('fc = 42 kHz, a long line that was wrapped');
    expect(m.html).toBe('<p>fc = 42 kHz</p>');
  });

  it('reads a single-part plain message: no HTML made up, no team', async () => {
    const m = await readMail('Subject: hi\nContent-Type: text/plain\n\nbody line\n');
    expect(m).toEqual({ subject: 'hi', fromAddress: '', teamId: null, text: 'body line\n', html: '' });
  });

  it('finds parts inside nested multiparts and decodes another charset', async () => {
    const raw = [
      'Content-Type: multipart/mixed; boundary=outer',
      'X-Phasewright-Team: not-a-number',
      '',
      '--outer',
      'Content-Type: multipart/alternative; boundary=inner',
      '',
      '--inner',
      'Content-Type: text/plain; charset=iso-8859-1',
      'Content-Transfer-Encoding: quoted-printable',
      '',
      'Gr=FC=DFe',
      '--inner',
      'Content-Type: text/html',
      '',
      '<b>html</b>',
      '--inner--',
      '--outer--',
    ].join('\n');
    const m = await readMail(raw);
    expect(m.text).toBe('Grüße');
    expect(m.html).toBe('<b>html</b>');
    expect(m.teamId).toBeNull();
  });

  it('reads back what renderMail writes, markup escaped and all', async () => {
    const { text, html } = renderMail({ to: 'x@example.test', subject: 's', paragraphs: ['fc ≈ 12 kHz <ok> & "fine"'] });
    const raw = [
      'Subject: =?UTF-8?Q?Phase_margin_=E2=86=93?=',
      'Content-Type: multipart/alternative; boundary=b',
      '',
      '--b',
      'Content-Type: text/plain; charset=utf-8',
      'Content-Transfer-Encoding: base64',
      '',
      Buffer.from(text).toString('base64'),
      '--b',
      'Content-Type: text/html; charset=utf-8',
      'Content-Transfer-Encoding: base64',
      '',
      Buffer.from(html).toString('base64'),
      '--b--',
    ].join('\r\n');
    const m = await readMail(raw);
    expect(m.subject).toBe('Phase margin ↓');
    expect(m.text).toBe(text);
    expect(m.html).toBe(html);
    expect(m.html).toContain('fc ≈ 12 kHz &lt;ok&gt; &amp; &quot;fine&quot;');
  });
});
