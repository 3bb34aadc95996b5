import { Body, Controller, Get, HttpCode, Post } from '@nestjs/common';
import {
  breakEvenEstimate,
  fieldCapacityEstimate,
  jointOwnershipEstimate,
  listMachineClasses,
  machineCostEstimate,
  type BreakEvenResponse,
  type FieldCapacityResponse,
  type JointOwnershipResponse,
  type MachineClassResponse,
  type MachineCostResponse,
} from '@hitchbook/shared/estimates';
import {
  breakEvenRequestSchema,
  fieldCapacityRequestSchema,
  jointOwnershipRequestSchema,
  machineCostRequestSchema,
  type BreakEvenRequest,
  type FieldCapacityRequest,
  type JointOwnershipRequest,
  type MachineCostRequest,
} from '@hitchbook/shared/schemas/estimates';
import { Roles } from '../../common/auth/decorators.js';
import { ZodPipe } from '../../common/validation/zod.pipe.js';

/** Pure computations of the engine; money roles only, since every answer is a money figure. */
@Roles('owner', 'partner', 'bookkeeper')
@Controller('estimates')
export class EstimatesController {
  @Get('machine-classes')
  machineClasses(): MachineClassResponse[] {
    return listMachineClasses();
  }

  @Post('machine-cost')
  @HttpCode(200)
  machineCost(@Body(new ZodPipe(machineCostRequestSchema)) body: MachineCostRequest): MachineCostResponse {
    return machineCostEstimate(body);
  }

  @Post('field-capacity')
  @HttpCode(200)
  fieldCapacity(@Body(new ZodPipe(fieldCapacityRequestSchema)) body: FieldCapacityRequest): FieldCapacityResponse {
    return fieldCapacityEstimate(body);
  }

  @Post('break-even')
  @HttpCode(200)
  breakEven(@Body(new ZodPipe(breakEvenRequestSchema)) body: BreakEvenRequest): BreakEvenResponse {
    return breakEvenEstimate(body);
  }

  @Post('joint-ownership')
  @HttpCode(200)
  jointOwnership(@Body(new ZodPipe(jointOwnershipRequestSchema)) body: JointOwnershipRequest): JointOwnershipResponse {
    return jointOwnershipEstimate(body);
  }
}
