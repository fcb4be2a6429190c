import { modelCurves, modelFromParameters, type FitRequest, type ModelParameters } from '$lib/variography';
import type { Evaluation } from './engine';

/** How the automatic fit treats the nugget: fitted, left out, or held at `nuggetFixed`. */
export type NuggetMode = 'fit' | 'none' | 'fixed';

/** The parameters a user edits directly (the structure type has its own setter). */
export type EditableParameter = 'nugget' | 'sill' | 'rangeVertical' | 'rangeHorizontal';

/**
 * The model being fitted: its parameters (from the automatic fit, a saved version, a start by hand, typed
 * or dragged on a plot), how the automatic fit is asked for, and the latest misfit and range sensitivity.
 * Every change of the parameters goes through set(), which tells the workspace to evaluate them again.
 */
export class ModelEditor {
	/** The edited parameters; null until a fit, a load or a start by hand. */
	params = $state<ModelParameters | null>(null);
	/** Structure of the automatic fit (and of the parameters, once there are some). */
	type = $state<ModelParameters['type']>('exponential');
	nuggetMode = $state<NuggetMode>('fit');
	nuggetFixed = $state(0);
	fitting = $state(false);
	/** Misfit and sensitivity of the current parameters against the current bins; null while unknown. */
	evaluation = $state.raw<Evaluation | null>(null);

	/** The engine model of the parameters; null while they do not make one (a sill below the nugget, a range of 0). */
	readonly model = $derived.by(() => {
		if (!this.params) return null;
		try {
			return modelFromParameters(this.params);
		} catch {
			return null;
		}
	});
	/** γ(h) of the model vertically and along its plan azimuth, for the plots and lag tables. */
	readonly curves = $derived(this.model ? modelCurves(this.model) : null);

	constructor(private readonly changed: () => void) {}

	/** The automatic fit as the controls ask for it. */
	get fitRequest(): FitRequest {
		return { type: this.type, nugget: this.nuggetMode === 'fixed' ? this.nuggetFixed : this.nuggetMode };
	}

	/** Takes the controls back to a fit request saved with a model. */
	useFitRequest(fit: FitRequest): void {
		this.type = fit.type;
		this.nuggetMode = typeof fit.nugget === 'number' ? 'fixed' : fit.nugget;
		if (typeof fit.nugget === 'number') this.nuggetFixed = fit.nugget;
	}

	/** Replaces the parameters (null clears the model) and has them evaluated. */
	set(params: ModelParameters | null): void {
		this.params = params;
		if (params) this.type = params.type;
		this.changed();
	}

	/** A new structure type: for the next fit, and for the current parameters if there are some. */
	setType(type: ModelParameters['type']): void {
		this.type = type;
		if (this.params) this.set({ ...this.params, type });
	}

	/** A typed value; ignored unless it is a finite number (the input keeps showing what was typed). */
	setValue(key: EditableParameter, value: number): void {
		if (!this.params || !Number.isFinite(value)) return;
		this.set({ ...this.params, [key]: value });
	}

	/** A handle dragged on a plot: a range of that direction, the sill (not below the nugget) or the nugget (not above the sill). */
	drag(direction: 'vertical' | 'horizontal', c: { range?: number; sill?: number; nugget?: number }): void {
		if (!this.params) return;
		const next = { ...this.params };
		if (c.range !== undefined) {
			if (direction === 'vertical') next.rangeVertical = c.range;
			else next.rangeHorizontal = c.range;
		}
		if (c.sill !== undefined) next.sill = Math.max(c.sill, next.nugget);
		if (c.nugget !== undefined) next.nugget = Math.min(c.nugget, next.sill);
		this.set(next);
	}
}
