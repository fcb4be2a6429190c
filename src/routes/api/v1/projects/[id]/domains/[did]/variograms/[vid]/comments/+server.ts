import { json } from '@sveltejs/kit';
import { endpoint, parseJson } from '$lib/server/api';
import { requireProjectRole } from '$lib/server/auth/guard';
import { addComment, listComments, VARIOGRAM_ROLES } from '$lib/server/services/variograms';
import { variogramCommentSchema } from '$lib/schemas/variogram';

export const GET = endpoint((event) => {
	const { project, user, role } = requireProjectRole(event, event.params.id, VARIOGRAM_ROLES.read);
	const { did, vid } = event.params;
	return json({ comments: listComments(project.id, did!, vid!, { userId: user.id, role }) });
});

export const POST = endpoint(async (event) => {
	const { project, user, role } = requireProjectRole(event, event.params.id, VARIOGRAM_ROLES.comment);
	const { body } = await parseJson(event.request, variogramCommentSchema);
	const { did, vid } = event.params;
	return json({ comment: addComment(project.id, did!, vid!, { userId: user.id, role }, body) }, { status: 201 });
});
