package dev.tallyvane.intake.upload;

/** {@link UploadFlowContract} on the embedded H2 database. */
class UploadFlowIntegrationTests extends UploadFlowContract {
}
