import type { QueryClient } from '@tanstack/react-query';
import { getQuoteQueryOptions } from './get-quote';
import type { QuoteView } from './get-quotes';
import { getQuotesQueryOptions } from './get-quotes';

/** After any change of a quote: its page shows the answer, the list is fetched again. */
export function quoteChanged(queryClient: QueryClient, quote: QuoteView): Promise<void> {
  queryClient.setQueryData(getQuoteQueryOptions(quote.id).queryKey, quote);
  return queryClient.invalidateQueries({ queryKey: getQuotesQueryOptions().queryKey });
}
