import { DataTypes } from 'sequelize';

/**
 * The review columns every apprentice-enterable record shares (weigh-ins, notes, litter events):
 * a mentor accepts or returns the entry with a comment.
 */
export function reviewColumns(opts: { defaultState?: 'accepted' } = {}) {
  return {
    reviewState: { type: DataTypes.TEXT, allowNull: false, ...(opts.defaultState ? { defaultValue: opts.defaultState } : {}) },
    reviewedBy: { type: DataTypes.UUID, allowNull: true },
    reviewedAt: { type: DataTypes.DATE, allowNull: true },
    reviewComment: { type: DataTypes.TEXT, allowNull: true },
  };
}
