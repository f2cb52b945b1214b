/*
 * Runs a firmware ELF in simavr (libsimavr) and prints every change of the watched pins and every
 * write to the watched PWM compare registers, with the cycle it happened at. Drives the start input
 * (high, then low at start_cycle) and the emergency-stop input (low = contact closed; high at
 * estop_cycle when given, 0 for never). Output lines: "<cycle> pin <port><bit> <0|1>", "<cycle> ocr <addr> <value>",
 * "<cycle> uart <line>", and "<cycle> end <state>".
 *
 * Usage: sim-harness ELF MCU HZ START_PORT START_BIT STOP_PORT STOP_BIT START_CYCLE ESTOP_CYCLE MAX_CYCLES
 *        [pin P:b ...] [ocr 0xADDR ...]
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <simavr/sim_avr.h>
#include <simavr/sim_elf.h>
#include <simavr/sim_io.h>
#include <simavr/avr_ioport.h>
#include <simavr/avr_uart.h>

static avr_t *avr;
static char line[256];
static int line_len;

static void pin_changed(struct avr_irq_t *irq, uint32_t value, void *param) {
  (void)irq;
  printf("%llu pin %s %u\n", (unsigned long long)avr->cycle, (const char *)param, value ? 1 : 0);
}

static void ocr_written(struct avr_t *a, avr_io_addr_t addr, uint8_t v, void *param) {
  (void)param;
  printf("%llu ocr 0x%x %u\n", (unsigned long long)a->cycle, addr, v);
}

static void uart_out(struct avr_irq_t *irq, uint32_t value, void *param) {
  (void)irq; (void)param;
  char c = (char)value;
  if (c == '\n' || line_len == (int)sizeof line - 1) {
    line[line_len] = 0;
    printf("%llu uart %s\n", (unsigned long long)avr->cycle, line);
    line_len = 0;
  } else line[line_len++] = c;
}

int main(int argc, char **argv) {
  if (argc < 11) { fprintf(stderr, "usage: see source\n"); return 2; }
  elf_firmware_t fw;
  memset(&fw, 0, sizeof fw);
  if (elf_read_firmware(argv[1], &fw) != 0) { fprintf(stderr, "cannot read %s\n", argv[1]); return 2; }
  avr = avr_make_mcu_by_name(argv[2]);
  if (!avr) { fprintf(stderr, "unknown mcu %s\n", argv[2]); return 2; }
  avr_init(avr);
  avr->frequency = (uint32_t)strtoul(argv[3], 0, 10);
  avr->log = 0;
  avr_load_firmware(avr, &fw);
  char start_port = argv[4][0]; int start_bit = atoi(argv[5]);
  char stop_port = argv[6][0]; int stop_bit = atoi(argv[7]);
  unsigned long long start_cycle = strtoull(argv[8], 0, 10);
  unsigned long long estop_cycle = strtoull(argv[9], 0, 10);
  unsigned long long max_cycles = strtoull(argv[10], 0, 10);

  avr_irq_t *stop_irq = avr_io_getirq(avr, AVR_IOCTL_IOPORT_GETIRQ(stop_port), stop_bit);
  avr_raise_irq(stop_irq, 0);
  avr_irq_t *start_irq = start_port == '-' ? 0 : avr_io_getirq(avr, AVR_IOCTL_IOPORT_GETIRQ(start_port), start_bit);
  if (start_irq) avr_raise_irq(start_irq, 1);

  const char *mode = "";
  for (int i = 11; i < argc; i++) {
    if (!strcmp(argv[i], "pin") || !strcmp(argv[i], "ocr")) { mode = argv[i]; continue; }
    if (!strcmp(mode, "pin")) {
      avr_irq_t *irq = avr_io_getirq(avr, AVR_IOCTL_IOPORT_GETIRQ(argv[i][0]), atoi(argv[i] + 2));
      if (!irq) { fprintf(stderr, "no pin %s\n", argv[i]); return 2; }
      avr_irq_register_notify(irq, pin_changed, argv[i]);
    } else if (!strcmp(mode, "ocr")) {
      avr_register_io_write(avr, (avr_io_addr_t)strtoul(argv[i], 0, 16), ocr_written, 0);
    }
  }
  avr_irq_t *uart = avr_io_getirq(avr, AVR_IOCTL_UART_GETIRQ('0'), UART_IRQ_OUTPUT);
  if (uart) avr_irq_register_notify(uart, uart_out, 0);

  int state = cpu_Running;
  int started = 0, stopped = 0;
  /* What the outside world holds the inputs at; re-asserted after every instruction, because the
     firmware's pull-up writes to PORTx drive the simulated pin too. */
  uint32_t stop_want = 0, start_want = 1;
  while (avr->cycle < max_cycles) {
    if (!started && start_irq && avr->cycle >= start_cycle) {
      printf("%llu press start\n", (unsigned long long)avr->cycle);
      start_want = 0;
      started = 1;
    }
    if (!stopped && estop_cycle && avr->cycle >= estop_cycle) {
      printf("%llu press stop\n", (unsigned long long)avr->cycle);
      stop_want = 1;
      stopped = 1;
    }
    if (stop_irq->value != stop_want) avr_raise_irq(stop_irq, stop_want);
    if (start_irq && start_irq->value != start_want) avr_raise_irq(start_irq, start_want);
    state = avr_run(avr);
    if (state == cpu_Done || state == cpu_Crashed) break;
  }
  printf("%llu end %d\n", (unsigned long long)avr->cycle, state);
  return 0;
}
