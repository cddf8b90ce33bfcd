import { describeMatrixArea } from '../support/authorization-cells';

describeMatrixArea('notifications');
