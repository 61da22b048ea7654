# install(EXPORT) so that another CMake project can find_package(bandstack).
include(GNUInstallDirs)
include(CMakePackageConfigHelpers)
install(TARGETS bandstack EXPORT bandstackTargets
        ARCHIVE DESTINATION ${CMAKE_INSTALL_LIBDIR}
        LIBRARY DESTINATION ${CMAKE_INSTALL_LIBDIR}
        INCLUDES DESTINATION ${CMAKE_INSTALL_INCLUDEDIR})
install(TARGETS bandstack_cli RUNTIME DESTINATION ${CMAKE_INSTALL_BINDIR})
install(DIRECTORY ${PROJECT_SOURCE_DIR}/include/bandstack DESTINATION ${CMAKE_INSTALL_INCLUDEDIR})
install(EXPORT bandstackTargets NAMESPACE bandstack::
        DESTINATION ${CMAKE_INSTALL_LIBDIR}/cmake/bandstack)
configure_package_config_file(${PROJECT_SOURCE_DIR}/cmake/bandstackConfig.cmake.in
  ${PROJECT_BINARY_DIR}/bandstackConfig.cmake
  INSTALL_DESTINATION ${CMAKE_INSTALL_LIBDIR}/cmake/bandstack)
write_basic_package_version_file(${PROJECT_BINARY_DIR}/bandstackConfigVersion.cmake
  COMPATIBILITY SameMinorVersion)
install(FILES ${PROJECT_BINARY_DIR}/bandstackConfig.cmake ${PROJECT_BINARY_DIR}/bandstackConfigVersion.cmake
        DESTINATION ${CMAKE_INSTALL_LIBDIR}/cmake/bandstack)
