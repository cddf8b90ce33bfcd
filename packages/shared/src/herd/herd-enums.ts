export const sexes = ['buck', 'doe'] as const;
export type Sex = (typeof sexes)[number];

export const lifecycles = ['kit', 'junior', 'breeding', 'retired'] as const;
export type Lifecycle = (typeof lifecycles)[number];

export const dispositions = ['on_farm', 'sold', 'transferred', 'processed', 'died', 'culled'] as const;
export type Disposition = (typeof dispositions)[number];

/** Seen from the farm asking: the owner sees its lent buck as lent out, the borrower as on loan here. */
export const custodyStatuses = ['at_home', 'lent_out', 'on_loan_here'] as const;
export type CustodyStatus = (typeof custodyStatuses)[number];

export const custodyEventKinds = ['born', 'arrived', 'transferred', 'lent', 'returned', 'left'] as const;
export type CustodyEventKind = (typeof custodyEventKinds)[number];

export const purities = ['purebred', 'known_cross', 'partly_unknown', 'unknown'] as const;
export type Purity = (typeof purities)[number];

export const reviewStates = ['pending', 'accepted', 'returned'] as const;
export type ReviewState = (typeof reviewStates)[number];

export const bodyTypes = ['commercial', 'semi_arch', 'full_arch', 'compact', 'cylindrical'] as const;
export type BodyType = (typeof bodyTypes)[number];

export const sizeClasses = ['small', 'medium', 'large', 'giant'] as const;
export type SizeClass = (typeof sizeClasses)[number];

export const confidences = ['pub', 'sec', 'mem', 'derived', 'common_practice'] as const;
export type Confidence = (typeof confidences)[number];
