// Plain words for the history columns (the server sends codes).
export const OUTCOME_WORDS: Record<string, string> = {
  pending: 'Purge running',
  completed: 'Completed',
  interrupted: 'Interrupted',
  resumed: 'Cut short by key on',
  undetermined: 'Unknown',
};

export const outcomeWords = (o: string) => OUTCOME_WORDS[o] ?? o;
