//go:build amd64 && !purego

#include "textflag.h"

// func kernel(k int, a, b, c *float64, ldc int, alpha float64)
//
// Y0..Y7 hold the 4 x 8 block of A B: row i in Y(2i) (columns 0-3) and
// Y(2i+1) (columns 4-7). Each step p loads row p of the B strip (Y8, Y9),
// broadcasts the four entries of column p of the A strip and adds their
// products.
TEXT ·kernel(SB), NOSPLIT, $0-48
	MOVQ k+0(FP), CX
	MOVQ a+8(FP), SI
	MOVQ b+16(FP), DI
	MOVQ c+24(FP), DX
	MOVQ ldc+32(FP), R8
	SHLQ $3, R8
	VXORPD Y0, Y0, Y0
	VXORPD Y1, Y1, Y1
	VXORPD Y2, Y2, Y2
	VXORPD Y3, Y3, Y3
	VXORPD Y4, Y4, Y4
	VXORPD Y5, Y5, Y5
	VXORPD Y6, Y6, Y6
	VXORPD Y7, Y7, Y7
	TESTQ CX, CX
	JE    store

loop:
	VMOVUPD      (DI), Y8
	VMOVUPD      32(DI), Y9
	VBROADCASTSD (SI), Y10
	VFMADD231PD  Y8, Y10, Y0
	VFMADD231PD  Y9, Y10, Y1
	VBROADCASTSD 8(SI), Y11
	VFMADD231PD  Y8, Y11, Y2
	VFMADD231PD  Y9, Y11, Y3
	VBROADCASTSD 16(SI), Y12
	VFMADD231PD  Y8, Y12, Y4
	VFMADD231PD  Y9, Y12, Y5
	VBROADCASTSD 24(SI), Y13
	VFMADD231PD  Y8, Y13, Y6
	VFMADD231PD  Y9, Y13, Y7
	ADDQ         $32, SI
	ADDQ         $64, DI
	DECQ         CX
	JNZ          loop

store:
	VBROADCASTSD alpha+40(FP), Y15
	VMOVUPD      (DX), Y8
	VMOVUPD      32(DX), Y9
	VFMADD231PD  Y0, Y15, Y8
	VFMADD231PD  Y1, Y15, Y9
	VMOVUPD      Y8, (DX)
	VMOVUPD      Y9, 32(DX)
	ADDQ         R8, DX
	VMOVUPD      (DX), Y8
	VMOVUPD      32(DX), Y9
	VFMADD231PD  Y2, Y15, Y8
	VFMADD231PD  Y3, Y15, Y9
	VMOVUPD      Y8, (DX)
	VMOVUPD      Y9, 32(DX)
	ADDQ         R8, DX
	VMOVUPD      (DX), Y8
	VMOVUPD      32(DX), Y9
	VFMADD231PD  Y4, Y15, Y8
	VFMADD231PD  Y5, Y15, Y9
	VMOVUPD      Y8, (DX)
	VMOVUPD      Y9, 32(DX)
	ADDQ         R8, DX
	VMOVUPD      (DX), Y8
	VMOVUPD      32(DX), Y9
	VFMADD231PD  Y6, Y15, Y8
	VFMADD231PD  Y7, Y15, Y9
	VMOVUPD      Y8, (DX)
	VMOVUPD      Y9, 32(DX)
	VZEROUPPER
	RET

// func cpuid(leaf, sub uint32) (eax, ebx, ecx, edx uint32)
TEXT ·cpuid(SB), NOSPLIT, $0-24
	MOVL leaf+0(FP), AX
	MOVL sub+4(FP), CX
	CPUID
	MOVL AX, eax+8(FP)
	MOVL BX, ebx+12(FP)
	MOVL CX, ecx+16(FP)
	MOVL DX, edx+20(FP)
	RET

// func xgetbv() (eax, edx uint32)
TEXT ·xgetbv(SB), NOSPLIT, $0-8
	MOVL $0, CX
	XGETBV
	MOVL AX, eax+0(FP)
	MOVL DX, edx+4(FP)
	RET
