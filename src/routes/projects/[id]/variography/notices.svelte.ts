/** The workspace's one line of news and one line of trouble, shared by its parts. */
export class Notices {
	/** What just happened (loaded, saved, fitted, cancelled). */
	status = $state('');
	/** What went wrong; shown as an alert. */
	problem = $state('');

	clear(): void {
		this.status = '';
		this.problem = '';
	}
}
