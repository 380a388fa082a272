import { PASSWORD_MIN_LENGTH } from '@kerfwright/contracts';
import { screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { userFixture } from '../../../testing/fixtures';
import { renderWithProviders } from '../../../testing/render-app';
import { getAccessToken } from '../../../lib/token-store';
import { RegisterForm } from './register-form';

function setup() {
  const onSuccess = vi.fn();
  const utils = renderWithProviders(<RegisterForm onSuccess={onSuccess} />);
  const fields = {
    name: () => screen.getByLabelText(/Your name/),
    email: () => screen.getByLabelText(/E-mail/),
    password: () => screen.getByLabelText(/^Password/),
    repeat: () => screen.getByLabelText(/Repeat password/),
    submit: () => screen.getByRole('button', { name: 'Create account' }),
  };
  return { ...utils, onSuccess, fields };
}

describe('RegisterForm', () => {
  it('explains every missing field when submitted empty', async () => {
    const { fetchMock } = stubFetch({});
    const { user, fields } = setup();
    await user.click(fields.submit());

    expect(await screen.findByText('Enter your name as the workshop should see it')).toBeInTheDocument();
    expect(screen.getByText('Enter your e-mail address')).toBeInTheDocument();
    expect(screen.getByText(`Use at least ${PASSWORD_MIN_LENGTH} characters`)).toBeInTheDocument();
    expect(screen.getByText('Repeat your password')).toBeInTheDocument();
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('refuses a password one character shorter than the shared minimum', async () => {
    stubFetch({});
    const { user, fields } = setup();
    const short = 'x'.repeat(PASSWORD_MIN_LENGTH - 1);
    await user.type(fields.password(), short);
    await user.type(fields.repeat(), short);
    await user.click(fields.submit());
    expect(await screen.findByText(`Use at least ${PASSWORD_MIN_LENGTH} characters`)).toBeInTheDocument();
    expect(fields.password()).toHaveAttribute('aria-invalid', 'true');
  });

  it('refuses a password that reaches the minimum only by spaces at its ends', async () => {
    stubFetch({});
    const { user, fields } = setup();
    const padded = `  abc${' '.repeat(PASSWORD_MIN_LENGTH)}`;
    await user.type(fields.password(), padded);
    await user.type(fields.repeat(), padded);
    await user.click(fields.submit());
    expect(
      await screen.findByText(`Use at least ${PASSWORD_MIN_LENGTH} characters besides spaces at the ends`),
    ).toBeInTheDocument();
  });

  it('accepts a password of exactly the minimum length', async () => {
    stubFetch({});
    const { user, fields } = setup();
    await user.type(fields.password(), 'y'.repeat(PASSWORD_MIN_LENGTH));
    await user.click(fields.submit());
    await screen.findByText('Enter your e-mail address');
    expect(screen.queryByText(`Use at least ${PASSWORD_MIN_LENGTH} characters`)).not.toBeInTheDocument();
  });

  it('rejects an invalid e-mail and two different passwords', async () => {
    stubFetch({});
    const { user, fields } = setup();
    await user.type(fields.name(), 'Rowan Hale');
    await user.type(fields.email(), 'rowan.example.org');
    await user.type(fields.password(), 'a-long-passphrase');
    await user.type(fields.repeat(), 'a-long-passphrasf');
    await user.click(fields.submit());

    expect(await screen.findByText(/Enter a valid e-mail address/)).toBeInTheDocument();
    expect(screen.getByText('The two passwords differ')).toBeInTheDocument();
    expect(fields.repeat()).toHaveAttribute('aria-invalid', 'true');
  });

  it('puts "already registered" from the API under the e-mail field', async () => {
    stubFetch({
      'POST /api/auth/register': () =>
        json(409, {
          statusCode: 409,
          code: 'AUTH.EMAIL_TAKEN',
          message: 'An account with this e-mail already exists',
          details: [{ field: 'email', messages: ['already registered'] }],
          requestId: 'r3',
        }),
    });
    const { user, fields, onSuccess } = setup();
    await user.type(fields.name(), 'Rowan Hale');
    await user.type(fields.email(), 'rowan@workshop.example');
    await user.type(fields.password(), 'a-long-passphrase');
    await user.type(fields.repeat(), 'a-long-passphrase');
    await user.click(fields.submit());

    expect(await screen.findByText('Already registered')).toBeInTheDocument();
    expect(fields.email()).toHaveAttribute('aria-invalid', 'true');
    expect(onSuccess).not.toHaveBeenCalled();
  });

  it('sends the API request shape (no repeated password) and signs the new member in', async () => {
    const created = userFixture('hobbyist', { displayName: 'Rowan Hale', email: 'rowan@workshop.example' });
    const { calls } = stubFetch({
      'POST /api/auth/register': () => json(201, { accessToken: 'jwt-new', user: created }),
    });
    const { user, fields, onSuccess } = setup();
    await user.type(fields.name(), ' Rowan Hale ');
    await user.type(fields.email(), 'rowan@workshop.example');
    await user.type(fields.password(), 'a-long-passphrase');
    await user.type(fields.repeat(), 'a-long-passphrase');
    await user.click(fields.submit());

    await waitFor(() => expect(onSuccess).toHaveBeenCalledTimes(1));
    expect(calls[0]?.body).toEqual({
      displayName: 'Rowan Hale',
      email: 'rowan@workshop.example',
      password: 'a-long-passphrase',
    });
    expect(getAccessToken()).toBe('jwt-new');
  });
});
