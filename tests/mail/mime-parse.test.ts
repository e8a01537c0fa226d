import { describe, expect, it } from 'vitest';
import { decodeEncodedWords, parseMail } from '@/lib/mime-parse';

describe('parseMail', () => {
  it('reads folded headers, encoded words and a quoted-printable / base64 alternative', () => {
    const raw = [
      'From: A <a@example.test>',
      'To: b@example.test',
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
    const m = parseMail(raw);
    expect(m.subject).toBe('Grüße aus Bern');
    expect(m.from).toBe('A <a@example.test>');
    expect(m.text).toBe('fc = 42 kHz, a long line that was wrapped');
    expect(m.html).toBe('<p>fc = 42 kHz</p>');
  });

  it('reads a single-part plain message', () => {
    const m = parseMail('Subject: hi\nContent-Type: text/plain\n\nbody line\n');
    expect(m.subject).toBe('hi');
    expect(m.text).toBe('body line\n');
    expect(m.html).toBe('');
  });

  it('finds parts inside nested multiparts', () => {
    const raw = [
      'Content-Type: multipart/mixed; boundary=outer',
      '',
      '--outer',
      'Content-Type: multipart/alternative; boundary=inner',
      '',
      '--inner',
      'Content-Type: text/plain',
      '',
      'plain',
      '--inner',
      'Content-Type: text/html',
      '',
      '<b>html</b>',
      '--inner--',
      '--outer--',
    ].join('\n');
    const m = parseMail(raw);
    expect(m.text).toBe('plain');
    expect(m.html).toBe('<b>html</b>');
  });

  it('decodes underscores as spaces in Q words and leaves plain text alone', () => {
    expect(decodeEncodedWords('=?utf-8?q?Phase_margin_=E2=86=93?=')).toBe('Phase margin ↓');
    expect(decodeEncodedWords('plain subject')).toBe('plain subject');
  });
});
