// A form's "on its way" state: true from the submit until the page has taken the answer, so its buttons
// can say so and not send twice. One Pending can serve several forms that should wait for each other.
import type { SubmitFunction } from '@sveltejs/kit';

export class Pending {
	busy = $state(false);

	/** For `use:enhance`; `{ reset: false }` keeps what was typed after a success. */
	enhance = (options?: { reset?: boolean }): SubmitFunction => {
		return () => {
			this.busy = true;
			return async ({ update }) => {
				try {
					await update(options);
				} finally {
					this.busy = false;
				}
			};
		};
	};
}
