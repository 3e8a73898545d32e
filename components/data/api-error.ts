import type { ErrorEnvelope } from '@/server/contracts/errors';

/**
 * The one error type of the client. The API's envelope, better-auth's `{ code, message }`
 * and network failures all become an ApiError, so screens present them the same way.
 */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly field?: string;
  readonly fieldErrors: Record<string, string[]>;
  readonly requestId?: string;

  constructor(init: {
    status: number;
    code: string;
    message: string;
    field?: string;
    fieldErrors?: Record<string, string[]>;
    requestId?: string;
  }) {
    super(init.message);
    this.name = 'ApiError';
    this.status = init.status;
    this.code = init.code;
    this.field = init.field;
    this.fieldErrors = init.fieldErrors ?? {};
    this.requestId = init.requestId;
  }

  /** First message for a form field, if the server named one. */
  fieldError(field: string): string | undefined {
    return this.fieldErrors[field]?.[0] ?? (this.field === field ? this.message : undefined);
  }

  get isUnauthenticated() {
    return this.status === 401;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

/** Builds an ApiError from a failed response body (our envelope, or anything else). */
export function apiErrorFromBody(status: number, body: unknown): ApiError {
  const envelope = body as Partial<ErrorEnvelope> | null;
  if (envelope && typeof envelope === 'object' && envelope.error && typeof envelope.error === 'object') {
    const e = envelope.error;
    return new ApiError({
      status,
      code: e.code ?? 'error',
      message: e.message ?? defaultMessage(status),
      field: e.field,
      fieldErrors: e.fieldErrors,
      requestId: e.requestId,
    });
  }
  return new ApiError({ status, code: status === 0 ? 'network' : 'http_' + status, message: defaultMessage(status) });
}

/**
 * better-auth's client answers `{ data, error }` with `error = { code?, message?, status }`;
 * when the server's gate refused the request before better-auth saw it (a field, a limit),
 * `error` carries our envelope's `error` instead.
 */
export function apiErrorFromAuth(
  error: {
    code?: string;
    message?: string;
    status?: number;
    statusText?: string;
    error?: ErrorEnvelope['error'];
  },
  field?: string,
): ApiError {
  const status = error.status ?? 400;
  if (error.error && typeof error.error === 'object') return apiErrorFromBody(status, { error: error.error });
  const code = (error.code ?? '').toUpperCase();
  const message = authWording[code] ?? ourWords(error.message || error.statusText || defaultMessage(status));
  return new ApiError({ status, code: (code || 'auth_error').toLowerCase(), message: sentence(message), field });
}

/** better-auth's failures a user can meet, said in our words (Team, e-mail, the roles). */
const authWording: Readonly<Record<string, string>> = {
  INVALID_EMAIL_OR_PASSWORD: 'Wrong e-mail or password.',
  EMAIL_NOT_VERIFIED: 'Confirm your e-mail address first: we have just sent a new link to it. Open it to sign in.',
  EMAIL_VERIFICATION_REQUIRED_BEFORE_ACCEPTING_OR_REJECTING_INVITATION:
    'Confirm your e-mail address first, through the link we mailed you, then accept the invitation.',
  USER_ALREADY_EXISTS_USE_ANOTHER_EMAIL:
    'An account with this e-mail already exists. Sign in instead, or use another address.',
  ORGANIZATION_ALREADY_EXISTS: 'A Team with this name already exists.',
  ORGANIZATION_SLUG_ALREADY_TAKEN: 'A Team with this name already exists.',
  USER_IS_ALREADY_A_MEMBER_OF_THIS_ORGANIZATION: 'This person is already a member of the Team.',
  USER_IS_ALREADY_INVITED_TO_THIS_ORGANIZATION: 'This person already has an invitation to the Team waiting.',
  YOU_ARE_NOT_ALLOWED_TO_INVITE_USERS_TO_THIS_ORGANIZATION: 'Only an Owner can invite people to this Team.',
  YOU_ARE_NOT_ALLOWED_TO_INVITE_USER_WITH_THIS_ROLE: 'Only an Owner can invite someone as Owner.',
  YOU_ARE_NOT_THE_RECIPIENT_OF_THE_INVITATION:
    'This invitation was sent to another e-mail address. Sign in with that address to accept it.',
  INVITATION_NOT_FOUND: 'This invitation is no longer open: it was accepted or cancelled, or it has expired.',
};

/** Any other better-auth message: its word for a workspace is our Team. */
function ourWords(text: string): string {
  return text.replace(/\borganizations\b/gi, 'Teams').replace(/\borganization\b/gi, 'Team');
}

export function networkError(): ApiError {
  return new ApiError({ status: 0, code: 'network', message: defaultMessage(0) });
}

function sentence(text: string): string {
  const t = text.trim();
  if (!t) return t;
  const first = t[0]!.toUpperCase() + t.slice(1);
  return /[.!?]$/.test(first) ? first : first + '.';
}

function defaultMessage(status: number): string {
  if (status === 0) return 'Cannot reach the Cyclemoot server. Check your connection and try again.';
  if (status === 401) return 'Your session has ended. Sign in again.';
  if (status === 403) return 'Your role in this team does not allow this.';
  if (status === 404) return 'This was not found, or you are not a member of its team.';
  if (status === 409) return 'This conflicts with something that already exists.';
  if (status === 422) return 'Some fields need attention.';
  if (status >= 500) return 'Something went wrong on the server. Try again in a moment.';
  return 'The request could not be completed.';
}
