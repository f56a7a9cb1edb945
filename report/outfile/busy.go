package outfile

// inUseCodes are the Windows error codes a rename gets when the target is
// open in another program, as a workbook open in Excel is (Microsoft,
// "System Error Codes (0-499)": 5 ERROR_ACCESS_DENIED, 32
// ERROR_SHARING_VIOLATION, 33 ERROR_LOCK_VIOLATION).
func inUseCode(code uintptr) bool { return code == 5 || code == 32 || code == 33 }

// inUseHint is what the rename error adds when the target seems open
// elsewhere.
const inUseHint = "; it is probably open in another program (Excel?): close it there and run again (the previous file is kept)"
