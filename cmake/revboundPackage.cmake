# The installed package: public headers, and the files that make
# find_package(revbound) work (revboundConfig.cmake, its version file and the
# exported targets, namespace revbound::). src/CMakeLists.txt installs the
# targets themselves into the export set revboundTargets.
include(CMakePackageConfigHelpers)

install(DIRECTORY ${PROJECT_SOURCE_DIR}/include/revbound
        DESTINATION ${CMAKE_INSTALL_INCLUDEDIR}
        FILES_MATCHING PATTERN "*.h")

set(REVBOUND_INSTALL_CMAKEDIR ${CMAKE_INSTALL_LIBDIR}/cmake/revbound)
install(EXPORT revboundTargets
        NAMESPACE revbound::
        DESTINATION ${REVBOUND_INSTALL_CMAKEDIR})

# Read by the config template, so that the consumer finds the same BuDDy.
get_filename_component(REVBOUND_BUDDY_LIBRARY_DIR "${BUDDY_LIBRARY}" DIRECTORY)
configure_package_config_file(
  ${CMAKE_CURRENT_LIST_DIR}/revboundConfig.cmake.in
  ${PROJECT_BINARY_DIR}/revboundConfig.cmake
  INSTALL_DESTINATION ${REVBOUND_INSTALL_CMAKEDIR})
# 0.x releases make no compatibility promise across minor versions.
write_basic_package_version_file(
  ${PROJECT_BINARY_DIR}/revboundConfigVersion.cmake
  COMPATIBILITY SameMinorVersion)
install(FILES ${PROJECT_BINARY_DIR}/revboundConfig.cmake
              ${PROJECT_BINARY_DIR}/revboundConfigVersion.cmake
        DESTINATION ${REVBOUND_INSTALL_CMAKEDIR})

# The man page (docs/revbound.1).
install(FILES ${PROJECT_SOURCE_DIR}/docs/revbound.1
  DESTINATION ${CMAKE_INSTALL_MANDIR}/man1)
