/** Reads the NIST StRD files copied into test/fixtures/nist (public domain, U.S. Government works). */
import * as fs from 'node:fs';
import * as path from 'node:path';
import { REPO } from './loadNotebook.js';

/** Norris: rows of (y, x) after the "Data" line. */
export function readNorris(): { x: number[]; y: number[] } {
  const text = fs.readFileSync(path.join(REPO, 'test/fixtures/nist/Norris.txt'), 'utf8');
  const lines = text.split('\n');
  const start = lines.findIndex((l) => l.startsWith('Data'));
  const x: number[] = [];
  const y: number[] = [];
  for (const l of lines.slice(start + 1)) {
    const m = l.trim().split(/\s+/).map(Number);
    if (m.length === 2 && m.every(Number.isFinite)) {
      y.push(m[0]);
      x.push(m[1]);
    }
  }
  return { x, y };
}

/** A nonlinear StRD .dat file: data columns (y, x), starting values and certified values. */
export function readNonlinear(name: string): { x: number[]; y: number[]; start1: number[]; start2: number[]; certified: number[]; rss: number } {
  const text = fs.readFileSync(path.join(REPO, `test/fixtures/nist/${name}.dat`), 'utf8');
  const lines = text.split(/\r?\n/);
  const start1: number[] = [];
  const start2: number[] = [];
  const certified: number[] = [];
  let rss = NaN;
  for (const l of lines) {
    const m = /^\s*b(\d+)\s*=\s*(\S+)\s+(\S+)\s+(\S+)/.exec(l);
    if (m) {
      start1.push(Number(m[2]));
      start2.push(Number(m[3]));
      certified.push(Number(m[4]));
    }
    const r = /Residual Sum of Squares:\s+(\S+)/.exec(l);
    if (r) rss = Number(r[1]);
  }
  const dataAt = lines.findIndex((l) => /^\s*Data:\s+y\s+x/.test(l));
  const x: number[] = [];
  const y: number[] = [];
  for (const l of lines.slice(dataAt + 1)) {
    const v = l.trim().split(/\s+/).map(Number);
    if (v.length >= 2 && v.every(Number.isFinite)) {
      y.push(v[0]);
      x.push(v[1]);
    }
  }
  return { x, y, start1, start2, certified, rss };
}
