import { describeMatrixArea } from '../support/authorization-cells';

describeMatrixArea('almanac');
