import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { App } from './app';
import { routes } from './app.routes';

describe('App shell', () => {
  beforeEach(async () => {
    await TestBed.configureTestingModule({ imports: [App], providers: [provideRouter(routes)] }).compileComponents();
  });

  it('shows the product name and the main places in the top bar', async () => {
    const fixture = TestBed.createComponent(App);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('.top-bar .name')?.textContent).toBe('Nodewright');
    const links = [...el.querySelectorAll('nav.places a')].map((a) => a.textContent?.trim());
    expect(links).toEqual(['Bench', 'Library']);
  });

  it('routes the empty path to the bench and lazily loads each page', () => {
    expect(routes[0]).toMatchObject({ path: '', redirectTo: 'bench' });
    const lazy = routes.filter((r) => r.loadComponent).map((r) => r.path);
    expect(lazy).toEqual(['bench', 'library', 'sign-in', '**']);
  });
});
