import { describeMatrixArea } from '../support/authorization-cells';

describeMatrixArea('processing-days');
