import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { areaOf, authorizationMatrix, matrixAreas } from './authorization-matrix';
import { describeMatrixArea } from '../support/authorization-cells';

describeMatrixArea('membership');

describe('authorization matrix areas', () => {
  it('when the matrix is split into areas, then every row belongs to an area and every area runs in its own file', () => {
    expect(authorizationMatrix.filter((row) => areaOf(row) === null).map((row) => `${row.method} ${row.path}`)).toEqual([]);
    const unrun = matrixAreas
      .map(({ area }) => ({ area, file: new URL(`authorization-${area}.test.ts`, import.meta.url) }))
      .filter(({ area, file }) => !fs.existsSync(file) || !fs.readFileSync(file, 'utf8').includes(`describeMatrixArea('${area}')`))
      .map(({ area }) => area);
    expect(unrun).toEqual([]);
  });
});
