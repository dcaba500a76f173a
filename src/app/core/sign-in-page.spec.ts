import { signInProblem } from './sign-in-page';

describe('signInProblem', () => {
  it('explains each code the server sends back', () => {
    expect(signInProblem('denied')).toContain('cancelled');
    expect(signInProblem('state_mismatch')).toContain('another tab');
    expect(signInProblem('invitation_email_mismatch')).toContain('another email address');
    expect(signInProblem('invitation_unavailable')).toContain('expired');
    expect(signInProblem('provider_unreachable')).toContain('could not be reached');
  });

  it('has a general sentence for codes it does not know, including inherited property names', () => {
    const general = signInProblem('something_new');
    expect(general).toContain('did not work');
    expect(signInProblem('toString')).toBe(general);
  });
});
