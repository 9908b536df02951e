/** The caution, in the same words as src/lib/components/Caution.svelte. */
export const CAUTION_TITLE = 'Decision support, not a decision.';
export const CAUTION_TEXT =
	"Fractile's figures help a competent engineer judge cover; the governing design code and a licensed engineer decide whether a structure is acceptable and what is done about it.";
