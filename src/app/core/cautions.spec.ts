import { TestBed } from '@angular/core/testing';
import { Cautions } from './cautions';

describe('Cautions', () => {
  it('states that the models are first-order and no substitute for sign-off simulation', async () => {
    const fixture = TestBed.createComponent(Cautions);
    await fixture.whenStable();
    const text = (fixture.nativeElement as HTMLElement).textContent ?? '';
    expect(text).toContain('First-order device models');
    expect(text).toContain('sign-off simulation');
    expect((fixture.nativeElement as HTMLElement).querySelector('[role="note"]')).not.toBeNull();
  });
});
