export { email, newPassword, projectRole } from './common';
export {
	signInSchema,
	signInFormSchema,
	magicLinkSchema,
	changePasswordSchema,
	resetPasswordSchema,
	acceptInvitationSchema
} from './auth';
export { projectName, projectCreateSchema, projectUpdateSchema, type ProjectCreate, type ProjectUpdate } from './project';
export { inviteSchema, memberRoleSchema, memberRemoveSchema } from './member';
export { TOKEN_LIFETIMES_DAYS, apiTokenCreateSchema, apiTokenRevokeSchema } from './token';
