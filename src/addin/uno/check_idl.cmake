# Fails the build when the IDL generated from the declarations differs from the committed one.
file(READ "${GENERATED_IDL}" generated)
if(EXISTS "${COMMITTED_IDL}")
  file(READ "${COMMITTED_IDL}" committed)
else()
  set(committed "")
endif()
if(NOT generated STREQUAL committed)
  message(FATAL_ERROR "idl/org/quadrat/XFunctions.idl no longer matches the registry: copy ${GENERATED_IDL} over it "
                      "(cp ${GENERATED_IDL} ${COMMITTED_IDL}) and commit it. Renaming a method or the service breaks "
                      "every saved workbook.")
endif()
