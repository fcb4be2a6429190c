export { default as Caution } from './Caution.svelte';
export { default as Field } from './Field.svelte';
export { default as LinkedText } from './LinkedText.svelte';
export { default as FormErrors } from './FormErrors.svelte';
export { default as NotYet } from './NotYet.svelte';
export { default as RoleBadge } from './RoleBadge.svelte';
