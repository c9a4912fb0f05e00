# Runs the report's browser tests (CTest: report_browser). Fails with a clear message, never
# skips, when Node, the system Chromium or the tests' npm packages are missing.
if(NOT NODE OR NOT EXISTS "${NODE}")
  message(FATAL_ERROR "report_browser: Node.js not found; install it (scripts/setup.sh) and re-run cmake")
endif()
if(NOT EXISTS "${CHROMIUM}")
  message(FATAL_ERROR "report_browser: Chromium not found at '${CHROMIUM}'; install Debian's chromium (scripts/setup.sh)")
endif()
if(NOT EXISTS "${SOURCE}/node_modules/puppeteer-core")
  message(FATAL_ERROR "report_browser: puppeteer-core missing; run 'npm ci' in ${SOURCE} (scripts/setup.sh does)")
endif()
execute_process(COMMAND "${NODE}" "${SOURCE}/report_browser_test.mjs"
                        --cli "${CLI}" --family-points "${FAMILY_POINTS}" --chromium "${CHROMIUM}" --work "${WORK}"
                RESULT_VARIABLE rc)
if(NOT rc EQUAL 0)
  message(FATAL_ERROR "report_browser: failed (exit ${rc})")
endif()
