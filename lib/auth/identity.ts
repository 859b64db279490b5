/**
 * Who a request acts for, once lib/identity has worked it out from the
 * request (an API token, else the session cookie). The data layer takes it and
 * re-checks membership and role itself.
 */
export interface Actor {
  userId: string;
  via: "session" | "token";
}
