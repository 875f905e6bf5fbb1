import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { Router, provideRouter } from '@angular/router';
import { csrfInterceptor } from '../core/csrf-interceptor';
import { errorInterceptor } from '../core/error-interceptor';
import { aMe, settle } from '../core/testing';
import { SignIn, safeReturnUrl } from './sign-in';

describe('SignIn', () => {
  let http: HttpTestingController;

  async function setup(returnUrl?: string) {
    TestBed.configureTestingModule({
      imports: [SignIn],
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor, csrfInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    const fixture = TestBed.createComponent(SignIn);
    if (returnUrl) fixture.componentRef.setInput('returnUrl', returnUrl);
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const email = await loader.getHarness(
      MatInputHarness.with({ selector: '[data-testid="sign-in-email"]' }),
    );
    const password = await loader.getHarness(
      MatInputHarness.with({ selector: '[data-testid="sign-in-password"]' }),
    );
    const button = await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }));
    return { fixture, email, password, button };
  }

  async function answerPost(status: number, body: object) {
    await settle();
    const csrf = http.match('/api/v1/auth/csrf-token');
    csrf.forEach((req) => req.flush({ token: 'tok', headerName: 'x-csrf-token' }));
    await settle();
    const post = http.expectOne({ method: 'POST', url: '/api/v1/auth/sign-in' });
    post.flush(body, { status, statusText: String(status) });
    return post;
  }

  afterEach(() => http.verify());

  it('has fields labelled E-mail and Password and a Sign in button', async () => {
    const { fixture } = await setup();
    const text = (fixture.nativeElement as HTMLElement).textContent ?? '';
    expect(text).toContain('E-mail');
    expect(text).toContain('Password');
    expect((fixture.nativeElement as HTMLElement).querySelector('h1')?.textContent).toBe('Sign in');
  });

  it("shows the API's message in an alert when the password is wrong", async () => {
    const { fixture, email, password, button } = await setup();
    await email.setValue('mira.okafor@example.test');
    await password.setValue('wrong password');
    await button.click();
    await answerPost(401, {
      error: { code: 'invalid_credentials', message: 'E-mail or password is incorrect.' },
    });
    await fixture.whenStable();
    const alert = (fixture.nativeElement as HTMLElement).querySelector('[role="alert"]');
    expect(alert?.textContent?.trim()).toBe('E-mail or password is incorrect.');
  });

  it('shows the lockout message on 429', async () => {
    const { fixture, email, password, button } = await setup();
    await email.setValue('mira.okafor@example.test');
    await password.setValue('whatever');
    await button.click();
    await answerPost(429, {
      error: { code: 'locked', message: 'Too many attempts. Try again in 15 minutes.' },
    });
    await fixture.whenStable();
    const alert = (fixture.nativeElement as HTMLElement).querySelector('[role="alert"]');
    expect(alert?.textContent?.trim()).toBe('Too many attempts. Try again in 15 minutes.');
  });

  it('does not call the API with an invalid e-mail and says why under the field', async () => {
    const { fixture, email, password, button } = await setup();
    await email.setValue('not an address');
    await password.setValue('x');
    await button.click();
    await settle();
    http.expectNone('/api/v1/auth/sign-in');
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).textContent).toContain(
      'Enter a valid e-mail address.',
    );
  });

  it("goes to the role's home after signing in, or back to the return address", async () => {
    const { email, password, button } = await setup('/admin/labs');
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
    await email.setValue('Mira.Okafor@example.test');
    await password.setValue('correct horse');
    await button.click();
    const post = await answerPost(200, { user: aMe({ roles: ['admin'] }) });
    expect(post.request.body).toEqual({
      email: 'mira.okafor@example.test',
      password: 'correct horse',
    });
    expect(post.request.headers.get('x-csrf-token')).toBe('tok');
    await settle();
    expect(navigate).toHaveBeenCalledWith('/admin/labs');
  });
});

describe('safeReturnUrl', () => {
  it('only follows addresses inside the app', () => {
    expect(safeReturnUrl('/desk')).toBe('/desk');
    expect(safeReturnUrl('//elsewhere.example')).toBeNull();
    expect(safeReturnUrl('https://elsewhere.example')).toBeNull();
    expect(safeReturnUrl('/sign-in?returnUrl=x')).toBeNull();
    expect(safeReturnUrl(undefined)).toBeNull();
  });
});
