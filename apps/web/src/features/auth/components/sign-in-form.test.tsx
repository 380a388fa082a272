import { screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { userFixture } from '../../../testing/fixtures';
import { renderWithProviders } from '../../../testing/render-app';
import { getAccessToken } from '../../../lib/token-store';
import { SignInForm } from './sign-in-form';

/** The API's answer to a wrong password. */
const WRONG_PASSWORD = {
  'POST /api/auth/login': () =>
    json(401, {
      statusCode: 401,
      code: 'AUTH.INVALID_CREDENTIALS',
      message: 'E-mail or password is wrong',
      requestId: 'r1',
    }),
};

function setup() {
  const onSuccess = vi.fn();
  const utils = renderWithProviders(<SignInForm onSuccess={onSuccess} />);
  return { ...utils, onSuccess };
}

describe('SignInForm', () => {
  it('asks for both fields when submitted empty, without calling the API', async () => {
    const { fetchMock } = stubFetch({});
    const { user } = setup();
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByText('Enter your e-mail address')).toBeInTheDocument();
    expect(screen.getByText('Enter your password')).toBeInTheDocument();
    expect(screen.getByLabelText(/E-mail/)).toHaveAttribute('aria-invalid', 'true');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('rejects an e-mail address without a domain', async () => {
    stubFetch({});
    const { user } = setup();
    await user.type(screen.getByLabelText(/E-mail/), 'someone@');
    await user.type(screen.getByLabelText(/Password/), 'kerfwright-demo');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText(/Enter a valid e-mail address/)).toBeInTheDocument();
  });

  it('shows the API message when the password is wrong', async () => {
    stubFetch(WRONG_PASSWORD);
    const { user, onSuccess } = setup();
    await user.type(screen.getByLabelText(/E-mail/), 'operator@workshop.example');
    await user.type(screen.getByLabelText(/Password/), 'not-the-password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByRole('alert')).toHaveTextContent('E-mail or password is wrong');
    expect(onSuccess).not.toHaveBeenCalled();
    expect(getAccessToken()).toBeNull();
    // Sent with the button (disabled while sending), the keyboard goes to the message, not to the page.
    await waitFor(() => expect(screen.getByTestId('form-message')).toHaveFocus());
  });

  it('leaves the keyboard in the password field when Enter was pressed there and the answer is no', async () => {
    stubFetch(WRONG_PASSWORD);
    const { user } = setup();
    await user.type(screen.getByLabelText(/E-mail/), 'operator@workshop.example');
    await user.type(screen.getByLabelText(/Password/), 'not-the-password{Enter}');
    expect(await screen.findByRole('alert')).toHaveTextContent('E-mail or password is wrong');
    expect(screen.getByLabelText(/Password/)).toHaveFocus();
  });

  it('drops the wrong-password message when the form is sent again, even with empty fields', async () => {
    const { fetchMock } = stubFetch(WRONG_PASSWORD);
    const { user } = setup();
    await user.type(screen.getByLabelText(/E-mail/), 'operator@workshop.example');
    await user.type(screen.getByLabelText(/Password/), 'not-the-password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('E-mail or password is wrong');

    await user.clear(screen.getByLabelText(/E-mail/));
    await user.clear(screen.getByLabelText(/Password/));
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter your e-mail address')).toBeInTheDocument();
    expect(screen.queryByText('E-mail or password is wrong')).not.toBeInTheDocument();
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });

  it('puts the API field errors under the matching fields', async () => {
    stubFetch({
      'POST /api/auth/login': () =>
        json(400, {
          statusCode: 400,
          code: 'VALIDATION.FAILED',
          message: 'Invalid request',
          details: [{ field: 'email', messages: ['email must be an e-mail address'] }],
          requestId: 'r2',
        }),
    });
    const { user } = setup();
    await user.type(screen.getByLabelText(/E-mail/), 'a@b.example');
    await user.type(screen.getByLabelText(/Password/), 'whatever-it-is');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    // Under the E-mail field, the API's name for it ("email") is left off.
    expect(await screen.findByText('Must be an e-mail address')).toBeInTheDocument();
    expect(screen.getByLabelText(/E-mail/)).toHaveAttribute('aria-invalid', 'true');
  });

  it('sends the trimmed e-mail and keeps the token on success', async () => {
    const operator = userFixture('operator');
    const { calls } = stubFetch({
      'POST /api/auth/login': () => json(200, { accessToken: 'jwt-operator', user: operator }),
    });
    const { user, onSuccess } = setup();
    await user.type(screen.getByLabelText(/E-mail/), '  operator@workshop.example ');
    await user.type(screen.getByLabelText(/Password/), 'kerfwright-demo');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    await waitFor(() => expect(onSuccess).toHaveBeenCalledTimes(1));
    expect(calls[0]?.body).toEqual({ email: 'operator@workshop.example', password: 'kerfwright-demo' });
    expect(getAccessToken()).toBe('jwt-operator');
  });
});
