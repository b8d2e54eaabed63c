/**
 * Approving a protocol version is an electronic signature: the approver re-enters their password
 * and is shown what the signature means; that meaning is stored with the approval.
 */
export const protocolApprovalMeaning = 'approved-for-use' as const;

/** The meaning in words, shown beside the password box and on the version page. */
export const protocolApprovalMeaningWords =
  'I have checked every figure and source of this version and approve it for treating patients.';
