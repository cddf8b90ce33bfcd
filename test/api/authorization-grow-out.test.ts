import { describeMatrixArea } from '../support/authorization-cells';

describeMatrixArea('grow-out');
