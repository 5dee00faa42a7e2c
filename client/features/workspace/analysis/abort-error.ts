/** The rejection of a refine or yield run whose signal was aborted. */
export function abortError(): Error {
  const e = new Error('The run was cancelled.');
  e.name = 'AbortError';
  return e;
}
