import { roleAtLeast, signInUrl } from './session';

describe('signInUrl', () => {
  it('starts sign-in at the server and comes back to a path of this app, with the invitation when there is one', () => {
    expect(signInUrl('/netlists?q=tail')).toBe('/auth/sign-in?next=%2Fnetlists%3Fq%3Dtail');
    expect(signInUrl('/netlists', 'tok-123')).toBe('/auth/sign-in?next=%2Fnetlists&invite=tok-123');
  });

  it('never sends the user on to another site after signing in', () => {
    for (const elsewhere of ['https://elsewhere.example/', '//elsewhere.example/', '/\\elsewhere.example', 'netlists']) {
      expect(signInUrl(elsewhere)).toBe('/auth/sign-in?next=%2F');
    }
  });
});

describe('roleAtLeast', () => {
  it('orders viewer < designer < reviewer < admin', () => {
    expect(roleAtLeast('designer', 'designer')).toBe(true);
    expect(roleAtLeast('reviewer', 'designer')).toBe(true);
    expect(roleAtLeast('viewer', 'designer')).toBe(false);
    expect(roleAtLeast('reviewer', 'admin')).toBe(false);
    expect(roleAtLeast(undefined, 'viewer')).toBe(false);
  });
});
