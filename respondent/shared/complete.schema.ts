// POST /r/[token]/complete: the body is empty; the reply says where a panel wants the
// respondent sent afterwards (its completion address with the panel id), or null for the
// thank-you screen. The route handler returns this type and the phone reads it.

export interface CompleteReply {
  ok: true;
  redirectUrl: string | null;
}
