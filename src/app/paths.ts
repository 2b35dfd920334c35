// The one route table: every page's `path` (for the router) and `getHref()` (for links).
const q = (params: Record<string, string | number | undefined | null>): string => {
  const s = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== '') s.set(k, String(v));
  const text = s.toString();
  return text ? `?${text}` : '';
};

export const paths = {
  home: { path: '/', getHref: () => '/' },
  signIn: { path: '/sign-in', getHref: (next?: string) => `/sign-in${q({ next: next && next !== '/' ? next : undefined })}` },
  forgotPassword: { path: '/forgot-password', getHref: () => '/forgot-password' },
  // The server's reset e-mail links here (server/routes/session.ts RESET_PAGE); /reset is kept as a short alias.
  resetPassword: { path: '/reset-password', getHref: (token: string) => `/reset-password${q({ token })}` },
  resetPasswordShort: { path: '/reset', getHref: (token: string) => `/reset${q({ token })}` },
  formulas: {
    path: '/formulas',
    getHref: (filters: { q?: string; category?: string; tag?: string; status?: string } = {}) => `/formulas${q(filters)}`,
  },
  formula: {
    path: '/formulas/:id',
    getHref: (id: string, target?: { pieces?: number; piece?: number; mix?: number }) =>
      `/formulas/${encodeURIComponent(id)}${q(target ?? {})}`,
  },
  plans: { path: '/plans', getHref: () => '/plans' },
  plan: { path: '/plans/:date', getHref: (date: string) => `/plans/${encodeURIComponent(date)}` },
  planPdf: { path: '/api/plans/:date/sheet.pdf', getHref: (date: string) => `/api/plans/${encodeURIComponent(date)}/sheet.pdf` },
  changes: { path: '/changes', getHref: () => '/changes' },
  formulaChanges: {
    path: '/changes/:id',
    getHref: (id: string, range?: { from?: number; to?: number }) => `/changes/${encodeURIComponent(id)}${q(range ?? {})}`,
  },
  ingredients: { path: '/ingredients', getHref: () => '/ingredients' },
  account: { path: '/account', getHref: () => '/account' },
  accounts: { path: '/accounts', getHref: () => '/accounts' },
} as const;
