import { describeMatrixArea } from '../support/authorization-cells';

describeMatrixArea('litters-and-health');
