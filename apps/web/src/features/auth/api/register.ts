import {
  type AuthResponse,
  DISPLAY_NAME_MAX_LENGTH,
  PASSWORD_MAX_LENGTH,
  PASSWORD_MIN_LENGTH,
  passwordLongEnough,
  type RegisterRequest,
} from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { authKeys } from '../../../lib/auth';
import { setAccessToken } from '../../../lib/token-store';

/** The register form: the API's request plus a repeated password, checked here only. */
export const registerInputSchema = z
  .object({
    displayName: z
      .string()
      .trim()
      .min(1, 'Enter your name as the workshop should see it')
      .max(DISPLAY_NAME_MAX_LENGTH, `Use at most ${DISPLAY_NAME_MAX_LENGTH} characters`),
    email: z
      .string()
      .trim()
      .min(1, 'Enter your e-mail address')
      .max(254, 'Use at most 254 characters')
      .pipe(z.email('Enter a valid e-mail address, like name@example.org')),
    password: z
      .string()
      .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters`)
      .max(PASSWORD_MAX_LENGTH, `Use at most ${PASSWORD_MAX_LENGTH} characters`)
      .refine(
        passwordLongEnough,
        `Use at least ${PASSWORD_MIN_LENGTH} characters besides spaces at the ends`,
      ),
    confirmPassword: z.string().min(1, 'Repeat your password'),
  })
  .refine((v) => v.password === v.confirmPassword, {
    message: 'The two passwords differ',
    path: ['confirmPassword'],
  });
export type RegisterInput = z.infer<typeof registerInputSchema>;

/** POST /api/auth/register → 201 AuthResponse (the new account is a hobbyist). */
export function register(body: RegisterRequest): Promise<AuthResponse> {
  return api.post<AuthResponse>('/auth/register', body);
}

/** Registers and signs the new member in. */
export function useRegister() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: register,
    onSuccess: (response) => {
      queryClient.setQueryData(authKeys.me(), response.user);
      setAccessToken(response.accessToken);
    },
  });
}
