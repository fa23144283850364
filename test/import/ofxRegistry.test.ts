// The OFX importer behind the registry: content detection and text decoding of real bytes.
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { importStatement } from '../../engine/import/registry';
import type { ParsedStatement } from '../../engine/import/types';
import { writeOfx } from '../../engine/write/ofx';

const FIXTURES = new URL('../fixtures/ofx/', import.meta.url);

describe('OFX through the import registry', () => {
  it('is chosen by content for every OFX fixture', () => {
    for (const name of readdirSync(FIXTURES).filter((f) => f.endsWith('.ofx'))) {
      const bytes = new Uint8Array(readFileSync(new URL(name, FIXTURES)));
      expect(importStatement(bytes, { fileName: name }).format, name).toBe('ofx');
    }
  });

  it('reads writeOfx output encoded as UTF-8 (version 1 declares CHARSET:NONE) with its non-ASCII text intact', () => {
    // Invented demo data.
    const statement: ParsedStatement = {
      account: { identifier: 'DEMO-1', kind: 'current' },
      currency: 'EUR',
      from: '2024-05-01',
      to: '2024-05-31',
      entries: [
        {
          bookingDate: '2024-05-04',
          amount: 1250,
          description: 'Töpfermarkt – café & <glaze> 😀',
          status: 'booked',
          bankRef: 'U1',
          source: {},
        },
      ],
      balances: [],
    };
    for (const version of [1, 2] as const) {
      const bytes = new TextEncoder().encode(writeOfx([statement], { version }));
      const r = importStatement(bytes, { fileName: `utf8-v${version}.ofx` });
      expect(r.problems.filter((p) => p.severity === 'error')).toEqual([]);
      expect(r.statements[0]?.entries[0]?.description).toBe('Töpfermarkt – café & <glaze> 😀');
    }
  });

  it('decodes an OFX 1.x file that declares CHARSET:1252 as Windows-1252', () => {
    // Source: WHATWG Encoding Standard, index windows-1252: byte 0x80 is U+20AC (€).
    const text = readFileSync(new URL('bank-sgml-102.ofx', FIXTURES), 'latin1').replace('&#8364;', '\u0080');
    const bytes = Uint8Array.from(text, (c) => c.charCodeAt(0));
    expect(bytes.includes(0x80)).toBe(true);
    const r = importStatement(bytes, { fileName: 'cp1252.ofx' });
    expect(r.problems).toEqual([]);
    const entry = r.statements[0]?.entries.find((e) => e.bankRef === '202401200004');
    expect(entry?.description).toBe('Saturday market - Market takings € cash');
  });
});
