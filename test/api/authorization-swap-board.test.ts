import { describeMatrixArea } from '../support/authorization-cells';

describeMatrixArea('swap-board');
