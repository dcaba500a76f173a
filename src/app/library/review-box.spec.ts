import { reviewBody } from './review-box';

describe('reviewBody', () => {
  it('needs a reason to send back, as a comment or on a line', () => {
    expect(reviewBody('send_back', '  ', [], 20)).toEqual({ problem: 'Say why it goes back: a comment, or a comment on a line.' });
    expect(reviewBody('send_back', 'Headroom is not checked.', [], 20)).toEqual({ body: { decision: 'send_back', comment: 'Headroom is not checked.' } });
    expect(reviewBody('send_back', '', [{ line: 4, text: ' beta too high ' }], 20)).toEqual({ body: { decision: 'send_back', comments: [{ line: 4, text: 'beta too high' }] } });
  });

  it('approves without words, and drops empty line rows', () => {
    expect(reviewBody('approve', '', [{ line: null, text: '' }], 20)).toEqual({ body: { decision: 'approve' } });
  });

  it('refuses a line outside the source or a line comment without words', () => {
    expect(reviewBody('comment', '', [{ line: 21, text: 'x' }], 20)).toEqual({ problem: 'A line comment needs a line between 1 and 20.' });
    expect(reviewBody('comment', '', [{ line: null, text: 'x' }], 20)).toEqual({ problem: 'A line comment needs a line between 1 and 20.' });
    expect(reviewBody('approve', 'ok', [{ line: 3, text: ' ' }], 20)).toEqual({ problem: 'Say something about line 3, or remove that row.' });
    expect(reviewBody('comment', '', [], 20)).toEqual({ problem: 'Write a comment first.' });
  });
});
