import { type AuthResponse, type LoginRequest } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { authKeys } from '../../../lib/auth';
import { setAccessToken } from '../../../lib/token-store';

export const loginInputSchema = z.object({
  email: z
    .string()
    .trim()
    .min(1, 'Enter your e-mail address')
    .pipe(z.email('Enter a valid e-mail address, like name@example.org')),
  password: z.string().min(1, 'Enter your password'),
});
export type LoginInput = z.infer<typeof loginInputSchema>;

/** POST /api/auth/login → 200 AuthResponse. */
export function login(body: LoginRequest): Promise<AuthResponse> {
  return api.post<AuthResponse>('/auth/login', body);
}

/** Signs in: keeps the token, primes the signed-in user in the cache. */
export function useLogin() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: (response) => {
      queryClient.setQueryData(authKeys.me(), response.user);
      setAccessToken(response.accessToken);
    },
  });
}
