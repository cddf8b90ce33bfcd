/**
 * Who may call what, against whose object → expected status. The generated tests in
 * authorization.test.ts run every cell. Personas: `member` and `apprentice` and `admin` belong to
 * farm A; `otherFarmMember` to farm B of the same co-op; `otherCoop` is an admin of another co-op.
 */
export type Persona = 'anonymous' | 'apprentice' | 'member' | 'otherFarmMember' | 'admin' | 'otherCoop';
export type Target = 'none' | 'farmA' | 'farmB';

export interface MatrixRow {
  method: 'GET' | 'PATCH' | 'DELETE' | 'POST';
  path: string;
  target: Target;
  body?: 'farmProfile';
  expect: Record<Persona, number>;
}

export const authorizationMatrix: MatrixRow[] = [
  { method: 'GET', path: '/api/me', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/farms', target: 'none', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 200 } },
  { method: 'GET', path: '/api/farms/:farmId', target: 'farmA', expect: { anonymous: 401, apprentice: 200, member: 200, otherFarmMember: 200, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/farms/:farmId', target: 'farmA', body: 'farmProfile', expect: { anonymous: 401, apprentice: 403, member: 200, otherFarmMember: 403, admin: 200, otherCoop: 404 } },
  { method: 'PATCH', path: '/api/farms/:farmId', target: 'farmB', body: 'farmProfile', expect: { anonymous: 401, apprentice: 403, member: 403, otherFarmMember: 200, admin: 403, otherCoop: 404 } },
  { method: 'DELETE', path: '/api/session', target: 'none', expect: { anonymous: 204, apprentice: 204, member: 204, otherFarmMember: 204, admin: 204, otherCoop: 204 } },
];
