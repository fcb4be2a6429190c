import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { CAPABILITIES } from '$lib/server/auth/roles';
import { addComment, listComments } from '$lib/server/services/variograms';
import { variogramCommentSchema } from '$lib/schemas/variogram';

export const GET = endpoint((event) => {
	const { project } = requireProjectRole(event, event.params.id, CAPABILITIES.read);
	const { did, vid } = event.params;
	return json({ comments: listComments(project.id, did!, vid!) });
});

export const POST = endpoint(async (event) => {
	const { project, user } = requireProjectRole(event, event.params.id, CAPABILITIES.comment);
	const { body } = await parseJson(event.request, variogramCommentSchema);
	const { did, vid } = event.params;
	return json({ comment: addComment(project.id, did!, vid!, user.id, body) }, { status: 201 });
});
